/**
 * One summary of the unit-root evidence for a rate series: ADF and Phillips–Perron (null: a
 * unit root) beside KPSS (null: stationarity), run on levels, on logs when every week is
 * positive, and on the first differences of the logs (of the levels when logs are skipped).
 * Levels and logs are tested with a constant and trend, differences with a constant only,
 * since a trend in the level is a constant in the change. When the caller supplies a
 * seasonally adjusted version of the rates, every test runs on it instead: the ADF and PP
 * regressions have no seasonal terms, and a smooth annual cycle left in the series reads as
 * slow wandering, so a stationary series can look I(1).
 *
 * The two nulls are opposite, so the tests are read together (the "confirmatory analysis"
 * of KPSS 1992, section 5): a transform is judged stationary when ADF and PP both reject a
 * unit root and KPSS does not reject stationarity, a unit root when ADF and PP both fail to
 * reject and KPSS rejects, and mixed otherwise. The order of integration is then:
 *   0 — levels or logs (either scale) are stationary. Both scales are weighed because a
 *       trend that is straight on one is curved on the other, and the tests fit a straight
 *       one; the sentence names the scale and says when the other disagrees;
 *   1 — neither scale is stationary, and the first differences are, or lean that way (ADF
 *       or PP rejects);
 *   2 — the first differences still look like a unit root.
 * The result is conclusive when the tests behind it agree: both scales a clear unit root (or
 * one clearly stationary and the other not a clear unit root) and clear differences. Mixed
 * evidence on the scales with stationary differences gives order 1, the cautious choice
 * (treating an I(0) series as I(1) costs some efficiency; the reverse gives forecast
 * intervals that stop widening while the real uncertainty keeps growing), and the sentence says the tests disagree.
 */
import type { ReportTable } from "../../report";
import { table } from "../../report";
import { DEFAULT_LEVEL, levelText, testTable, type TestResult } from "../types";
import { adf, type LagRule } from "./adf";
import { kpss } from "./kpss";
import { pp } from "./pp";

export interface UnitRootSummaryOptions {
  /** Significance level of every verdict. Default 0.05. */
  level?: number;
  /**
   * ADF lag rule; default "maic", the modified AIC of Ng & Perron (2001), because plain AIC
   * over-rejects a random walk in series as short as a year or two of weeks.
   */
  lagRule?: LagRule;
  /**
   * A seasonally adjusted version of the rates, supplied by the caller: same scale and
   * length, and positive wherever the rates are all positive. When given, every test runs on
   * it instead of the raw rates, and `note` (how it was adjusted) heads both tables' notes.
   */
  adjusted?: { values: Float64Array; note: string };
}

export type Evidence = "stationary" | "unit root" | "mixed";

export interface TransformResults {
  /** What was tested, as the rows name it: "levels", "log levels", "weekly changes of the log rate". */
  name: string;
  adf: TestResult;
  pp: TestResult;
  kpss: TestResult;
  evidence: Evidence;
}

/** The scale `order` was read on: for order 0 the stationary scale(s), else the one differenced. */
export type JudgedScale = "levels" | "logs" | "levels and logs";

export interface UnitRootSummary {
  order: 0 | 1 | 2;
  /** The sentence behind `order`. */
  reasoning: string;
  /**
   * True when the tests behind `order` agree; false when they disagree and `order` is the
   * cautious reading (the sentence then says so).
   */
  conclusive: boolean;
  /** The scale the order was read on. */
  scale: JudgedScale;
  /** Logs were tested (every week positive); the differences are then of the logs. */
  usedLogs: boolean;
  /** The tests ran on the caller's seasonally adjusted rates. */
  adjusted: boolean;
  levels: TransformResults;
  logs: TransformResults | null;
  differences: TransformResults;
  /** [all test rows, the one-row conclusion]. */
  tables: [ReportTable, ReportTable];
}

function classify(a: TestResult, p: TestResult, k: TestResult): Evidence {
  if (a.rejected && p.rejected && !k.rejected) return "stationary";
  if (!a.rejected && !p.rejected && k.rejected) return "unit root";
  return "mixed";
}

function runSet(y: Float64Array, name: string, subject: string, trend: boolean, options: UnitRootSummaryOptions): TransformResults {
  const level = options.level ?? DEFAULT_LEVEL;
  const a = adf(y, { regression: trend ? "ct" : "c", lagRule: options.lagRule ?? "maic", level, subject });
  const p = pp(y, { regression: trend ? "ct" : "c", level, subject });
  const k = kpss(y, { regression: trend ? "ct" : "c", level, subject });
  return { name, adf: a, pp: p, kpss: k, evidence: classify(a, p, k) };
}

