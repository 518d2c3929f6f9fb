/** Weights applied to the first six digits of an IMO ship number (IMO Resolution A.1078(28)). */
const IMO_WEIGHTS = [7, 6, 5, 4, 3, 2] as const;

export type ImoNumberResult =
  | { ok: true; digits: string; formatted: string }
  | { ok: false; reason: "empty" | "format" | "check_digit"; message: string };

/**
 * The check digit of an IMO ship number: the last digit of the sum of the first six digits
 * weighted 7, 6, 5, 4, 3, 2 (IMO ship identification number scheme, Resolution A.1078(28)).
 * Null unless given exactly six digits.
 */
export function imoCheckDigit(firstSix: string): number | null {
  if (!/^\d{6}$/.test(firstSix)) return null;
  let sum = 0;
  for (let i = 0; i < 6; i++) sum += Number(firstSix[i]) * IMO_WEIGHTS[i];
  return sum % 10;
}

/**
 * Validates an IMO ship number typed as "IMO 1234567", "imo1234567" or "1234567". A wrong check
 * digit almost always means a mistyped number, so it is reported apart from a wrong format.
 */
export function parseImoNumber(input: string): ImoNumberResult {
  const text = input.trim();
  if (text === "") return { ok: false, reason: "empty", message: "Enter the ship's IMO number." };
  const match = /^(?:IMO\s*)?(\d{7})$/i.exec(text);
  if (!match) {
    return { ok: false, reason: "format", message: "An IMO number is seven digits, optionally written after \"IMO\"." };
  }
  const digits = match[1];
  const expected = imoCheckDigit(digits.slice(0, 6));
  if (expected !== Number(digits[6])) {
    return {
      ok: false,
      reason: "check_digit",
      message: `The last digit should be ${expected} for an IMO number starting ${digits.slice(0, 6)}; check for a typing error.`,
    };
  }
  return { ok: true, digits, formatted: `IMO ${digits}` };
}
