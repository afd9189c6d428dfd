import { unitRootSummary } from "../../../../src/core/diagnostics/unitroot/integration";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { loadFixture } from "../../../fixtures";

const series = loadFixture<Record<string, number[]>>("unitroot_series.json");

type Kind = "random walk in logs" | "stationary AR(1)" | "I(2) in logs";

/** Seeded MT19937 series of 300 weeks with known order of integration. */
function simulate(kind: Kind, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(300);
  let a = 0;
  let b = 0;
  for (let t = 0; t < y.length; t++) {
    const e = rng.normal();
    if (kind === "random walk in logs") {
      a += 0.02 * e;
      y[t] = Math.exp(7 + a);
    } else if (kind === "stationary AR(1)") {
      a = 0.5 * a + e;
      y[t] = 1000 + 20 * a;
    } else {
      b += 0.002 * e;
      a += b;
      y[t] = Math.exp(7 + a);
    }
  }
  return y;
}

describe("unitRootSummary on simulated series with known order (seeded)", () => {
  // Each truth is checked on 20 fixed seeds. A random walk is called I(0) when ADF and PP
  // both reject (each at 5% size) and KPSS misses; over 100 seeds this happened 4 times
  // (4%), so at least 17 of 20 correct (85%) leaves room for that rate while a wrong case,
  // sign or table would fail most seeds.
  const cases: [Kind, number][] = [
    ["random walk in logs", 1],
    ["stationary AR(1)", 0],
    ["I(2) in logs", 2],
  ];
  it.each(cases)("%s → I(%d) in at least 17 of 20 seeds", (kind, order) => {
    let hits = 0;
    for (let s = 0; s < 20; s++) if (unitRootSummary(simulate(kind, 1000 + s)).order === order) hits++;
    expect(hits).toBeGreaterThanOrEqual(17);
  });
});

describe("unitRootSummary report tables", () => {
  // Log real GDP (statsmodels macrodata, 203 quarters) is the textbook I(1) series.
  const s = unitRootSummary(series.lgdp);

  it("finds log real GDP I(1), with ADF/PP/KPSS agreeing on levels and on differences", () => {
    expect(s.order).toBe(1);
    expect(s.logs?.evidence).toBe("unit root");
    expect(s.differences.evidence).toBe("stationary");
    expect(s.levels.evidence).toBe("unit root");
    expect(s.conclusive).toBe(true);
    expect(s.scale).toBe("logs");
    expect(s.reasoning).toBe(
      "At 5%, ADF and PP fail to reject a unit root and KPSS rejects stationarity in levels and log levels, while ADF " +
        "and PP reject a unit root and KPSS does not reject stationarity in weekly changes of the log rate: one " +
        "difference makes it stationary, I(1).",
    );
  });

  it("lists nine tests (three on each of levels, logs and changes) and one conclusion row", () => {
    const [tests, conclusion] = s.tables;
    expect(tests.rows).toHaveLength(9);
    expect(tests.rows.map((r) => r[0])).toEqual([
      "ADF (constant + trend) — levels",
      "PP Z(t) (constant + trend) — levels",
      "KPSS (trend) — levels",
      "ADF (constant + trend) — log levels",
      "PP Z(t) (constant + trend) — log levels",
      "KPSS (trend) — log levels",
      "ADF (constant) — weekly changes of the log rate",
      "PP Z(t) (constant) — weekly changes of the log rate",
      "KPSS (level) — weekly changes of the log rate",
    ]);
    expect(conclusion.title).toBe("Order of integration the evidence supports");
    expect(conclusion.columns).toEqual(["Series judged", "Order of integration", "Evidence", "Reasoning"]);
    expect(conclusion.rows).toEqual([["log rate", 1, "conclusive: the tests agree", s.reasoning]]);
    expect(s.logs?.adf.verdict).toBe("The log rate behaves like a random walk (no evidence against a unit root at 5%).");
  });

  it("skips logs when a week is zero or negative, and says so", () => {
    const y = Float64Array.from(series.sunspots); // contains zeros
    const r = unitRootSummary(y);
    expect(r.usedLogs).toBe(false);
    expect(r.logs).toBeNull();
    expect(r.tables[0].rows).toHaveLength(6);
    expect(r.tables[0].notes[0]).toMatch(/Logs were skipped because the rate has zero or negative weeks/);
    expect(r.tables[1].rows[0][0]).toBe("rate");
    expect(r.scale).toBe("levels");
  });
});

/** y = 1000 + 3t + 20·AR(0.5), 260 weeks: trend-stationary in levels, so curved in logs. */
function trendInLevels(seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(260);
  let a = 0;
  for (let t = 0; t < y.length; t++) {
    a = 0.5 * a + rng.normal();
    y[t] = 1000 + 3 * t + 20 * a;
  }
  return y;
}