/** "ADF and PP fail to reject a unit root and KPSS rejects stationarity". */
function verdicts(r: TransformResults): string {
  let ur: string;
  if (r.adf.rejected && r.pp.rejected) ur = "ADF and PP reject a unit root";
  else if (!r.adf.rejected && !r.pp.rejected) ur = "ADF and PP fail to reject a unit root";
  else if (r.adf.rejected) ur = "ADF rejects a unit root but PP does not";
  else ur = "PP rejects a unit root but ADF does not";
  const kp = r.kpss.rejected ? "KPSS rejects stationarity" : "KPSS does not reject stationarity";
  return `${ur} and ${kp}`;
}

/** "ADF and PP fail to reject a unit root and KPSS rejects stationarity in log levels". */
function describe(r: TransformResults): string {
  return `${verdicts(r)} in ${r.name}`;
}

interface Conclusion {
  order: 0 | 1 | 2;
  reasoning: string;
  conclusive: boolean;
  scale: JudgedScale;
}

/**
 * Reads the three transforms together. `noun` names the series in the sentence ("the rate",
 * "the seasonally adjusted rate").
 */
function conclude(levels: TransformResults, logs: TransformResults | null, diff: TransformResults, level: number, noun: string): Conclusion {
  const lv = levelText(level);
  const scales = logs ? [levels, logs] : [levels];
  const stationary = scales.filter((s) => s.evidence === "stationary");

  if (stationary.length === 2) {
    return {
      order: 0,
      conclusive: true,
      scale: "levels and logs",
      reasoning: `At ${lv}, ${verdicts(levels)} in both ${levels.name} and ${logs?.name}, so ${noun} is stationary without differencing: I(0).`,
    };
  }
  if (stationary.length === 1) {
    const good = stationary[0];
    const other = scales.find((s) => s !== good);
    const scale: JudgedScale = good === levels ? "levels" : "logs";
    const head = `At ${lv}, ${describe(good)}, so ${noun} is stationary in ${good.name} without differencing: I(0).`;
    if (!other) return { order: 0, conclusive: true, scale, reasoning: head };
    // A clear unit root on the other scale is a real contradiction; mixed evidence there is
    // what a trend straight on one scale and curved on the other produces.
    return {
      order: 0,
      conclusive: other.evidence !== "unit root",
      scale,
      reasoning:
        `${head} The scales disagree: in ${other.name}, ${verdicts(other)}, which can happen because a trend ` +
        `that is straight on one scale is curved on the other and the tests fit a straight one.`,
    };
  }

  // Neither scale is stationary; the differences decide between 1 and 2.
  const scale: JudgedScale = logs ? "logs" : "levels";
  const clearUnitRoot = scales.every((s) => s.evidence === "unit root");
  const levelsPhrase = clearUnitRoot
    ? `${verdicts(levels)} in ${scales.map((s) => s.name).join(" and ")}`
    : scales.map(describe).join("; ");
  const diffPhrase = describe(diff);
  const diffLeans = diff.evidence === "mixed" && (diff.adf.rejected || diff.pp.rejected);

  if (diff.evidence === "stationary") {
    if (clearUnitRoot) {
      return {
        order: 1,
        conclusive: true,
        scale,
        reasoning: `At ${lv}, ${levelsPhrase}, while ${diffPhrase}: one difference makes it stationary, I(1).`,
      };
    }
    return {
      order: 1,
      conclusive: false,
      scale,
      reasoning:
        `I(0) or I(1): the tests disagree at ${lv} (${levelsPhrase}), while ${diffPhrase}; ` +
        `treated as I(1) for modelling, which is the cautious choice.`,
    };
  }
  if (diffLeans) {
    return {
      order: 1,
      conclusive: false,
      scale,
      reasoning: clearUnitRoot
        ? `I(1) or I(2): at ${lv}, ${levelsPhrase}, but on the weekly changes the tests disagree (${diffPhrase}); ` +
          `treated as I(1) for modelling, since the changes lean towards stationarity.`
        : `The order is unclear: at ${lv} the tests disagree on ${noun} (${levelsPhrase}) and on its weekly changes ` +
          `(${diffPhrase}); treated as I(1) for modelling, which is the cautious choice.`,
    };
  }
  if (clearUnitRoot && diff.evidence === "unit root") {
    return {
      order: 2,
      conclusive: true,
      scale,
      reasoning: `At ${lv}, ${levelsPhrase}, and ${diffPhrase}: even the weekly change behaves like a random walk, so the evidence points to I(2).`,
    };
  }
  return {
    order: 2,
    conclusive: false,
    scale,
    reasoning:
      `I(1) or I(2): the tests disagree at ${lv} (${levelsPhrase}; ${diffPhrase}); treated as I(2) for modelling, ` +
      `since neither ADF nor PP rejects a unit root in the weekly changes.`,
  };
}

