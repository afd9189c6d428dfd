/**
 * The pane's entry points into Office.js: waiting for the host, and running a read against
 * the workbook. The functions that take a context live beside this file.
 */
import { readSelection, SelectionBlocks } from "./readSelection";

/** Resolves true once Office is ready in Excel, false in any other host (or a plain browser tab). */
export function whenExcelReady(): Promise<boolean> {
  if (typeof Office === "undefined") return Promise.resolve(false);
  return Office.onReady().then((info) => info.host === Office.HostType.Excel);
}

/** Reads the current selection in a batch of its own. */
export function readCurrentSelection(): Promise<SelectionBlocks> {
  return Excel.run((context) => readSelection(context));
}
