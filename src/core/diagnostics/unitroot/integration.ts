/**
 * One summary of the unit-root evidence for a rate series: ADF and Phillips–Perron (null: a
 * unit root) beside KPSS (null: stationarity), run on levels, on logs when every week is
 * positive, and on the first differences of the logs (of the levels when logs are skipped).
 * Levels and logs are tested with a constant and trend, differences with a constant only,
 * since a trend in the level is a constant in the change.
 *
 * The two nulls are opposite, so the tests are read together (the "confirmatory analysis"
 * of KPSS 1992, section 5): a transform is judged stationary when ADF and PP both reject a
 * unit root and KPSS does not reject stationarity, a unit root when ADF and PP both fail to
 * reject and KPSS rejects, and mixed otherwise. The order of integration is then:
 *   0 — the tested levels (logs when available) are stationary;
 *   1 — they are not, but their first differences are, or lean that way (ADF or PP rejects);
 *   2 — the first differences still look like a unit root.
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
  /** ADF lag rule; default "aic". */
  lagRule?: LagRule;
}

export type Evidence = "stationary" | "unit root" | "mixed";

export interface TransformResults {
  /** What was tested, as the rows name it: "levels", "log levels", "weekly change of logs". */
  name: string;
  adf: TestResult;
  pp: TestResult;
  kpss: TestResult;
  evidence: Evidence;
}

export interface UnitRootSummary {
  order: 0 | 1 | 2;
  /** The sentence behind `order`. */
  reasoning: string;
  usedLogs: boolean;
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
  const a = adf(y, { regression: trend ? "ct" : "c", lagRule: options.lagRule ?? "aic", level, subject });
  const p = pp(y, { regression: trend ? "ct" : "c", level, subject });
  const k = kpss(y, { regression: trend ? "ct" : "c", level, subject });
  return { name, adf: a, pp: p, kpss: k, evidence: classify(a, p, k) };
}

/** "ADF and PP fail to reject a unit root and KPSS rejects stationarity in log levels". */
function describe(r: TransformResults): string {
  let ur: string;
  if (r.adf.rejected && r.pp.rejected) ur = "ADF and PP reject a unit root";
  else if (!r.adf.rejected && !r.pp.rejected) ur = "ADF and PP fail to reject a unit root";
  else if (r.adf.rejected) ur = "ADF rejects a unit root but PP does not";
  else ur = "PP rejects a unit root but ADF does not";
  const kp = r.kpss.rejected ? "KPSS rejects stationarity" : "KPSS does not reject stationarity";
  return `${ur} and ${kp} in ${r.name}`;
}

function conclude(base: TransformResults, diff: TransformResults, level: number): { order: 0 | 1 | 2; reasoning: string } {
  const lv = levelText(level);
  if (base.evidence === "stationary") {
    return { order: 0, reasoning: `At ${lv}, ${describe(base)}, so the series is stationary without differencing: I(0).` };
  }
  const lead = `At ${lv}, ${describe(base)}${base.evidence === "mixed" ? " (mixed evidence)" : ""}`;
  if (diff.evidence === "stationary") {
    return { order: 1, reasoning: `${lead}, while ${describe(diff)}: one difference makes it stationary, I(1).` };
  }
  if (diff.evidence === "mixed" && (diff.adf.rejected || diff.pp.rejected)) {
    return {
      order: 1,
      reasoning: `${lead}; ${describe(diff)}, so the differences lean towards stationarity: I(1), with less confidence.`,
    };
  }
  return {
    order: 2,
    reasoning: `${lead}, and ${describe(diff)}: even the weekly change behaves like a random walk, so the evidence points to I(2).`,
  };
}

function renamed(r: TestResult, where: string): TestResult {
  return { ...r, test: `${r.test} — ${where}` };
}

/** Runs ADF, PP and KPSS on levels, logs and differences and states the order of integration. */
export function unitRootSummary(y: ArrayLike<number>, options: UnitRootSummaryOptions = {}): UnitRootSummary {
  const level = options.level ?? DEFAULT_LEVEL;
  const x = Float64Array.from(y);
  const notes: string[] = [];
  const levels = runSet(x, "levels", "the rate in levels", true, options);

  let allPositive = true;
  for (let i = 0; i < x.length; i++) if (!(x[i] > 0)) allPositive = false;
  let logs: TransformResults | null = null;
  let base = levels;
  let diffSource = x;
  if (allPositive) {
    const lx = x.map(Math.log);
    logs = runSet(lx, "log levels", "the log rate", true, options);
    base = logs;
    diffSource = lx;
  } else {
    notes.push("Logs were skipped because the rate has zero or negative weeks; differences are of the levels.");
  }
  const d = new Float64Array(diffSource.length - 1);
  for (let t = 0; t < d.length; t++) d[t] = diffSource[t + 1] - diffSource[t];
  const differences = runSet(
    d,
    allPositive ? "weekly changes of the log rate" : "weekly changes of the rate",
    allPositive ? "the weekly change in the log rate" : "the weekly change in the rate",
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
    "ADF p-values are MacKinnon (1994) asymptotic values; critical values are MacKinnon (2010) at the regression's length. " +
      "KPSS p-values are interpolated in the KPSS (1992) table and bounded outside it.",
  );
  const { order, reasoning } = conclude(base, differences, level);
  const tests = testTable("Unit-root and stationarity tests", rows, notes);
  const conclusion = table(
    "Order of integration the evidence supports",
    ["Series judged", "Order of integration", "Reasoning"],
    [[base === logs ? "log rate" : "rate", order, reasoning]],
    [`Verdicts at the ${levelText(level)} level.`],
  );
  return { order, reasoning, usedLogs: allPositive, levels, logs, differences, tables: [tests, conclusion] };
}
