/**
 * Chart specifications: what a chart shows, as plain data, built from report tables by
 * charts.ts. Every sink draws from the same spec: the pane as native Excel charts, the batch
 * runner as images embedded in the output book. A spec names what each series means (history,
 * forecast, interval band, one year of the season) and leaves colours and drawing to the sink.
 */

/** One drawn series. Values line up with the chart's categories; null is a gap. */
export interface ChartSeries {
  name: string;
  values: (number | null)[];
  /**
   * What the series is, which decides how it is drawn:
   * - "history": observed rates (solid line)
   * - "forecast": point forecasts (dashed line, continuing from the history)
   * - "year": one year of a seasonal pattern (radar); the latest year is drawn strongest
   * - "method": one method's values in a comparison (a bar group or a line per method)
   */
  role: "history" | "forecast" | "year" | "method";
}

/** A shaded band between two bounds, such as a prediction interval. */
export interface ChartBand {
  name: string;
  low: (number | null)[];
  high: (number | null)[];
}

interface ChartBase {
  /** Stable identifier, unique in a report: used for the image name and the pane's chart name. */
  id: string;
  title: string;
  /** Category labels along the axis (ISO dates, week labels, weeks ahead). */
  categories: string[];
  series: ChartSeries[];
  /** One line under the chart: the source and the as-of week. */
  caption: string;
}

/** History and forecast over dated weeks, with interval bands (widest first). */
export interface LineChartSpec extends ChartBase {
  kind: "line";
  yTitle: string;
  bands: ChartBand[];
}

/** The 52 ISO weeks around a circle, one series per year. */
export interface RadarChartSpec extends ChartBase {
  kind: "radar";
}

/** Grouped columns: categories along the axis, one column per series in each group. */
export interface ColumnChartSpec extends ChartBase {
  kind: "column";
  yTitle: string;
}

export type ChartSpec = LineChartSpec | RadarChartSpec | ColumnChartSpec;
