/**
 * Workbook names for published results, so that a budget model links to a lane's outlook by
 * name rather than by a cell address that moves when the layout does. The pane and the batch
 * runner define the same names over the outlook block they write:
 *
 *   FL_<KEY>_WEEK       week-ending dates of the forecast weeks (one column, horizon rows)
 *   FL_<KEY>_POINT      point forecasts
 *   FL_<KEY>_LOW_<L>    lower bound of the L% interval (L as a whole number: 80, 95; 97.5 → 97_5)
 *   FL_<KEY>_HIGH_<L>   upper bound
 *   FL_<KEY>_ASOF       the last week of data the outlook was made from (one cell)
 *
 * KEY is the series' header in capitals with every run of other characters made one
 * underscore: "Halden–Corvane FEU" → HALDEN_CORVANE_FEU. Names begin "FL_", which no cell
 * address does, so none of them can be read as a reference (Excel's rule for defined names).
 */

/** The key of a series name: capitals, digits and single underscores. */
export function seriesKey(name: string): string {
  const key = name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toUpperCase()
    .replace(/[^A-Z0-9]+/g, "_")
    .replace(/^_+|_+$/g, "");
  return key.length > 0 ? key : "SERIES";
}

export type OutlookPart = "WEEK" | "POINT" | "ASOF" | { low: number } | { high: number };

function levelPart(level: number): string {
  return String(Number(level.toFixed(4))).replace(".", "_");
}

/** The defined name of one part of a series' outlook. */
export function outlookName(seriesName: string, part: OutlookPart): string {
  const key = seriesKey(seriesName);
  if (typeof part === "string") return `FL_${key}_${part}`;
  return "low" in part ? `FL_${key}_LOW_${levelPart(part.low)}` : `FL_${key}_HIGH_${levelPart(part.high)}`;
}
