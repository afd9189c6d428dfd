/**
 * The checks that justify a model, run together for analyse(): stationarity (ADF, PP, KPSS
 * on levels, logs and weekly changes, with the order of integration), seasonality (STL
 * strength and ISO-week factors), nonlinearity (on the series made stationary as the
 * stationarity checks conclude), and the chosen model's residuals. A check that the data
 * cannot support (too short, constant) is skipped with its sentence; the others still run.
 */
import type { ReportTable } from "../report";
import { isInputError } from "../series/errors";
import type { WeeklySeries } from "../series/types";
import { nonlinearitySummary } from "./nonlinearity";
import { residualChecks } from "./residuals";
import { seasonalitySummary } from "./seasonality";
import { unitRootSummary } from "./unitroot/integration";

export interface CheckTables {
  stationarity?: ReportTable;
  integration?: ReportTable;
  seasonStrength?: ReportTable;
  weekFactors?: ReportTable;
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

/** Runs `fn`; an InputError becomes a skip sentence, anything else propagates. */
function attempt(what: string, skipped: string[], fn: () => void): void {
  try {
    fn();
  } catch (e) {
    if (!isInputError(e)) throw e;
    skipped.push(`${what} not run: ${e.message}`);
  }
}

function weeklyChange(y: Float64Array, logs: boolean): Float64Array {
  const d = new Float64Array(y.length - 1);
  for (let t = 1; t < y.length; t++) d[t - 1] = logs ? Math.log(y[t]) - Math.log(y[t - 1]) : y[t] - y[t - 1];
  return d;
}

export function runChecks(series: WeeklySeries, model?: ModelResiduals): ChecksResult {
  const tables: CheckTables = {};
  const skipped: string[] = [];
  const y = series.values;
  let order: 0 | 1 | 2 = 1;
  let usedLogs = y.every((v) => v > 0);

  attempt("Stationarity checks", skipped, () => {
    const u = unitRootSummary(y);
    [tables.stationarity, tables.integration] = u.tables;
    order = u.order;
    usedLogs = u.usedLogs;
  });

  attempt("Seasonality checks", skipped, () => {
    const [strength, factors] = seasonalitySummary(series);
    tables.seasonStrength = strength;
    if (factors) tables.weekFactors = factors;
  });

  attempt("Nonlinearity checks", skipped, () => {
    const stationary = order === 0 ? y : weeklyChange(y, usedLogs);
    const t = nonlinearitySummary(stationary);
    t.notes.unshift(
      order === 0
        ? "Run on the rates themselves, which the stationarity checks find stationary."
        : `Run on the weekly change of ${usedLogs ? "log rates" : "rates"}, since the rates themselves wander.`,
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
