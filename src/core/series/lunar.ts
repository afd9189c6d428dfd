/**
 * Lunar-new-year dates: the first day of the first month of the Chinese calendar, which falls
 * between 21 January and 20 February. Its effect on freight rates is a calendar regressor
 * (DESIGN.md, "Periods"), so the core needs the true day of each year, not a fixed week.
 *
 * The calendar comes from the platform's ICU (the "chinese" calendar of Intl.DateTimeFormat),
 * which Node 20 and every current browser ship in full; no Node-only module is used, so the
 * core runs in the pane as well as in the batch runner.
 *
 * ICU computes new moons with a compact orbital approximation that can be a few minutes off.
 * When the new moon of the first month falls within minutes of midnight China time, that puts
 * ICU's first day on the wrong side of midnight. In 1900–2100 this happens for three years,
 * found by comparing ICU (78.2, Node 20) with Meeus' new-moon algorithm ("Astronomical
 * Algorithms", 2nd ed., ch. 49, with the periodic and planetary terms) in China's zone
 * (UTC+8 from 1929, Beijing mean time before):
 *   1954: new moon 3 Feb 23:55 UTC+8 — ICU gives 4 Feb;
 *   2027: new moon 6 Feb 23:56 UTC+8 — ICU gives 7 Feb;
 *   2030: new moon 3 Feb 00:07 UTC+8 — ICU gives 2 Feb.
 * The published almanac dates (Hong Kong Observatory tables) are the astronomical ones, so
 * those years are taken from the table below whatever the platform says; a platform whose
 * ICU has been corrected gives the same answer. test/core/series/lunar.test.ts re-checks every
 * year 1900–2100 against the Meeus new moon.
 */

const FIRST_YEAR = 1900;
const LAST_YEAR = 2100;

/** Years whose new moon is within minutes of midnight China time (see the header). */
const NEAR_MIDNIGHT: ReadonlyMap<number, readonly [number, number]> = new Map([
  [1954, [2, 3]],
  [2027, [2, 6]],
  [2030, [2, 3]],
]);

const cache = new Map<number, number>();
let formatter: Intl.DateTimeFormat | undefined;

function chineseFormatter(): Intl.DateTimeFormat {
  if (formatter) return formatter;
  const f = new Intl.DateTimeFormat("en-u-ca-chinese", { timeZone: "UTC", month: "numeric", day: "numeric" });
  // A platform built with reduced ICU falls back to the Gregorian calendar without an error.
  if (f.resolvedOptions().calendar !== "chinese") throw noChineseCalendar();
  formatter = f;
  return f;
}

function noChineseCalendar(): Error {
  return new Error(
    "This platform's Intl has no Chinese calendar (it needs full ICU data), so lunar-new-year " +
      "dates cannot be computed.",
  );
}

/** The Chinese month (as ICU writes it: "1", …, "4bis" for a leap month) and day of a UTC day. */
function chineseMonthDay(f: Intl.DateTimeFormat, ms: number): { month: string; day: string } {
  const parts = f.formatToParts(new Date(ms));
  const month = parts.find((p) => p.type === "month")?.value;
  const day = parts.find((p) => p.type === "day")?.value;
  if (month === undefined || day === undefined) throw noChineseCalendar();
  return { month, day };
}

function search(year: number): number {
  // Checked first even for the table years, so a platform without the calendar always says so.
  const f = chineseFormatter();
  const near = NEAR_MIDNIGHT.get(year);
  if (near) return Date.UTC(year, near[0] - 1, near[1]);
  // 21 January – 20 February: the range the first month always begins in (1900–2100).
  for (let d = 0; d < 31; d++) {
    const day = Date.UTC(year, 0, 21 + d);
    // Read at noon so the UTC day is unambiguous.
    const md = chineseMonthDay(f, day + 43_200_000);
    if (md.month === "1" && md.day === "1") return day;
  }
  throw noChineseCalendar();
}

/**
 * The UTC-midnight Date of the lunar new year (first day of the first Chinese month) in the
 * Gregorian year `year`, 1900–2100. Throws when the platform lacks the Chinese calendar.
 */
export function lunarNewYear(year: number): Date {
  if (!Number.isInteger(year) || year < FIRST_YEAR || year > LAST_YEAR) {
    throw new RangeError(`Lunar-new-year dates are available for ${FIRST_YEAR}–${LAST_YEAR}; got ${year}.`);
  }
  let ms = cache.get(year);
  if (ms === undefined) {
    ms = search(year);
    cache.set(year, ms);
  }
  // A fresh Date each call: a caller that mutates it cannot change the cached day.
  return new Date(ms);
}
