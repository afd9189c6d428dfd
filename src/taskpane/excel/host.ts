/**
 * The pane's entry points into Office.js: waiting for the host, and the reads and event
 * registrations that run in a batch of their own. The functions that take a context live
 * beside this file.
 */
import { loadSettings } from "./settingsStore";
import { readSelection, type SelectionBlocks } from "./readSelection";
import { extendSpillCharts, type SpillChartChange } from "./spillCharts";
import { listTables, type TableInfo } from "./tables";
import type { PaneSettings } from "../settings";
import type { DataSource } from "../source";
import { readSource, type SourceBlocks } from "./readSource";

/** Resolves true once Office is ready in Excel, false in any other host (or a plain browser tab). */
export function whenExcelReady(): Promise<boolean> {
  if (typeof Office === "undefined") return Promise.resolve(false);
  return Office.onReady().then((info) => info.host === Office.HostType.Excel);
}

/** Reads the current selection in a batch of its own. */
export function currentSelection(): Promise<SelectionBlocks> {
  return Excel.run((context) => readSelection(context));
}

/** Reads a saved or chosen source (a table's columns, or a sheet column to its last used cell). */
export function sourceCells(source: DataSource): Promise<SourceBlocks> {
  return Excel.run((context) => readSource(context, source));
}

export function excelTables(): Promise<TableInfo[]> {
  return Excel.run((context) => listTables(context));
}

export function loadPaneSettings(): Promise<{ settings: PaneSettings; problems: string[] }> {
  return Excel.run((context) => loadSettings(context));
}

export function extendUserCharts(): Promise<SpillChartChange[]> {
  return Excel.run((context) => extendSpillCharts(context));
}

/**
 * Calls `listener` after every recalculation of the book (ExcelApi 1.8), which is when the
 * worksheet functions' spill ranges change size. Resolves false where the host cannot tell.
 */
export async function onBookCalculated(listener: () => void): Promise<boolean> {
  if (!Office.context.requirements.isSetSupported("ExcelApi", "1.8")) return false;
  await Excel.run(async (context) => {
    context.workbook.worksheets.onCalculated.add(async () => listener());
    await context.sync();
  });
  return true;
}
