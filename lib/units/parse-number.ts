/*
 * Numbers as people type them on a tablet: a point or a comma for the decimal, spaces,
 * commas or points between thousands. One comma followed by exactly three digits
 * ("1,250") is the one truly ambiguous form: one thousand two hundred and fifty where
 * commas group thousands, one and a quarter where the comma is the decimal mark. It is
 * settled by the size the field expects (a rod nut pressure of about 1250 bar is never
 * 1.25 bar; a 600 mm bore read as "600,050" is 600.05 mm), and otherwise left for the
 * person to choose. Pure, shared by the gauging sheet and the server.
 */

export type ParsedNumber =
  | { kind: "empty" }
  | { kind: "invalid" }
  | { kind: "number"; value: number }
  /** "1,250" with nothing to tell the two readings apart: ask. */
  | { kind: "ambiguous"; grouped: number; decimal: number };

export type ParseNumberOptions = {
  /**
   * About how large a value of this field is (the profile's pressure, the last engine hours,
   * the nominal bore). Settles "1,250" when one reading is clearly nearer to it.
   */
  expected?: number | null;
};

// A ratio of 10 between the two readings' distances from the expected size is decisive;
// the two readings themselves differ by 1000, so only an expected size near their
// geometric mean (about 35 for "1,250") leaves the choice open.
const DECISIVE = Math.log(10);

const GROUPED = (sep: string) => new RegExp(`^\\d{1,3}(\\${sep}\\d{3})+$`);

/**
 * Reads a typed number. Spaces (also thin and no-break spaces) are ignored. With both a
 * point and a comma, the last one is the decimal mark and the other groups thousands in
 * threes ("65,950.5", "65.950,5"). A single comma is a decimal mark ("600,05"), except one
 * followed by exactly three digits, which is settled by `expected` or returned as
 * `ambiguous`. Several commas group thousands ("1,250,000"). A point alone is always the
 * decimal mark. Anything else (letters, exponents, two decimal marks) is `invalid`.
 */
export function parseNumberInput(text: string, options: ParseNumberOptions = {}): ParsedNumber {
  const t = text.replace(/[\s\u00a0\u2009\u202f]/g, "");
  if (t === "") return { kind: "empty" };
  const m = /^([+-]?)(.*)$/.exec(t)!;
  const sign = m[1] === "-" ? -1 : 1;
  const body = m[2];
  if (!/^[\d.,]+$/.test(body) || !/\d/.test(body)) return { kind: "invalid" };
  const value = (s: string) => {
    if (!/^(\d+\.?\d*|\.\d+)$/.test(s)) return null;
    const n = sign * Number(s);
    return Number.isFinite(n) ? n : null;
  };
  const result = (s: string): ParsedNumber => {
    const n = value(s);
    return n === null ? { kind: "invalid" } : { kind: "number", value: n };
  };

  const lastComma = body.lastIndexOf(",");
  const lastPoint = body.lastIndexOf(".");
  if (lastComma >= 0 && lastPoint >= 0) {
    const decimalSep = lastComma > lastPoint ? "," : ".";
    const groupSep = decimalSep === "," ? "." : ",";
    const cut = Math.max(lastComma, lastPoint);
    const intPart = body.slice(0, cut);
    const frac = body.slice(cut + 1);
    if (!GROUPED(groupSep).test(intPart) || !/^\d*$/.test(frac)) return { kind: "invalid" };
    return result(`${intPart.split(groupSep).join("")}.${frac}`);
  }
  if (lastComma < 0) return result(body);

  const commas = body.split(",").length - 1;
  if (commas > 1) return GROUPED(",").test(body) ? result(body.split(",").join("")) : { kind: "invalid" };
  const [intPart, frac] = body.split(",");
  if (frac.length !== 3 || !/^[1-9]\d{0,2}$/.test(intPart)) return result(`${intPart}.${frac}`);

  // "1,250": both readings are numbers; the field's expected size decides, else ask.
  const grouped = value(intPart + frac)!;
  const decimal = value(`${intPart}.${frac}`)!;
  const expected = options.expected;
  if (expected != null && Number.isFinite(expected) && expected !== 0) {
    const dist = (v: number) => Math.abs(Math.log(Math.abs(v) / Math.abs(expected)));
    const dg = dist(grouped);
    const dd = dist(decimal);
    if (Math.abs(dg - dd) > DECISIVE) return { kind: "number", value: dg < dd ? grouped : decimal };
  }
  return { kind: "ambiguous", grouped, decimal };
}

/**
 * A number printed so that it cannot be misread either way: thousands grouped with a
 * space, a point for the decimal ("1 250", "1.25", "65 950.5"). Used to show beside an
 * input how a typed value was read.
 */
export function plainNumber(value: number, maxDecimals = 3): string {
  if (!Number.isFinite(value)) return "—";
  const fixed = value.toFixed(Math.max(0, Math.min(maxDecimals, 10))).replace(/(\.\d*?)0+$/, "$1").replace(/\.$/, "");
  const [i, f] = fixed.replace(/^-/, "").split(".");
  const grouped = i.length > 3 ? i.replace(/\B(?=(\d{3})+(?!\d))/g, "\u202f") : i;
  const text = `${grouped}${f ? `.${f}` : ""}`;
  return value < 0 && Number(fixed) !== 0 ? `−${text}` : text;
}
