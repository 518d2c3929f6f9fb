import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { parseImoNumber } from "@/lib/units/imo";
import { recordDate } from "@/lib/validation/dates";

/*
 * Admin forms: one schema per form, used by the browser (react-hook-form + zodResolver)
 * and parsed again by the server action. No server imports here.
 */

const trimmed = (label: string, max: number, min = 1) =>
  z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .min(min, min === 1 ? `Enter the ${label}.` : `The ${label} needs at least ${min} characters.`)
    .max(max, `The ${label} is at most ${max} characters.`);

/** Empty text, null or NaN (an empty number input) become null. */
const blankToNull = (v: unknown) => (v === "" || v === null || v === undefined || (typeof v === "number" && Number.isNaN(v)) ? null : v);

/** A number typed into a form: accepts numbers and numeric strings (FormData), refuses blanks. */
const num = (label: string) =>
  z.preprocess(
    (v) => (typeof v === "string" && v.trim() !== "" ? Number(v.replace(",", ".")) : v),
    z.number({ error: `Enter the ${label} as a number.` }).refine(Number.isFinite, `Enter the ${label} as a number.`),
  );

const optionalNum = (label: string) =>
  z.preprocess(
    (v) => {
      const b = blankToNull(v);
      return typeof b === "string" ? Number(b.replace(",", ".")) : b;
    },
    z.number({ error: `Enter the ${label} as a number, or leave it empty.` }).refine(Number.isFinite).nullable(),
  );

const optionalText = (label: string, max: number) =>
  z.preprocess(blankToNull, z.string().trim().max(max, `The ${label} is at most ${max} characters.`).nullable());

/** Checkbox groups arrive as nothing, one string, or several strings; always give an id list. */
export const idList = z.preprocess(
  (v) => (v === undefined || v === null || v === false || v === "" ? [] : Array.isArray(v) ? v : [v]),
  z.array(z.coerce.number().int().positive()).max(500),
);

const id = z.coerce.number({ error: "Choose one." }).int("Choose one.").positive("Choose one.");

export const roleSchema = z.enum(ROLES, { error: "Choose a role." });

// ── users and invitations ───────────────────────────────────────────────────────

export const inviteUserSchema = z
  .object({
    name: trimmed("name", 120, 2),
    email: z.string().trim().toLowerCase().pipe(z.email("Enter a valid e-mail address.")),
    role: roleSchema,
    vesselIds: idList,
  })
  .superRefine((v, ctx) => {
    // Ship and office roles see nothing without a vessel; an admin sees all vessels anyway.
    if (v.role !== "admin" && v.vesselIds.length === 0) {
      ctx.addIssue({ code: "custom", path: ["vesselIds"], message: "Choose at least one vessel for this role." });
    }
  });
export type InviteUserInput = z.input<typeof inviteUserSchema>;

export const updateUserAccessSchema = z
  .object({ userId: z.string().trim().min(1, "Unknown user.").max(36, "Unknown user."), role: roleSchema, vesselIds: idList })
  .superRefine((v, ctx) => {
    if (v.role !== "admin" && v.vesselIds.length === 0) {
      ctx.addIssue({ code: "custom", path: ["vesselIds"], message: "Choose at least one vessel for this role." });
    }
  });
export type UpdateUserAccessInput = z.input<typeof updateUserAccessSchema>;

export const userIdSchema = z.object({ userId: z.string().trim().min(1, "Unknown user.").max(36, "Unknown user."), reason: optionalText("reason", 200).optional() });
export const invitationIdSchema = z.object({ invitationId: id });

// ── vessels and engines ─────────────────────────────────────────────────────────

export const imoSchema = z.string({ error: "Enter the ship's IMO number." }).transform((value, ctx) => {
  const r = parseImoNumber(value);
  if (!r.ok) {
    ctx.addIssue({ code: "custom", message: r.message });
    return z.NEVER;
  }
  return r.digits;
});

export const vesselSchema = z
  .object({
    vesselId: z.preprocess(blankToNull, z.coerce.number().int().positive().nullable()).optional(),
    name: trimmed("vessel name", 120, 2),
    imoNumber: imoSchema,
    companyId: z.preprocess(blankToNull, z.coerce.number().int().positive().nullable()),
    newCompanyName: optionalText("company name", 160),
    vesselType: optionalText("vessel type", 60),
    flag: optionalText("flag", 60),
    builtYear: optionalNum("year built").refine(
      (y) => y === null || (Number.isInteger(y) && y >= 1950 && y <= new Date().getFullYear() + 3),
      "Enter a year between 1950 and three years from now.",
    ),
  })
  .superRefine((v, ctx) => {
    if (!v.companyId && !v.newCompanyName) {
      ctx.addIssue({ code: "custom", path: ["companyId"], message: "Choose the managing company, or name a new one." });
    }
  });
export type VesselInput = z.input<typeof vesselSchema>;

