/**
 * Excel serials of the 1900 date system. The serial/date pairs below are facts of Excel's
 * documented date system, quoted from memory: serial 1 is 1900-01-01, 60 is the fictitious
 * 1900-02-29, 61 is 1900-03-01, 2958465 (the last one) is 9999-12-31; 25569 is the Unix
 * epoch 1970-01-01 (the constant in the usual serial-to-Unix-time conversion); 36526 is
 * 2000-01-01 and 45658 is 2025-01-01.
 */
import {
  dateToExcelSerial,
  excelSerialToDate,
  parseIsoDateText,
  readDateCell,
  utcDay,
} from "../../../src/core/series/excelDate";

const iso = (d: Date | undefined): string | undefined => d?.toISOString().slice(0, 10);

describe("excelSerialToDate", () => {
  test.each([
    [1, "1900-01-01"],
    [2, "1900-01-02"],
    [59, "1900-02-28"],
    [61, "1900-03-01"],
    [25569, "1970-01-01"],
    [36526, "2000-01-01"],
    [45658, "2025-01-01"],
    [2958465, "9999-12-31"],
  ])("serial %d is %s", (serial, day) => {
    expect(iso(excelSerialToDate(serial))).toBe(day);
  });

  test("the time of day in a fractional serial is dropped", () => {
    expect(iso(excelSerialToDate(45658.0001))).toBe("2025-01-01");
    expect(iso(excelSerialToDate(45658.999))).toBe("2025-01-01");
    expect(excelSerialToDate(45658.75)?.getTime()).toBe(utcDay(2025, 1, 1).getTime());
  });

  test("results are UTC midnight", () => {
    const d = excelSerialToDate(45000.6);
    expect(d?.getUTCHours()).toBe(0);
    expect(d?.getUTCMinutes()).toBe(0);
  });

  test.each([60, 60.5, 0, 0.9, -1, 2958466, NaN, Infinity])("serial %p is not a date", (s) => {
    expect(excelSerialToDate(s)).toBeUndefined();
  });
});

describe("dateToExcelSerial", () => {
  test.each([
    ["1900-01-01", 1],
    ["1900-02-28", 59],
    ["1900-03-01", 61],
    ["1970-01-01", 25569],
    ["2025-01-01", 45658],
    ["9999-12-31", 2958465],
  ])("%s has serial %d", (day, serial) => {
    expect(dateToExcelSerial(new Date(`${day}T00:00:00Z`))).toBe(serial);
  });

  test("is the inverse of excelSerialToDate over the whole range except 60", () => {
    // Every 97th serial, plus the edges of the phantom leap day.
    const serials = [1, 58, 59, 61, 62, 2958465];
    for (let s = 1; s <= 2958465; s += 97) serials.push(s);
    for (const s of serials) {
      if (s === 60) continue;
      const d = excelSerialToDate(s);
      expect(d).toBeDefined();
      expect(dateToExcelSerial(d as Date)).toBe(s);
    }
  });

  test("consecutive days have consecutive serials, skipping 60", () => {
    expect(dateToExcelSerial(utcDay(1900, 3, 1)) - dateToExcelSerial(utcDay(1900, 2, 28))).toBe(2);
    expect(dateToExcelSerial(utcDay(2024, 3, 1)) - dateToExcelSerial(utcDay(2024, 2, 29))).toBe(1);
  });

  test("days outside Excel's range throw", () => {
    expect(() => dateToExcelSerial(utcDay(1899, 12, 31))).toThrow(RangeError);
    expect(() => dateToExcelSerial(utcDay(10000, 1, 1))).toThrow(RangeError);
    expect(() => dateToExcelSerial(new Date(NaN))).toThrow(RangeError);
  });
});

