import { lunarNewYear } from "../../../src/core/series/lunar";

/**
 * Lunar-new-year dates 2010–2030. Typed from memory of the published almanac dates (the Hong
 * Kong Observatory's Gregorian–lunar conversion tables, which follow the Purple Mountain
 * Observatory's calendar), and cross-checked against an independent astronomical source
 * below: each is the day, in China's zone, of a new moon computed by Meeus' algorithm.
 */
const KNOWN: [number, string][] = [
  [2010, "2010-02-14"],
  [2011, "2011-02-03"],
  [2012, "2012-01-23"],
  [2013, "2013-02-10"],
  [2014, "2014-01-31"],
  [2015, "2015-02-19"],
  [2016, "2016-02-08"],
  [2017, "2017-01-28"],
  [2018, "2018-02-16"],
  [2019, "2019-02-05"],
  [2020, "2020-01-25"],
  [2021, "2021-02-12"],
  [2022, "2022-02-01"],
  [2023, "2023-01-22"],
  [2024, "2024-02-10"],
  [2025, "2025-01-29"],
  [2026, "2026-02-17"],
  [2027, "2027-02-06"],
  [2028, "2028-01-26"],
  [2029, "2029-02-13"],
  [2030, "2030-02-03"],
];

// ---------------------------------------------------------------------------------------
// The independent check: the instant of a new moon by Meeus, "Astronomical Algorithms"
// (2nd ed., 1998), ch. 49: the mean phase (eq. 49.1) plus the periodic terms for a new moon
// and the 14 planetary arguments. Meeus states the result is within a few seconds of the
// ELP-2000/82 theory for 1980–2020 (max ~17 s). Coefficients typed from the book.

const RAD = Math.PI / 180;
const sin = (deg: number): number => Math.sin(deg * RAD);

/** Julian Ephemeris Day of the new moon of lunation k (k = 0: 6 January 2000). */
function meeusNewMoon(k: number): number {
  const T = k / 1236.85;
  const T2 = T * T;
  const T3 = T2 * T;
  const T4 = T3 * T;
  const jde = 2451550.09766 + 29.530588861 * k + 0.00015437 * T2 - 0.00000015 * T3 + 0.00000000073 * T4;
  const E = 1 - 0.002516 * T - 0.0000074 * T2;
  const M = 2.5534 + 29.1053567 * k - 0.0000014 * T2 - 0.00000011 * T3;
  const Mp = 201.5643 + 385.81693528 * k + 0.0107582 * T2 + 0.00001238 * T3 - 0.000000058 * T4;
  const F = 160.7108 + 390.67050284 * k - 0.0016118 * T2 - 0.00000227 * T3 + 0.000000011 * T4;
  const Om = 124.7746 - 1.56375588 * k + 0.0020672 * T2 + 0.00000215 * T3;
  const periodic =
    -0.4072 * sin(Mp) +
    0.17241 * E * sin(M) +
    0.01608 * sin(2 * Mp) +
    0.01039 * sin(2 * F) +
    0.00739 * E * sin(Mp - M) -
    0.00514 * E * sin(Mp + M) +
    0.00208 * E * E * sin(2 * M) -
    0.00111 * sin(Mp - 2 * F) -
    0.00057 * sin(Mp + 2 * F) +
    0.00056 * E * sin(2 * Mp + M) -
    0.00042 * sin(3 * Mp) +
    0.00042 * E * sin(M + 2 * F) +
    0.00038 * E * sin(M - 2 * F) -
    0.00024 * E * sin(2 * Mp - M) -
    0.00017 * sin(Om) -
    0.00007 * sin(Mp + 2 * M) +
    0.00004 * sin(2 * Mp - 2 * F) +
    0.00004 * sin(3 * M) +
    0.00003 * sin(Mp + M - 2 * F) +
    0.00003 * sin(2 * Mp + 2 * F) -
    0.00003 * sin(Mp + M + 2 * F) +
    0.00003 * sin(Mp - M + 2 * F) -
    0.00002 * sin(Mp - M - 2 * F) -
    0.00002 * sin(3 * Mp + M) +
    0.00002 * sin(4 * Mp);
  const planetary: [number, number, number][] = [
    [299.77, 0.107408, 0.000325],
    [251.88, 0.016321, 0.000165],
    [251.83, 26.651886, 0.000164],
    [349.42, 36.412478, 0.000126],
    [84.66, 18.206239, 0.00011],
    [141.74, 53.303771, 0.000062],
    [207.14, 2.453732, 0.00006],
    [154.84, 7.30686, 0.000056],
    [34.52, 27.261239, 0.000047],
    [207.19, 0.121824, 0.000042],
    [291.34, 1.844379, 0.00004],
    [161.72, 24.198154, 0.000037],
    [239.56, 25.513099, 0.000035],
    [331.55, 3.592518, 0.000023],
  ];
  let extra = 0;
  planetary.forEach(([a, b, w], i) => {
    extra += w * sin(a + b * k - (i === 0 ? 0.009173 * T2 : 0));
  });
  return jde + periodic + extra;
}

/**
 * ΔT = TD − UT in seconds: the polynomial fits of Espenak & Meeus (NASA, "Five Millennium
 * Canon of Solar Eclipses", 2006), typed from memory. They are within a few seconds of the
 * observed ΔT through 2025; their uncertainty grows to about a minute by 2100.
 */