export const MIN_CYLINDERS = 4;
export const MAX_CYLINDERS = 14;

export const engineSchema = z.object({
  vesselId: id,
  profileId: id,
  serial: trimmed("engine serial", 60).regex(/^[A-Za-z0-9][A-Za-z0-9 ./-]*$/, "Use letters, digits, spaces, dots, slashes and dashes."),
  cylinderCount: num("cylinder count").refine(
    (n) => Number.isInteger(n) && n >= MIN_CYLINDERS && n <= MAX_CYLINDERS,
    `A two-stroke main engine has ${MIN_CYLINDERS} to ${MAX_CYLINDERS} cylinders.`,
  ),
  commissionedOn: z.preprocess(blankToNull, recordDate("commissioning date").nullable()),
});
export type EngineInput = z.input<typeof engineSchema>;

// ── engine profiles ─────────────────────────────────────────────────────────────

export const STATION_ROLES = ["unworn_top", "ring_tdc", "intermediate", "lubricator", "above_ports", "unworn_bottom"] as const;
export const STATION_ROLE_LABELS: Record<(typeof STATION_ROLES)[number], string> = {
  unworn_top: "Unworn, above ring travel",
  ring_tdc: "Ring position at TDC",
  intermediate: "Intermediate",
  lubricator: "Lubricator level",
  above_ports: "Above scavenge ports",
  unworn_bottom: "Unworn, below ring travel",
};

const key = (label: string) =>
  z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .min(1, `Enter the ${label}.`)
    .max(16, `The ${label} is at most 16 characters.`)
    .regex(/^[a-z0-9_-]+$/i, "Letters, digits, - and _ only.");

export const stationSchema = z.object({
  key: key("station key"),
  label: trimmed("station label", 60),
  depthMm: num("depth").refine((d) => d >= 0 && d <= 6000, "Depth below the liner top, 0 to 6000 mm."),
  role: z.enum(STATION_ROLES, { error: "Choose what this station is for." }),
});

export const ringSchema = z.object({
  label: trimmed("ring label", 40),
  gapNewMinMm: num("closed gap, new, min").refine((v) => v > 0 && v < 100, "A gap in mm, above 0."),
  gapNewMaxMm: num("closed gap, new, max").refine((v) => v > 0 && v < 100, "A gap in mm, above 0."),
  gapLimitMm: num("closed gap limit").refine((v) => v > 0 && v < 100, "A gap in mm, above 0."),
  grooveNewMinMm: num("groove clearance, new, min").refine((v) => v > 0 && v < 10, "A clearance in mm, above 0."),
  grooveNewMaxMm: num("groove clearance, new, max").refine((v) => v > 0 && v < 10, "A clearance in mm, above 0."),
  grooveLimitMm: num("groove clearance limit").refine((v) => v > 0 && v < 10, "A clearance in mm, above 0."),
});

/** The share of the bore a wear or ovality limit may not exceed: more is a typing error. */
export const MAX_LIMIT_SHARE_OF_BORE = 0.02;

