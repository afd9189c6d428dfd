/** One rate cell → number, blank or InputError (the forms desks paste into workbooks). */
import {
  CURRENCY_CODES,
  EXCEL_ERROR_TEXTS,
  excelErrorOf,
  looksLikeMalformedNumber,
  parseNumberText,
  readRateCell,
} from "../../../src/core/series/cells";
import { InputError } from "../../../src/core/series/errors";

const place = { label: "Row 14", cell: { row: 13, col: 0 } };

function expectError(r: unknown, code: string): InputError {
  expect(r).toBeInstanceOf(InputError);
  const e = r as InputError;
  expect(e.code).toBe(code);
  expect(e.cell).toEqual({ row: 13, col: 0 });
  expect(e.message.startsWith("Row 14 ")).toBe(true);
  return e;
}

describe("readRateCell: accepted numbers", () => {
  test.each<[unknown, number]>([
    [1834.5, 1834.5],
    [0, 0],
    [-12.25, -12.25],
    ["1834", 1834],
    ["1,834.5", 1834.5],
    ["12,345,678", 12345678],
    ["$1,834", 1834],
    ["USD 1834", 1834],
    ["USD1834", 1834],
    ["1834 €", 1834],
    ["1834€", 1834],
    ["€ 1,834.25", 1834.25],
    ["£1,200.00", 1200],
    ["¥250000", 250000],
    ["US$ 2,100", 2100],
    ["1834 CNY", 1834],
    ["  1834.5  ", 1834.5],
    ["\u00a01834\u00a0", 1834],
    ["-$1,834", -1834],
    ["$-1,834", -1834],
    ["USD -50", -50],
    ["+75", 75],
    [".5", 0.5],
    ["1834.", 1834],
    ["1.8e3", 1800],
  ])("%p reads as %p", (v, want) => {
    expect(readRateCell(v, place)).toBe(want);
  });
});

describe("readRateCell: blanks", () => {
  test.each([[""], ["   "], [null], [undefined]])("%p is blank", (v) => {
    expect(readRateCell(v, place)).toBeNull();
  });
});

describe("readRateCell: refused values", () => {
  test('text that is not a number is quoted in the message', () => {
    const e = expectError(readRateCell("n/a", place), "NOT_A_NUMBER");
    expect(e.message).toBe('Row 14 holds "n/a", which is not a number.');
  });

  test.each([
    ["1.834,50"], // continental separators: ambiguous, refused
    ["1,83,4"], // broken thousands groups
    ["12,34"],
    ["$"],
    ["USD"],
    ["$1834 USD"], // two currency markers
    ["1834 $ €"],
    ["1 834"],
    ["--5"],
    ["five"],
    ["1e400"], // overflows to Infinity
    ["0x10"],
  ])("%p is NOT_A_NUMBER", (v) => {
    const e = expectError(readRateCell(v, place), "NOT_A_NUMBER");
    expect(e.message).toContain(`"${v}"`);
  });

  test.each([["12%"], ["-3.5 %"], ["%4"], ["$12%"]])("percentage %p is not a rate", (v) => {
    const e = expectError(readRateCell(v, place), "NOT_A_NUMBER");
    expect(e.message).toContain("percentage");
  });

  test.each<[unknown, string]>([
    [true, "TRUE"],
    [false, "FALSE"],
  ])("boolean %p is NOT_A_NUMBER", (v, shown) => {
    const e = expectError(readRateCell(v, place), "NOT_A_NUMBER");
    expect(e.message).toContain(shown);
  });

  test.each([[NaN], [Infinity], [-Infinity]])("non-finite number %p is NOT_A_NUMBER", (v) => {
    expectError(readRateCell(v, place), "NOT_A_NUMBER");
  });

  test("a date or another object is NOT_A_NUMBER", () => {
    expectError(readRateCell(new Date(), place), "NOT_A_NUMBER");
    expectError(readRateCell({ value: 5 }, place), "NOT_A_NUMBER");
    expectError(readRateCell([5], place), "NOT_A_NUMBER");
  });

  test("without a place the sentence starts with 'The cell'", () => {
    const r = readRateCell("abc");
    expect(r).toBeInstanceOf(InputError);
    expect((r as InputError).message).toBe('The cell holds "abc", which is not a number.');
    expect((r as InputError).cell).toBeUndefined();
  });
});