/** The annual factor exp(0.15·sin(2πt/52.18)) of `seasonalAr`. */
function seasonFactor(t: number): number {
  return Math.exp(0.15 * Math.sin((2 * Math.PI * t) / 52.18));
}

/** y = 2000·exp(0.15·sin(2πt/52.18) + 0.03·AR(0.5)), 260 weeks: stationary with a smooth annual cycle. */
function seasonalAr(seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(260);
  let a = 0;
  for (let t = 0; t < y.length; t++) {
    a = 0.5 * a + rng.normal();
    y[t] = 2000 * seasonFactor(t) * Math.exp(0.03 * a);
  }
  return y;
}

describe("unitRootSummary weighs levels and logs", () => {
  // Seeds 0–39. The levels are trend-stationary by construction; ADF and PP reject with power
  // ≈ 1 (φ = 0.5, 260 weeks) and KPSS falsely rejects at its 5% size, so about 38 of 40 should
  // read I(0) on levels (38 did when the test was written); 35 is that mean less 2 sd. Judged
  // on logs alone, the curvature made every seed I(1).
  const runs = Array.from({ length: 40 }, (_, s) => unitRootSummary(trendInLevels(s)));

  it("a straight trend in levels → I(0) on levels in at least 35 of 40 seeds", () => {
    const hits = runs.filter((u) => u.order === 0 && u.scale === "levels");
    expect(hits.length).toBeGreaterThanOrEqual(35);
    for (const u of hits) {
      expect(u.reasoning).toMatch(/^At 5%, ADF and PP reject a unit root and KPSS does not reject stationarity in levels, so the rate is stationary in levels without differencing: I\(0\)\./);
      expect(u.tables[1].rows[0][0]).toBe("rate");
    }
  });

  it("when the log scale disagrees, the sentence says so", () => {
    const u = runs.find((r) => r.order === 0 && r.logs?.evidence === "mixed");
    expect(u).toBeDefined();
    expect(u?.conclusive).toBe(true);
    expect(u?.reasoning).toMatch(
      /I\(0\)\. The scales disagree: in log levels, .+, which can happen because a trend that is straight on one scale is curved on the other and the tests fit a straight one\.$/,
    );
  });

  it("a stationary AR(1) around a level is I(0) on both scales, conclusively", () => {
    const u = unitRootSummary(simulate("stationary AR(1)", 1000));
    expect(u.order).toBe(0);
    expect(u.scale).toBe("levels and logs");
    expect(u.conclusive).toBe(true);
    expect(u.reasoning).toBe(
      "At 5%, ADF and PP reject a unit root and KPSS does not reject stationarity in both levels and log levels, " +
        "so the rate is stationary without differencing: I(0).",
    );
  });
});

describe("unitRootSummary says when the tests disagree", () => {
  it("the Nile (statsmodels dataset), AIC lags: ADF and PP reject but KPSS rejects too → inconclusive, treated as I(1)", () => {
    const u = unitRootSummary(series.nile, { lagRule: "aic" });
    expect(u.order).toBe(1);
    expect(u.conclusive).toBe(false);
    expect(u.levels.evidence).toBe("mixed");
    expect(u.reasoning).toBe(
      "I(0) or I(1): the tests disagree at 5% (ADF and PP reject a unit root and KPSS rejects stationarity in levels; " +
        "ADF and PP reject a unit root and KPSS rejects stationarity in log levels), while ADF and PP reject a unit root " +
        "and KPSS does not reject stationarity in weekly changes of the log rate; treated as I(1) for modelling, which " +
        "is the cautious choice.",
    );
    expect(u.tables[1].rows).toEqual([["log rate", 1, "inconclusive: the tests disagree", u.reasoning]]);
  });

  it("the Nile, default MAIC lags: PP rejects but ADF does not on either scale → still inconclusive, treated as I(1)", () => {
    // With a trend, MAIC picks 12 lags in levels (11 in logs) where AIC picks 1: the
    // τ_T(k) penalty of Ng & Perron (2001) charges the large |γ̂| of short lags, and at 12
    // lags τ = −1.78 against a 5% critical value of −3.46. The order and the verdict on the
    // changes do not move; only the ADF half of the sentence on the scales does.
    const u = unitRootSummary(series.nile);
    expect(u.levels.adf.lags).toBe(12);
    expect(u.logs?.adf.lags).toBe(11);
    expect(u.order).toBe(1);
    expect(u.conclusive).toBe(false);
    expect(u.levels.evidence).toBe("mixed");
    expect(u.reasoning).toBe(
      "I(0) or I(1): the tests disagree at 5% (PP rejects a unit root but ADF does not and KPSS rejects stationarity in levels; " +
        "PP rejects a unit root but ADF does not and KPSS rejects stationarity in log levels), while ADF and PP reject a unit root " +
        "and KPSS does not reject stationarity in weekly changes of the log rate; treated as I(1) for modelling, which " +
        "is the cautious choice.",
    );
  });

  it("a smooth annual cycle left in the rates splits ADF and PP: inconclusive I(1) in at least 36 of 40 seeds", () => {
    // Seeds 0–39: in all 40, when written, ADF rejected a unit root and PP did not on both
    // scales, while the changes were clearly stationary; 36 leaves room for a few seeds where
    // the split resolves.
    let hits = 0;
    for (let s = 0; s < 40; s++) {
      const u = unitRootSummary(seasonalAr(s));
      if (u.order === 1 && !u.conclusive && /^I\(0\) or I\(1\): the tests disagree/.test(u.reasoning)) hits++;
    }
    expect(hits).toBeGreaterThanOrEqual(36);
  });
});