export const profileSchema = z
  .object({
    profileId: z.preprocess(blankToNull, z.coerce.number().int().positive().nullable()).optional(),
    name: trimmed("profile name", 120, 2),
    designation: trimmed("engine designation", 80),
    boreMm: num("bore").refine((v) => v >= 200 && v <= 1200, "A main-engine bore is 200 to 1200 mm."),
    strokeMm: optionalNum("stroke").refine((v) => v === null || (v >= 300 && v <= 5000), "A stroke is 300 to 5000 mm."),
    linerWearLimitMm: num("liner wear limit"),
    ovalityLimitMm: num("ovality limit"),
    wearReference: z.enum(["nominal", "as_fitted"], { error: "Choose what wear is measured from." }),
    temperatureCorrection: z.preprocess((v) => v === true || v === "on" || v === "true", z.boolean()),
    linerMaterial: trimmed("liner material", 80),
    alphaLinerPpmPerK: num("liner expansion coefficient").refine((v) => v >= 5 && v <= 25, "Between 5 and 25 × 10⁻⁶ per K."),
    gaugeMaterial: trimmed("gauge material", 80),
    alphaGaugePpmPerK: num("gauge expansion coefficient").refine((v) => v >= 0.5 && v <= 25, "Between 0.5 and 25 × 10⁻⁶ per K."),
    runningInHours: num("running-in hours").refine((v) => v >= 0 && v <= 20000, "0 to 20 000 h."),
    minPointsForProjection: num("points for a projection").refine((v) => Number.isInteger(v) && v >= 3 && v <= 12, "A whole number, 3 to 12."),
    axisAKey: key("first direction key"),
    axisALabel: trimmed("first direction name", 40),
    axisBKey: key("second direction key"),
    axisBLabel: trimmed("second direction name", 40),
    overhaulIntervalHours: num("overhaul interval").refine((v) => v >= 1000 && v <= 60000, "1 000 to 60 000 h."),
    rodNutPressureBar: optionalNum("rod nut pressure").refine((v) => v === null || (v >= 100 && v <= 4000), "100 to 4 000 bar."),
    notes: optionalText("notes", 2000),
    stations: z.array(stationSchema).min(3, "A profile needs at least 3 stations.").max(16, "At most 16 stations."),
    rings: z.array(ringSchema).min(1, "A profile needs at least one ring.").max(8, "At most 8 rings."),
  })
  .superRefine((p, ctx) => {
    const issue = (path: (string | number)[], message: string) => ctx.addIssue({ code: "custom", path, message });
    const maxLimit = Math.round(p.boreMm * MAX_LIMIT_SHARE_OF_BORE * 1000) / 1000;
    for (const field of ["linerWearLimitMm", "ovalityLimitMm"] as const) {
      const v = p[field];
      if (!(v > 0)) issue([field], "The limit must be above 0 mm.");
      else if (p.boreMm >= 200 && v > maxLimit) issue([field], `At most 2 % of the bore (${maxLimit} mm); check the manual's figure.`);
    }
    if (p.ovalityLimitMm > p.linerWearLimitMm && p.linerWearLimitMm > 0) {
      issue(["ovalityLimitMm"], "The ovality limit cannot exceed the wear limit.");
    }
    if (p.strokeMm !== null && p.stations.length) {
      const deepest = p.stations[p.stations.length - 1];
      if (deepest.depthMm > p.strokeMm * 1.6) issue(["stations", p.stations.length - 1, "depthMm"], "Deeper than the liner can be for this stroke.");
    }
    if (p.axisAKey.toLowerCase() === p.axisBKey.toLowerCase()) issue(["axisBKey"], "The two directions need different keys.");

    const seen = new Map<string, number>();
    p.stations.forEach((s, i) => {
      const k = s.key.toLowerCase();
      if (seen.has(k)) issue(["stations", i, "key"], `Key "${s.key}" is already used by station ${seen.get(k)! + 1}.`);
      else seen.set(k, i);
      if (i > 0 && s.depthMm <= p.stations[i - 1].depthMm) {
        issue(["stations", i, "depthMm"], `Must be deeper than station ${i} (${p.stations[i - 1].depthMm} mm): list stations from the top down.`);
      }
    });
    // Several rings may have their own TDC station; the wear peak is looked for near them.
    if (!p.stations.some((s) => s.role === "ring_tdc")) issue(["stations"], "Mark at least one station as a ring position at top dead centre.");

    p.rings.forEach((r, i) => {
      if (r.gapNewMinMm > r.gapNewMaxMm) issue(["rings", i, "gapNewMaxMm"], "The new maximum must not be below the new minimum.");
      if (r.gapLimitMm <= r.gapNewMaxMm) issue(["rings", i, "gapLimitMm"], `The limit must be above the new maximum (${r.gapNewMaxMm} mm).`);
      if (r.grooveNewMinMm > r.grooveNewMaxMm) issue(["rings", i, "grooveNewMaxMm"], "The new maximum must not be below the new minimum.");
      if (r.grooveLimitMm <= r.grooveNewMaxMm) issue(["rings", i, "grooveLimitMm"], `The limit must be above the new maximum (${r.grooveNewMaxMm} mm).`);
    });
  });
export type ProfileInput = z.input<typeof profileSchema>;
export type ProfileData = z.output<typeof profileSchema>;

/** A new profile's starting values: a plausible large-bore layout to edit, not a maker's data. */
export const EMPTY_PROFILE: ProfileInput = {
  profileId: null,
  name: "",
  designation: "",
  boreMm: "",
  strokeMm: null,
  linerWearLimitMm: "",
  ovalityLimitMm: "",
  wearReference: "nominal",
  temperatureCorrection: true,
  linerMaterial: "Grey cast iron",
  alphaLinerPpmPerK: 10.5,
  gaugeMaterial: "Carbon steel",
  alphaGaugePpmPerK: 11.5,
  runningInHours: 3000,
  minPointsForProjection: 3,
  axisAKey: "fa",
  axisALabel: "Fore–aft",
  axisBKey: "ath",
  axisBLabel: "Athwartships",
  overhaulIntervalHours: 16000,
  rodNutPressureBar: null,
  notes: null,
  stations: [
    { key: "s1", label: "Top, unworn", depthMm: "", role: "unworn_top" },
    { key: "s2", label: "Top ring TDC", depthMm: "", role: "ring_tdc" },
    { key: "s3", label: "Intermediate", depthMm: "", role: "intermediate" },
  ],
  rings: [1, 2, 3, 4].map((n) => ({
    label: `Ring ${n}`,
    gapNewMinMm: "",
    gapNewMaxMm: "",
    gapLimitMm: "",
    grooveNewMinMm: "",
    grooveNewMaxMm: "",
    grooveLimitMm: "",
  })),
};
