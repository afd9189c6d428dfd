/**
 * The open workbook as the run flow (runFlow.ts) sees it: each step is one Excel.run batch of
 * its own, so Excel stays responsive between them while the engine works off the UI thread.
 */
import type { ManagedSheet } from "../../core/present/sheets";
import type { PaneWorkbook } from "../runFlow";
import type { SheetLedger } from "../ledger";
import type { PaneSettings } from "../settings";
import type { DataSource } from "../source";
import { readSource } from "./readSource";
import { saveSettings } from "./settingsStore";
import { writeManagedSheets, type WriteOptions } from "./writeSheets";

export const excelWorkbook: PaneWorkbook = {
  name: () =>
    Excel.run(async (context) => {
      context.workbook.load("name");
      await context.sync();
      return context.workbook.name ?? "";
    }),
  readSource: (source: DataSource) => Excel.run((context) => readSource(context, source)),
  write: (sheets: ManagedSheet[], ledgers: Record<string, SheetLedger>, options: WriteOptions) =>
    Excel.run((context) => writeManagedSheets(context, sheets, ledgers, options)),
  saveSettings: (settings: PaneSettings) => Excel.run((context) => saveSettings(context, settings)),
};