/** The table note naming how the ADF lags were chosen. */
function lagNote(rule: LagRule): string {
  if (rule === "maic") return "ADF lags chosen by the modified AIC of Ng & Perron (2001).";
  if (rule === "tstat") return "ADF lags chosen by the t-statistic on the last lag (general-to-specific).";
  return `ADF lags chosen by the ${rule.toUpperCase()}.`;
}

function renamed(r: TestResult, where: string): TestResult {
  return { ...r, test: `${r.test} — ${where}` };
}

function allPositive(x: Float64Array): boolean {
  for (let i = 0; i < x.length; i++) if (!(x[i] > 0)) return false;
  return true;
}

/** Runs ADF, PP and KPSS on levels, logs and differences and states the order of integration. */
export function unitRootSummary(y: ArrayLike<number>, options: UnitRootSummaryOptions = {}): UnitRootSummary {
  const level = options.level ?? DEFAULT_LEVEL;
  const raw = Float64Array.from(y);
  const adjusted = options.adjusted;
  if (adjusted && adjusted.values.length !== raw.length) {
    // The caller builds the adjusted series from these rates; a length mismatch is its bug.
    throw new Error(`unitRootSummary: the adjusted series has ${adjusted.values.length} weeks for ${raw.length} rates`);
  }
  const x = adjusted ? Float64Array.from(adjusted.values) : raw;
  const positive = allPositive(x);
  if (adjusted && allPositive(raw) && !positive) {
    throw new Error("unitRootSummary: the adjusted series has a zero or negative week where every rate is positive");
  }
  const sa = adjusted ? "seasonally adjusted " : "";
  const notes: string[] = adjusted ? [adjusted.note] : [];
  const levels = runSet(x, adjusted ? "adjusted levels" : "levels", `the ${sa}rate in levels`, true, options);

  let logs: TransformResults | null = null;
  let diffSource = x;
  if (positive) {
    const lx = x.map(Math.log);
    logs = runSet(lx, adjusted ? "adjusted log levels" : "log levels", `the ${sa}log rate`, true, options);
    diffSource = lx;
  } else {
    notes.push("Logs were skipped because the rate has zero or negative weeks; differences are of the levels.");
  }
  const d = new Float64Array(diffSource.length - 1);
  for (let t = 0; t < d.length; t++) d[t] = diffSource[t + 1] - diffSource[t];
  const differences = runSet(
    d,
    `weekly changes of the ${sa}${positive ? "log rate" : "rate"}`,
    `the weekly change in the ${sa}${positive ? "log rate" : "rate"}`,
    false,
    options,
  );

  const rows: TestResult[] = [];
  for (const set of [levels, logs, differences]) {
    if (!set) continue;
    rows.push(renamed(set.adf, set.name), renamed(set.pp, set.name), renamed(set.kpss, set.name));
  }
  notes.push(
    "ADF and PP test the null of a unit root (a rejection says the series returns to a mean or trend); " +
      "KPSS tests the null of stationarity (a rejection says it wanders). Levels and logs include a trend; changes a constant.",
    "ADF and PP p-values are MacKinnon (1994) asymptotic values; critical values are MacKinnon (2010) at the regression's length. " +
      "At 1%, 5% or 10% their verdicts compare the statistic with that finite-sample critical value, so in a short series a " +
      "p-value just below the level can sit beside \"not rejected\". " +
      "KPSS p-values are interpolated in the KPSS (1992) table and bounded outside it.",
    lagNote(options.lagRule ?? "maic"),
  );
  const c = conclude(levels, logs, differences, level, `the ${sa}rate`);
  const tests = testTable("Unit-root and stationarity tests", rows, notes);
  const judged = c.scale === "levels" ? "rate" : c.scale === "logs" ? "log rate" : "rate and log rate";
  const conclusion = table(
    "Order of integration the evidence supports",
    ["Series judged", "Order of integration", "Evidence", "Reasoning"],
    [[`${sa}${judged}`, c.order, c.conclusive ? "conclusive: the tests agree" : "inconclusive: the tests disagree", c.reasoning]],
    [...(adjusted ? [adjusted.note] : []), `Verdicts at the ${levelText(level)} level.`],
  );
  return {
    order: c.order,
    reasoning: c.reasoning,
    conclusive: c.conclusive,
    scale: c.scale,
    usedLogs: positive,
    adjusted: adjusted !== undefined,
    levels,
    logs,
    differences,
    tables: [tests, conclusion],
  };
}
