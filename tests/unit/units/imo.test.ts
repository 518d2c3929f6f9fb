import { describe, expect, test } from "vitest";
import { imoCheckDigit, parseImoNumber } from "@/lib/units/imo";

// Invented numbers below start with 1–4, a block not issued to ships (issued numbers start
// 5–9 [memory]); their check digits are worked out by hand [derived].
describe("IMO ship number (IMO Resolution A.1078(28) scheme: weights 7,6,5,4,3,2, last digit of the sum)", () => {
  test.each([
    // The worked example usually given with the scheme's description [memory]; it is a number in
    // the issued block and appears here only as that worked example:
    // 9·7 + 0·6 + 7·5 + 4·4 + 7·3 + 2·2 = 139, check digit 9.
    ["907472", 9],
    ["123456", 7], // [derived] 7+12+15+16+15+12 = 77
    ["310452", 2], // [derived] 21+6+0+16+15+4 = 62
    ["000000", 0], // [derived]
    ["12345", null],
    ["12345a", null],
  ])("check digit of %s is %s", (six, digit) => {
    expect(imoCheckDigit(six)).toBe(digit);
  });

  test.each([
    ["IMO 3104522", "3104522"],
    ["3104522", "3104522"],
    ["imo3104522", "3104522"],
    ["  IMO  3104522 ", "3104522"],
    ["1234567", "1234567"], // [derived] check digit 7, as above
    // A real ship's number must still be accepted: the worked example above, from the issued block.
    ["IMO 9074729", "9074729"],
  ])("accepts %j", (input, digits) => {
    expect(parseImoNumber(input)).toEqual({ ok: true, digits, formatted: `IMO ${digits}` });
  });

  test.each([
    ["", "empty"],
    ["   ", "empty"],
    ["IMO 310452", "format"],
    ["31045220", "format"],
    ["IMO-3104522", "format"],
    ["3104523", "check_digit"],
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
