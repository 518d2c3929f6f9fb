import { describe, expect, test } from "vitest";
import { imoCheckDigit, parseImoNumber } from "@/lib/units/imo";

describe("IMO ship number (IMO Resolution A.1078(28) scheme: weights 7,6,5,4,3,2, last digit of the sum)", () => {
  // 9074729: the worked example usually given with the scheme's description [memory]:
  // 9·7 + 0·6 + 7·5 + 4·4 + 7·3 + 2·2 = 139, check digit 9.
  test.each([
    ["907472", 9],
    ["123456", 7], // [derived] 7+12+15+16+15+12 = 77
    ["000000", 0], // [derived]
    ["12345", null],
    ["12345a", null],
  ])("check digit of %s is %s", (six, digit) => {
    expect(imoCheckDigit(six)).toBe(digit);
  });

  test.each([
    ["IMO 9074729", "9074729"],
    ["9074729", "9074729"],
    ["imo9074729", "9074729"],
    ["  IMO  9074729 ", "9074729"],
    ["1234567", "1234567"], // [derived] check digit 7, as above
  ])("accepts %j", (input, digits) => {
    expect(parseImoNumber(input)).toEqual({ ok: true, digits, formatted: `IMO ${digits}` });
  });

  test.each([
    ["", "empty"],
    ["   ", "empty"],
    ["IMO 907472", "format"],
    ["90747290", "format"],
    ["IMO-9074729", "format"],
    ["9074728", "check_digit"],
    ["IMO 1234562", "check_digit"],
  ])("rejects %j as %s", (input, reason) => {
    const result = parseImoNumber(input);
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.reason).toBe(reason);
      expect(result.message.length).toBeGreaterThan(10);
    }
  });
});
