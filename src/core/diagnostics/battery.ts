/**
 * The checks that justify a model, run together for analyse(): stationarity (ADF, PP, KPSS
 * on levels, logs and weekly changes, with the order of integration), seasonality (STL
 * strength, ISO-week factors, factors around the lunar new year and of ISO week 53),
 * nonlinearity (on the series made stationary as the stationarity checks conclude), and the
 * chosen model's residuals. A check that the data cannot support (too short, constant) is
 * skipped with its sentence; the others still run.
 */
import type { ReportTable } from "../report";
import { isInputError } from "../series/errors";
import type { WeeklySeries } from "../series/types";
import { nonlinearitySummary } from "./nonlinearity";
import { residualChecks } from "./residuals";
import { seasonalityAnalysis, weekYearTable, type FactorKind } from "./seasonality";
import { unitRootSummary } from "./unitroot/integration";

export interface CheckTables {
  stationarity?: ReportTable;
  integration?: ReportTable;
  seasonStrength?: ReportTable;
  weekFactors?: ReportTable;
  /** Factors counted from the lunar new year, beside the ISO-week ones of the same weeks. */
  holidayFactors?: ReportTable;
  /** ISO week 53 on its own (folded into week 52 in weekFactors), one row per 53-week ISO year through the coming one. */
  week53?: ReportTable;
  /** Mean rate by ISO week (rows) and ISO year (columns): the season's picture (radar chart). */
  weekYear?: ReportTable;
  nonlinearity?: ReportTable;
  residualTests?: ReportTable;
  correlogram?: ReportTable;
}

export interface ChecksResult {
  tables: CheckTables;
  /** One sentence per check that could not run, saying why. */
  skipped: string[];
}

export interface ModelResiduals {
  residuals: Float64Array;
  /** ARMA coefficients estimated (the Ljung–Box degrees-of-freedom adjustment). */
  armaDf: number;
  label: string;
}

/**
 * Runs `fn`; an InputError becomes a skip sentence. Any other failure (an optimiser or a
 * special function giving up on odd data) is an internal one: it is reported as a plain
 * sentence too, so that one check cannot take the outlook and the other checks with it.
 */
function attempt(what: string, skipped: string[], fn: () => void): void {
  try {
    fn();
  } catch (e) {
    skipped.push(
      isInputError(e)
        ? `${what} not run: ${e.message}`
        : `${what} not run: they could not be computed for these rates (an internal step failed); the other results are unaffected.`,
    );
  }
}

/** The series differenced `times` times, of log rates when `logs`. */
function differenced(y: Float64Array, logs: boolean, times: number): Float64Array {
  let d: Float64Array = logs ? Float64Array.from(y, Math.log) : Float64Array.from(y);
  for (let k = 0; k < times; k++) {
    const next = new Float64Array(d.length - 1);
    for (let t = 1; t < d.length; t++) next[t - 1] = d[t] - d[t - 1];
    d = next;
  }
  return d;
}

export function runChecks(series: WeeklySeries, model?: ModelResiduals, settings: { seasonKind?: FactorKind } = {}): ChecksResult {
  const tables: CheckTables = {};
  const skipped: string[] = [];
  const y = series.values;
  let order: 0 | 1 | 2 = 1;
  let usedLogs = y.every((v) => v > 0);

  // Seasonality first: when the annual pattern is real, the stationarity and nonlinearity
  // checks run on the seasonally adjusted rates, because their regressions carry no seasonal
  // terms and a smooth annual cycle makes a stationary series look like a random walk.
  let adjusted: Float64Array | null = null;
  attempt("Seasonality checks", skipped, () => {
    const s = seasonalityAnalysis(series, settings.seasonKind ? { kind: settings.seasonKind } : {});
    [tables.seasonStrength, tables.weekFactors, tables.holidayFactors, tables.week53] = s.tables;
    if (s.seasonalReal) adjusted = s.adjusted;
    if (series.dates.length === y.length) tables.weekYear = weekYearTable(series);
  });
  const tested: Float64Array = adjusted ?? y;
  const adjustNote =
    "Run on seasonally adjusted rates (the STL annual pattern removed), because the tests' regressions have no seasonal terms.";

  attempt("Stationarity checks", skipped, () => {
    const u = unitRootSummary(y, adjusted ? { adjusted: { values: adjusted, note: adjustNote } } : {});
    [tables.stationarity, tables.integration] = u.tables;
    order = u.order;
    usedLogs = u.usedLogs;
  });

  attempt("Nonlinearity checks", skipped, () => {
    // The tests assume a stationary series: difference as often as the stationarity checks say.
    const stationary = order === 0 ? tested : differenced(tested, usedLogs, order);
    const t = nonlinearitySummary(stationary);
    const scale = `${adjusted ? "seasonally adjusted " : ""}${usedLogs ? "log rates" : "rates"}`;
    t.notes.unshift(
      order === 0
        ? `Run on the ${scale} themselves, which the stationarity checks find stationary.`
        : order === 1
          ? `Run on the weekly change of ${scale}, since the rates themselves wander.`
          : `Run on the change of the weekly change of ${scale}, since the stationarity checks find even the weekly changes wandering.`,
    );
    tables.nonlinearity = t;
  });

  if (model) {
    attempt(`Residual checks of ${model.label}`, skipped, () => {
      const r = residualChecks(model.residuals, { fitDf: model.armaDf });
      tables.residualTests = { ...r.tests, title: `Residual checks: ${model.label}` };
      tables.correlogram = { ...r.correlogram, title: `Residual correlogram: ${model.label}` };
    });
  }
  return { tables, skipped };
}