describe("Excel error values", () => {
  const texts = [
    "#N/A",
    "#VALUE!",
    "#DIV/0!",
    "#REF!",
    "#NAME?",
    "#NUM!",
    "#NULL!",
    "#SPILL!",
    "#CALC!",
    "#GETTING_DATA",
    "#BUSY!",
  ];
  test.each(texts.map((t) => [t]))("text %s is CELL_ERROR naming it", (t) => {
    expect(EXCEL_ERROR_TEXTS).toContain(t);
    const e = expectError(readRateCell(t, place), "CELL_ERROR");
    expect(e.message).toContain(t);
  });

  test.each<[unknown, string]>([
    [{ code: "#N/A" }, "#N/A"],
    [{ code: "#div/0!" }, "#DIV/0!"],
    [{ errorCode: "NotAvailable" }, "#N/A"],
    [{ errorCode: "invalidValue" }, "#VALUE!"],
    [{ errorCode: "DivisionByZero" }, "#DIV/0!"],
    [{ errorCode: "invalidReference" }, "#REF!"],
    [{ errorCode: "invalidName" }, "#NAME?"],
    [{ errorCode: "invalidNumber" }, "#NUM!"],
    [{ errorCode: "nullReference" }, "#NULL!"],
    [{ type: "Error", errorType: "Div0" }, "#DIV/0!"],
    [{ type: "Error", errorType: "GettingData" }, "#GETTING_DATA"],
    [{ type: "Error", errorType: "Spill" }, "#SPILL!"],
  ])("object %p is CELL_ERROR %s", (v, name) => {
    expect(excelErrorOf(v)).toBe(name);
    const e = expectError(readRateCell(v, place), "CELL_ERROR");
    expect(e.message).toBe(`Row 14 holds the error value ${name}; fix or clear that cell first.`);
  });

  test("ordinary text and numbers are not errors", () => {
    expect(excelErrorOf("#1 lane")).toBeUndefined();
    expect(excelErrorOf("N/A")).toBeUndefined();
    expect(excelErrorOf(42)).toBeUndefined();
    expect(excelErrorOf({ code: 7 })).toBeUndefined();
  });
});

describe("parseNumberText", () => {
  test("keeps full precision of the digits", () => {
    expect(parseNumberText("1,234,567.891")).toBe(1234567.891);
    expect(parseNumberText("0.1")).toBe(0.1);
  });
  test("refuses the empty string", () => {
    expect(parseNumberText("")).toBeUndefined();
  });
});

describe("currency codes", () => {
  test("the list is the documented 30 codes, each read before and after a number", () => {
    expect(CURRENCY_CODES).toHaveLength(30);
    for (const code of CURRENCY_CODES) {
      expect(parseNumberText(`${code} 1,834`)).toBe(1834);
      expect(parseNumberText(`1834.5${code}`)).toBe(1834.5);
    }
    expect(parseNumberText("RMB 12,500")).toBe(12500);
  });

  test.each([["FBX11"], ["WCI 40"], ["ABC 100"], ["100 XYZ"], ["EURO 40"], ["USDX 5"], ["40 FEU"]])(
    "%p is not a number: three capitals are not a currency by themselves",
    (v) => {
      expect(parseNumberText(v)).toBeUndefined();
      const e = expectError(readRateCell(v, place), "NOT_A_NUMBER");
      expect(e.message).toBe(`Row 14 holds "${v}", which is not a number.`);
    },
  );
});

describe("looksLikeMalformedNumber", () => {
  test.each([["1 834"], ["(1,834)"], ["usd 1834"], ["1.834,50"], ["Eur 1 834"], ["− 1 834 $"]])(
    "%p looks like a number written in a form we do not read",
    (v) => expect(looksLikeMalformedNumber(v)).toBe(true),
  );
  test.each([["1834"], ["USD 1,834"], ["FBX11"], ["WCI 40"], ["40'"], ["2024-25"], ["Rate"], ["()"]])(
    "%p does not",
    (v) => expect(looksLikeMalformedNumber(v)).toBe(false),
  );
});