describe("parseIsoDateText", () => {
  test.each([
    "2025-01-03",
    "  2025-01-03 ",
    "2025-01-03T00:00",
    "2025-01-03T23:59:59Z",
    "2025-01-03T10:00:00.123+05:30",
    "2025-01-03T22:00-0800",
  ])("%p is 2025-01-03", (text) => {
    expect(iso(parseIsoDateText(text))).toBe("2025-01-03");
  });

  test("leap days exist only in leap years", () => {
    expect(iso(parseIsoDateText("2024-02-29"))).toBe("2024-02-29");
    expect(iso(parseIsoDateText("2000-02-29"))).toBe("2000-02-29");
    expect(parseIsoDateText("1900-02-29")).toBeUndefined();
    expect(parseIsoDateText("2025-02-29")).toBeUndefined();
  });

  test("years below 100 are not moved into the 1900s", () => {
    expect(parseIsoDateText("0050-06-15")?.getUTCFullYear()).toBe(50);
  });

  test.each([
    "2025-13-01",
    "2025-04-31",
    "2025-00-10",
    "0000-01-01",
    "2025-1-3",
    "03/01/2025",
    "2025-01-03 10:00",
    "2025-01-03T",
    "20250103",
    "next week",
    "",
  ])("%p is not a date", (text) => {
    expect(parseIsoDateText(text)).toBeUndefined();
  });
});

describe("readDateCell", () => {
  test("reads serials, ISO text and Date objects to the same UTC day", () => {
    const want = utcDay(2025, 1, 3).getTime();
    for (const v of [45660, 45660.5, "2025-01-03", new Date("2025-01-03T17:45:00Z")]) {
      const r = readDateCell(v);
      expect(r.kind).toBe("date");
      if (r.kind === "date") expect(r.date.getTime()).toBe(want);
    }
  });

  test.each([[""], ["   "], [null], [undefined]])("%p is blank", (v) => {
    expect(readDateCell(v).kind).toBe("blank");
  });

  test("serial 60 is refused with the reason", () => {
    const r = readDateCell(60);
    expect(r.kind).toBe("invalid");
    if (r.kind === "invalid") expect(r.reason).toContain("29 February 1900");
  });

  test.each([[true], ["03/01/2025"], [new Date(NaN)], [{ year: 2025 }], [0], [3e6]])(
    "%p is not a date",
    (v) => {
      expect(readDateCell(v).kind).toBe("invalid");
    },
  );
});

// The 1904 date system counts serial 0 as 1904-01-01 with no phantom day, so a 1904 serial
// is a plain day count; 1904 was a leap year, so serial 60 is 1904-03-01 (31 + 29 days).
// 2957003 = 2958465 − 1462 is 9999-12-31. 43466 is 2019-01-01 in the 1900 system (from
// memory) and 1462 days later, 2023-01-02, in the 1904 system.
describe("the 1904 date system", () => {
  test.each([
    [0, "1904-01-01"],
    [60, "1904-03-01"],
    [43466, "2023-01-02"],
    [2957003, "9999-12-31"],
  ])("serial %d is %s", (serial, day) => {
    expect(iso(excelSerialToDate(serial, 1904))).toBe(day);
  });

  test("is 1462 days after the 1900 system for the same serial", () => {
    for (const serial of [61, 25569, 43466, 45658]) {
      const a = excelSerialToDate(serial)?.getTime() ?? NaN;
      const b = excelSerialToDate(serial, 1904)?.getTime() ?? NaN;
      expect((b - a) / 86_400_000).toBe(1462);
    }
  });

  test("outside 0 … 2957003 is not a date, with a reason", () => {
    expect(excelSerialToDate(-1, 1904)).toBeUndefined();
    expect(excelSerialToDate(2957004, 1904)).toBeUndefined();
    expect(readDateCell(2957004, 1904)).toEqual({
      kind: "invalid",
      reason: "in the 1904 date system, Excel dates end at serial 2957003, which is 31 December 9999",
    });
    expect(readDateCell(43466, 1904)).toEqual({ kind: "date", date: utcDay(2023, 1, 2) });
  });
});
