/** The span-average and crossing-chance report tables (paths.ts computes them). */
import type { Cell, ReportTable } from "../report";
import { table } from "../report";
import { OUTLOOK_PATHS } from "./paths";
import type { Chance, SpanAverage } from "./paths";

function pct(l: number): string {
  return `${Number(l.toFixed(4))}%`;
}

export function meanAheadTable(rows: SpanAverage[], levels: readonly number[], weekOf: (k: number) => Cell, label: string): ReportTable {
  const columns = ["From week", "To week", "From week ending", "To week ending", "Average", "Std. error"];
  for (const l of levels) columns.push(`Low ${pct(l)}`, `High ${pct(l)}`);
  const body: Cell[][] = rows.map((r) => {
    const row: Cell[] = [r.from, r.to, weekOf(r.from), weekOf(r.to), r.mean, r.se];
    levels.forEach((_, i) => row.push(r.lower[i], r.upper[i]));
    return row;
  });
  return table(`Average rate over future weeks: ${label}`, columns, body, [
    `From ${OUTLOOK_PATHS} simulated paths of the fitted model: each path's average over the span, then the mean of those averages and their central intervals (Hyndman–Fan type 7 quantiles).`,
    "The interval is for the span's average itself; it is narrower than the average of the weekly bounds, because weeks above and below the forecast partly cancel.",
    "Std. error is the Monte Carlo error of the average from the finite number of paths.",
  ]);
}

export function chanceTable(rows: Chance[], weekOf: (k: number) => Cell, label: string): ReportTable {
  const body: Cell[][] = rows.map((r) => [r.week, weekOf(r.week), r.level, r.direction, r.probability, r.se]);
  return table(`Chance of crossing a level: ${label}`, ["Week ahead", "Week ending", "Level", "Direction", "Probability", "Std. error"], body, [
    `The share of ${OUTLOOK_PATHS} simulated paths of the fitted model whose rate that week is strictly above (or below) the level.`,
    "Std. error is the Monte Carlo error of that share, √(p(1 − p)/paths).",
  ]);
}
