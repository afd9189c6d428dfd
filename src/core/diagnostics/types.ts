/**
 * The shape every diagnostic test returns, and its rendering as a report table. A test
 * states its null hypothesis, the statistic, a p-value (or where it lies when only a table
 * bounds it), the lags or parameters it used, and a one-line verdict at a stated level.
 */
import type { Cell, ReportTable } from "../report";
import { table } from "../report";

export interface TestResult {
  /** Published name with its variant, e.g. "ADF (constant)", "KPSS (trend)", "BDS m=3". */
  test: string;
  /** What a rejection rejects, in words, e.g. "a unit root (the series wanders)". */
  nullHypothesis: string;
  statistic: number;
  /** Null when the method gives only critical values. */
  pValue: number | null;
  /**
   * When the p-value is only known to lie outside a table ("p < 0.01" or "p > 0.10"), the
   * side; pValue then holds the table's edge.
   */
  pValueBound?: "below" | "above";
  /** Lag order or embedding dimension used, when the test has one. */
  lags?: number;
  /** Other settings and side results, e.g. { "AR order": 3, "chosen by": "AIC" }. */
  parameters: Record<string, number | string>;
  /** Critical values keyed by level in percent, e.g. { "1%": -3.43, "5%": -2.86, "10%": -2.57 }. */
  criticalValues?: Record<string, number>;
  /** Significance level of the verdict, as a fraction (0.05). */
  level: number;
  /** True when the null is rejected at `level`. */
  rejected: boolean;
  /** One plain sentence a desk analyst can read, e.g. "No sign of nonlinearity at the 5% level." */
  verdict: string;
}

/** The default significance level of verdicts. */
export const DEFAULT_LEVEL = 0.05;

/** "5%" for 0.05. */
export function levelText(level: number): string {
  return `${Number((level * 100).toFixed(4))}%`;
}

/** p-value as shown: "<0.01", ">0.1" for bounded ones, else the number. */
export function pValueCell(r: TestResult): Cell {
  if (r.pValue === null) return null;
  if (r.pValueBound === "below") return `<${r.pValue}`;
  if (r.pValueBound === "above") return `>${r.pValue}`;
  return r.pValue;
}

function parametersText(p: Record<string, number | string>): string {
  return Object.entries(p)
    .map(([k, v]) => `${k} ${typeof v === "number" ? Number(v.toPrecision(6)) : v}`)
    .join("; ");
}

/** Renders test results as one report table (one row per test). */
export function testTable(title: string, results: TestResult[], notes: string[] = []): ReportTable {
  const rows: Cell[][] = results.map((r) => [
    r.test,
    r.statistic,
    pValueCell(r),
    r.lags ?? null,
    r.criticalValues?.["5%"] ?? null,
    parametersText(r.parameters) || null,
    r.verdict,
  ]);
  return table(title, ["Test", "Statistic", "p-value", "Lags", "5% critical value", "Settings", "Verdict"], rows, notes);
}
