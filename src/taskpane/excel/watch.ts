/**
 * Tells the pane when the cells of an analysed source change, so it can run again once next
 * week's figures are pasted. Table sources listen to their table's onChanged (which also
 * fires for rows added to the table); range sources listen to their sheet's onChanged. One
 * handler per table and per sheet serves every source on it.
 *
 * Office.js calls only; which changes count is decided by ../source.ts (touches, placeTable).
 * Requires ExcelApi 1.7 (Table.onChanged, Worksheet.onChanged).
 */
import { DataSource, placeTable, RangeSource, sameSource, TableSource, touches } from "../source";

export interface Watch {
  /** Removes every handler; no onChange call follows. */
  stop(): Promise<void>;
}

/** The part of OfficeExtension.EventHandlerResult this module keeps. */
interface Registration {
  context: OfficeExtension.ClientRequestContext;
  remove(): void;
}

/** Groups by a key that ignores case, as Excel does for table and sheet names. */
function groupBy<T>(items: T[], key: (item: T) => string): T[][] {
  const groups = new Map<string, T[]>();
  for (const item of items) {
    const k = key(item).toUpperCase();
    const group = groups.get(k);
    if (group) group.push(item);
    else groups.set(k, [item]);
  }
  return [...groups.values()];
}

/**
 * Where the group's columns are now. Read at each event rather than once, because the event
 * may itself be a column inserted, moved or renamed. Null for a source that cannot be placed.
 */
async function placeGroup(tableId: string, group: TableSource[]): Promise<(RangeSource | null)[]> {
  return Excel.run(async (context) => {
    const table = context.workbook.tables.getItem(tableId);
    const range = table.getRange();
    range.load("address");
    table.columns.load("items/name");
    await context.sync();
    const names = table.columns.items.map((c) => c.name);
    return group.map((s) => placeTable(s, range.address, names));
  });
}

/**
 * Registers the handlers. A table or sheet that no longer exists is skipped: reading that
 * source fails with its own sentence, which is where the desk learns of it.
 */
export async function watchSources(sources: DataSource[], onChange: (source: DataSource) => void): Promise<Watch> {
  const unique = sources.filter((s, i) => sources.findIndex((t) => sameSource(s, t)) === i);
  const tableGroups = groupBy(
    unique.filter((s): s is TableSource => s.kind === "table"),
    (s) => s.table,
  );
  const sheetGroups = groupBy(
    unique.filter((s): s is RangeSource => s.kind === "range"),
    (s) => s.sheet,
  );
  let stopped = false;
  const tell = (s: DataSource): void => {
    if (!stopped) onChange(s);
  };

  const registrations: Registration[] = [];
  if (tableGroups.length > 0 || sheetGroups.length > 0) {
    await Excel.run(async (context) => {
      const tables = tableGroups.map((group) => {
        const table = context.workbook.tables.getItemOrNullObject(group[0].table);
        table.load("name");
        return { table, group };
      });
      const sheets = sheetGroups.map((group) => {
        const sheet = context.workbook.worksheets.getItemOrNullObject(group[0].sheet);
        sheet.load("name");
        return { sheet, group };
      });
      await context.sync();

      for (const { table, group } of tables) {
        if (table.isNullObject) continue;
        const handler = async (args: Excel.TableChangedEventArgs): Promise<void> => {
          if (stopped) return;
          let placed: (RangeSource | null)[];
          try {
            placed = await placeGroup(args.tableId, group);
          } catch {
            // Could not tell which columns changed: a needless run is better than a stale pane.
            placed = group.map(() => null);
          }
          group.forEach((s, i) => {
            const p = placed[i];
            if (p === null || touches(p, args.address, p.sheet)) tell(s);
          });
        };
        registrations.push(table.onChanged.add(handler));
      }
      for (const { sheet, group } of sheets) {
        if (sheet.isNullObject) continue;
        const sheetName = sheet.name;
        const handler = async (args: Excel.WorksheetChangedEventArgs): Promise<void> => {
          for (const s of group) if (touches(s, args.address, sheetName)) tell(s);
        };
        registrations.push(sheet.onChanged.add(handler));
      }
      await context.sync();
    });
  }

  return {
    async stop(): Promise<void> {
      if (stopped) return;
      stopped = true;
      // Handlers are removed through the context they were added with.
      for (const group of groupByContext(registrations)) {
        await Excel.run(group[0].context, async (context) => {
          for (const r of group) r.remove();
          await context.sync();
        });
      }
    },
  };
}

function groupByContext(registrations: Registration[]): Registration[][] {
  const groups = new Map<OfficeExtension.ClientRequestContext, Registration[]>();
  for (const r of registrations) {
    const group = groups.get(r.context);
    if (group) group.push(r);
    else groups.set(r.context, [r]);
  }
  return [...groups.values()];
}
