/** A report table: the one shape every sink renders (contract in DESIGN.md). */
export type Cell = number | string | null;

export interface ReportTable {
  title: string;
  columns: string[];
  rows: Cell[][];
  notes: string[];
  /**
   * Columns whose values differ from run to run on the same inputs (timings). Sinks that
   * promise byte-identical output for identical inputs (the batch runner's JSON) leave them out.
   */
  varying?: string[];
}

export function table(title: string, columns: string[], rows: Cell[][], notes: string[] = []): ReportTable {
  for (const r of rows) {
    if (r.length !== columns.length) {
      throw new Error(`report table "${title}": a row has ${r.length} cells for ${columns.length} columns`);
    }
  }
  return { title, columns, rows, notes };
}

/** Report columns (and label rows) whose cells are ISO dates, which sinks write as real dates. */
export function isDateColumn(name: string): boolean {
  return /^(from |to |first |last )?week ending$|^week( forecast)?$|^last week seen$|^(origin|target) week$/i.test(name);
}