describe("unitRootSummary on a caller's seasonally adjusted rates", () => {
  const note = "Tests run on the rates divided by their exact annual factor.";

  it("the exactly deseasonalised repro is I(0) in at least 34 of 40 seeds (the raw rates: none)", () => {
    // Dividing by exp(0.15·sin(2πt/52.18)) leaves 2000·exp(0.03·AR(0.5)), stationary by
    // construction. 38 of 40 were I(0) when written; each seed needs ADF and PP to reject on
    // a scale (power ≈ 1) and KPSS not to (5% size on each scale), so 34 is generous.
    let adjustedHits = 0;
    let rawHits = 0;
    for (let s = 0; s < 40; s++) {
      const y = seasonalAr(s);
      const z = y.map((v, t) => v / seasonFactor(t));
      if (unitRootSummary(y, { adjusted: { values: z, note } }).order === 0) adjustedHits++;
      if (unitRootSummary(y).order === 0) rawHits++;
    }
    expect(adjustedHits).toBeGreaterThanOrEqual(34);
    expect(rawHits).toBe(0);
  });

  it("names the adjusted series in rows and the conclusion, and puts the caller's note first in both tables", () => {
    const y = seasonalAr(0);
    const z = y.map((v, t) => v / seasonFactor(t));
    const u = unitRootSummary(y, { adjusted: { values: z, note } });
    expect(u.adjusted).toBe(true);
    expect(u.usedLogs).toBe(true);
    const [tests, conclusion] = u.tables;
    expect(tests.notes[0]).toBe(note);
    expect(conclusion.notes[0]).toBe(note);
    expect(tests.rows.map((r) => r[0])).toEqual([
      "ADF (constant + trend) — adjusted levels",
      "PP Z(t) (constant + trend) — adjusted levels",
      "KPSS (trend) — adjusted levels",
      "ADF (constant + trend) — adjusted log levels",
      "PP Z(t) (constant + trend) — adjusted log levels",
      "KPSS (trend) — adjusted log levels",
      "ADF (constant) — weekly changes of the seasonally adjusted log rate",
      "PP Z(t) (constant) — weekly changes of the seasonally adjusted log rate",
      "KPSS (level) — weekly changes of the seasonally adjusted log rate",
    ]);
    expect(String(conclusion.rows[0][0])).toMatch(/^seasonally adjusted /);
    // The tests ran on the adjusted values, not the raw ones.
    expect(u.levels.adf.statistic).toBe(unitRootSummary(z).levels.adf.statistic);
    expect(u.levels.adf.statistic).not.toBe(unitRootSummary(y).levels.adf.statistic);
  });

  it("refuses an adjusted series of another length", () => {
    const y = seasonalAr(0);
    expect(() => unitRootSummary(y, { adjusted: { values: y.slice(1), note } })).toThrow(/259 weeks for 260 rates/);
  });
});

describe("unitRootSummary table notes", () => {
  it("label the ADF and PP p-values as asymptotic and say the verdict follows the finite-sample critical value", () => {
    const notes = unitRootSummary(series.lgdp).tables[0].notes.join(" ");
    expect(notes).toMatch(/ADF and PP p-values are MacKinnon \(1994\) asymptotic values/);
    expect(notes).toMatch(/verdicts compare the statistic with that finite-sample critical value/);
  });

  it("use the modified AIC of Ng & Perron (2001) for the ADF lags by default, and say so", () => {
    const r = unitRootSummary(series.nile);
    for (const set of [r.levels, r.logs, r.differences]) expect(set?.adf.parameters["lags chosen by"]).toBe("modified AIC (Ng & Perron 2001)");
    expect(r.tables[0].notes.join(" ")).toMatch(/lags chosen by the modified AIC of Ng & Perron \(2001\)/);
  });

  it("let lagRule override the default, and the note follows it", () => {
    const r = unitRootSummary(series.nile, { lagRule: "aic" });
    expect(r.levels.adf.parameters["lags chosen by"]).toBe("AIC");
    const notes = r.tables[0].notes.join(" ");
    expect(notes).toMatch(/ADF lags chosen by the AIC\./);
    expect(notes).not.toMatch(/modified AIC/);
  });
});