function deltaT(y: number): number {
  if (y < 1920) {
    const t = y - 1900;
    return -2.79 + 1.494119 * t - 0.0598939 * t ** 2 + 0.0061966 * t ** 3 - 0.000197 * t ** 4;
  }
  if (y < 1941) {
    const t = y - 1920;
    return 21.2 + 0.84493 * t - 0.0761 * t ** 2 + 0.0020936 * t ** 3;
  }
  if (y < 1961) {
    const t = y - 1950;
    return 29.07 + 0.407 * t - t ** 2 / 233 + t ** 3 / 2547;
  }
  if (y < 1986) {
    const t = y - 1975;
    return 45.45 + 1.067 * t - t ** 2 / 260 - t ** 3 / 718;
  }
  if (y < 2005) {
    const t = y - 2000;
    return 63.86 + 0.3345 * t - 0.060374 * t ** 2 + 0.0017275 * t ** 3 + 0.000651814 * t ** 4 + 0.00002373599 * t ** 5;
  }
  if (y < 2050) {
    const t = y - 2000;
    return 62.92 + 0.32217 * t + 0.005589 * t ** 2;
  }
  return -20 + 32 * ((y - 1820) / 100) ** 2 - 0.5628 * (2150 - y);
}

const DAY_MS = 86_400_000;
const JD_UNIX_EPOCH = 2440587.5;

/**
 * China's civil zone in hours: UTC+8 from 1929; before, the calendar was reckoned in Beijing
 * mean solar time, longitude 116°25′ E = UTC+7h45m40s.
 */
function chinaOffsetHours(year: number): number {
  return year >= 1929 ? 8 : 7 + 45 / 60 + 40 / 3600;
}

/** The new moon nearest a day: its local calendar day (ms) and minutes from local midnight. */
function newMoonNear(dayMs: number, year: number): { localDay: number; minutesFromMidnight: number } {
  const jd = dayMs / DAY_MS + JD_UNIX_EPOCH;
  const k = Math.round((jd - 2451550.09766) / 29.530588861);
  const jdUt = meeusNewMoon(k) - deltaT(year + 0.1) / 86400;
  const localMs = (jdUt - JD_UNIX_EPOCH) * DAY_MS + chinaOffsetHours(year) * 3_600_000;
  const localDay = Math.floor(localMs / DAY_MS) * DAY_MS;
  const frac = (localMs - localDay) / DAY_MS;
  return { localDay, minutesFromMidnight: Math.min(frac, 1 - frac) * 1440 };
}

const iso = (d: Date): string => d.toISOString().slice(0, 10);

describe("Meeus new moon (the outside check itself)", () => {
  it("reproduces Meeus' worked example 49.a", () => {
    // Example 49.a: the new moon of February 1977, k = −283, JDE = 2443192.65118
    // (1977 Feb 18, 3h37m42s TD). Five decimals of a day are 0.9 s; we ask for 1e-5 d.
    expect(Math.abs(meeusNewMoon(-283) - 2443192.65118)).toBeLessThan(1e-5);
  });
});

describe("lunarNewYear", () => {
  it.each(KNOWN)("%i is %s", (year, date) => {
    const got = lunarNewYear(year);
    expect(iso(got)).toBe(date);
    expect(got.getUTCHours() + got.getUTCMinutes() + got.getUTCSeconds() + got.getUTCMilliseconds()).toBe(0);
  });

  it("gives, for 2010–2030, the day of a Meeus new moon in China's zone (the second source)", () => {
    for (const [year, date] of KNOWN) {
      const dayMs = Date.parse(`${date}T00:00:00Z`);
      const nm = newMoonNear(dayMs, year);
      expect(iso(new Date(nm.localDay))).toBe(date);
    }
  });

  it("agrees with the Meeus new moon in every year 1900–2100 and falls on 21 Jan – 20 Feb", () => {
    for (let year = 1900; year <= 2100; year++) {
      const d = lunarNewYear(year);
      expect(d.getUTCFullYear()).toBe(year);
      const start = Date.UTC(year, 0, 21);
      expect(d.getTime()).toBeGreaterThanOrEqual(start);
      expect(d.getTime()).toBeLessThanOrEqual(Date.UTC(year, 1, 20));
      const nm = newMoonNear(d.getTime(), year);
      // The comparison decides the day only if the new moon is clear of midnight by more
      // than the check's own error (Meeus' terms: < 20 s; ΔT extrapolated to 2100: ~1 min).
      // The closest in 1900–2100 is 2027, 4.0 minutes before midnight.
      expect(nm.minutesFromMidnight).toBeGreaterThan(2);
      expect(`${year}: ${iso(new Date(nm.localDay))}`).toBe(`${year}: ${iso(d)}`);
    }
  });

  it("rejects years outside 1900–2100 and non-integers", () => {
    expect(() => lunarNewYear(1899)).toThrow(/1900–2100/);
    expect(() => lunarNewYear(2101)).toThrow(/1900–2100/);
    expect(() => lunarNewYear(2024.5)).toThrow(/1900–2100/);
  });

  it("caches per year without letting a caller change the cached day", () => {
    const a = lunarNewYear(2024);
    a.setUTCDate(1);
    expect(iso(lunarNewYear(2024))).toBe("2024-02-10");
    expect(lunarNewYear(2024)).not.toBe(lunarNewYear(2024));
  });

  it("says so plainly when the platform has no Chinese calendar", () => {
    // A reduced-ICU platform silently falls back to the Gregorian calendar; imitate it.
    const Original = Intl.DateTimeFormat;
    const spy = jest
      .spyOn(Intl, "DateTimeFormat")
      .mockImplementation((_locales, options) => new Original("en", options));
    try {
      jest.isolateModules(() => {
        const fresh = require("../../../src/core/series/lunar") as typeof import("../../../src/core/series/lunar");
        expect(() => fresh.lunarNewYear(2024)).toThrow(/no Chinese calendar/);
        expect(() => fresh.lunarNewYear(2027)).toThrow(/no Chinese calendar/);
      });
    } finally {
      spy.mockRestore();
    }
  });
});
