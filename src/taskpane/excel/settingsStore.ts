/**
 * Reads and writes the pane's settings (settings.ts) in the workbook's add-in settings
 * (Excel.SettingCollection), which travel with the file: whoever opens the book next and
 * refreshes runs the same series with the same options.
 */
import { LEDGER_KEY, SERIES_KEY, parseSettings, storedSeries, type PaneSettings } from "../settings";

export async function loadSettings(context: Excel.RequestContext): Promise<{ settings: PaneSettings; problems: string[] }> {
  const series = context.workbook.settings.getItemOrNullObject(SERIES_KEY);
  const ledgers = context.workbook.settings.getItemOrNullObject(LEDGER_KEY);
  series.load("value");
  ledgers.load("value");
  await context.sync();
  return parseSettings(series.isNullObject ? null : series.value, ledgers.isNullObject ? null : ledgers.value);
}

/** Queues both values; the caller's next sync stores them. */
export function queueSettings(context: Excel.RequestContext, settings: PaneSettings): void {
  context.workbook.settings.add(SERIES_KEY, storedSeries(settings));
  context.workbook.settings.add(LEDGER_KEY, settings.ledgers);
}

export async function saveSettings(context: Excel.RequestContext, settings: PaneSettings): Promise<void> {
  queueSettings(context, settings);
  await context.sync();
}
