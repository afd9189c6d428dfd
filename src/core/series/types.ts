/** A weekly series as every model and test receives it (contract in DESIGN.md). */
export interface WeeklySeries {
  /** Week-ending dates, UTC midnight. */
  dates: Date[];
  values: Float64Array;
  /** True where the value was filled by the gap rule rather than read from a cell. */
  filled: boolean[];
  /** Plain sentences about anything the intake assumed or repaired. */
  warnings: string[];
}
