import { z } from "zod";

/*
 * The company settings form: one schema for the browser and the server action. No server
 * imports here. The alert threshold is typed as a percentage and stored as a fraction.
 */

export const ALERT_HORIZON_DAYS = { min: 14, max: 1095 } as const;
export const ALERT_PERCENT = { min: 1, max: 99 } as const;

/** ISO 4217 codes the runtime knows (Node 20 and every current browser list them). */
const KNOWN_CURRENCIES: ReadonlySet<string> = new Set(
  typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("currency") : [],
);

/** Whether `code` is a three-letter ISO 4217 currency code. */
export function isCurrencyCode(code: string): boolean {
  return /^[A-Z]{3}$/.test(code) && (KNOWN_CURRENCIES.size === 0 || KNOWN_CURRENCIES.has(code));
}

const wholeNumber = (label: string, min: number, max: number) =>
  z.preprocess(
    (v) => (typeof v === "string" && v.trim() !== "" ? Number(v.trim().replace(",", ".")) : v),
    z
      .number({ error: `Enter the ${label} as a whole number.` })
      .int(`Enter the ${label} as a whole number.`)
      .min(min, `The ${label} is at least ${min}.`)
      .max(max, `The ${label} is at most ${max}.`),
  );

export const companySettingsSchema = z.object({
  companyId: z.coerce.number({ error: "Choose a company." }).int().positive("Choose a company."),
  currencyCode: z
    .string({ error: "Enter the currency code." })
    .trim()
    .toUpperCase()
    .refine(isCurrencyCode, "Enter a three-letter ISO 4217 currency code, e.g. USD, EUR or NOK."),
  alertHorizonDays: wholeNumber("alert horizon in days", ALERT_HORIZON_DAYS.min, ALERT_HORIZON_DAYS.max),
  alertPercent: wholeNumber("alert threshold in per cent", ALERT_PERCENT.min, ALERT_PERCENT.max),
});

export type CompanySettingsInput = z.input<typeof companySettingsSchema>;
export type CompanySettingsValues = z.output<typeof companySettingsSchema>;
