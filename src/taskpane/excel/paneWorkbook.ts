/**
 * The open workbook as the run and publish flows (runFlow.ts, publishFlow.ts) see it: each
 * step is one Excel.run batch of its own, so Excel stays responsive between them while the
 * engine works off the UI thread.
 */
import type { ManagedSheet } from "../../core/present/sheets";
import type { AppendPlan, LogReading } from "../../core/record/log";
import type { PaneWorkbook } from "../runFlow";
import type { SheetLedger } from "../ledger";
import type { PaneSettings } from "../settings";
import type { DataSource } from "../source";
import { appendToLog, readForecastLog } from "./forecastLog";
import { readSource } from "./readSource";
import { saveSettings } from "./settingsStore";
import { writeManagedSheets, type WriteOptions } from "./writeSheets";

/** How a step gets a request context: Excel.run in the host, a stand-in book in tests. */
export type ExcelRun = <T>(batch: (context: Excel.RequestContext) => Promise<T>) => Promise<T>;

export function paneWorkbookOf(run: ExcelRun): PaneWorkbook {
  return {
    name: () =>
      run(async (context) => {
        context.workbook.load("name");
        await context.sync();
        return context.workbook.name ?? "";
      }),
    readSource: (source: DataSource) => run((context) => readSource(context, source)),
    write: (sheets: ManagedSheet[], ledgers: Record<string, SheetLedger>, options: WriteOptions) =>
      run((context) => writeManagedSheets(context, sheets, ledgers, options)),
    readLog: () => run((context) => readForecastLog(context)),
    appendLog: (plan: AppendPlan, reading: LogReading | null) => run((context) => appendToLog(context, plan, reading)),
    saveSettings: (settings: PaneSettings) => run((context) => saveSettings(context, settings)),
  };
}

export const excelWorkbook: PaneWorkbook = paneWorkbookOf((batch) => Excel.run(batch));
