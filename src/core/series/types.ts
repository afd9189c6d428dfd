/** A weekly series as every model and test receives it (contract in DESIGN.md). */
export interface WeeklySeries {
  /**
   * Week-ending dates, UTC midnight, one per value. Empty when no dates were given: the
   * values are then consecutive weeks of unknown date, and `warnings` says so.
   */
  dates: Date[];
  values: Float64Array;
  /** True where the value was filled by the gap rule rather than read from a cell. */
  filled: boolean[];
  /** Plain sentences about anything the intake assumed or repaired. */
  warnings: string[];
  /** The header text found above the values, when there was one. */
  name?: string;
  /** Detected week-ending weekday, 0 = Sunday … 6 = Saturday (absent without dates). */
  weekday?: number;
}
