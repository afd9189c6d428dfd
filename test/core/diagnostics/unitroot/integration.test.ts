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
    expect(s.reasoning).toBe(
      "At 5%, ADF and PP fail to reject a unit root and KPSS rejects stationarity in log levels, while ADF and PP " +
        "reject a unit root and KPSS does not reject stationarity in weekly changes of the log rate: one difference " +
        "makes it stationary, I(1).",
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
    expect(conclusion.rows).toEqual([["log rate", 1, s.reasoning]]);
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
  });
});
