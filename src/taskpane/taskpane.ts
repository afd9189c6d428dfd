/**
 * The Fairlead pane: wires the page to the Data section. every call into the host lives in excel/;
 * what the cells mean is decided by the core intake (through dataSummary.ts).
 */
import type { Cell } from "../core/report";
import { describeFailure, DataView, summariseBlocks } from "./dataSummary";
import type { SelectionBlocks } from "./excel/readSelection";
import { readCurrentSelection, whenExcelReady } from "./excel/host";

function byId<T extends HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new Error(`taskpane.html has no element #${id}`);
  return el as T;
}

function setText(id: string, text: string): void {
  byId(id).textContent = text;
}

function showError(message: string): void {
  byId("data-result").hidden = true;
  const box = byId("data-error");
  box.textContent = message;
  box.hidden = false;
}

function shown(v: Cell): string {
  if (v === null) return "—";
  if (typeof v === "number") return Number.isInteger(v) ? String(v) : v.toLocaleString(undefined, { maximumFractionDigits: 2 });
  return v;
}

/** Renders the core's Data table (Item, Value rows) as a definition list, after the addresses. */
function showSummary(view: DataView): void {
  byId("data-error").hidden = true;
  const pairs: [string, string][] = [
    ["Rates from", view.ratesAddress],
    ["Dates from", view.datesAddress ?? "none found"],
    ...view.table.rows.map((row): [string, string] => [shown(row[0]), shown(row[1])]),
  ];
  const facts = byId<HTMLDListElement>("data-facts");
  facts.replaceChildren(
    ...pairs.flatMap(([k, v]) => {
      const dt = document.createElement("dt");
      dt.textContent = k;
      const dd = document.createElement("dd");
      dd.textContent = v;
      return [dt, dd];
    }),
  );
  const list = byId<HTMLUListElement>("warning-list");
  list.replaceChildren(
    ...view.table.notes.map((w) => {
      const li = document.createElement("li");
      li.textContent = w;
      return li;
    }),
  );
  byId("data-warnings").hidden = view.table.notes.length === 0;
  byId("data-result").hidden = false;
}

async function onReadSelection(button: HTMLButtonElement): Promise<void> {
  button.disabled = true;
  setText("data-status", "Reading the selection…");
  let blocks: SelectionBlocks | undefined;
  try {
    blocks = await readCurrentSelection();
    const view = summariseBlocks(blocks);
    showSummary(view);
    setText("data-status", `Read ${view.weeks} weeks.`);
  } catch (e) {
    showError(describeFailure(e, blocks));
    setText("data-status", "The selection could not be read.");
  } finally {
    button.disabled = false;
  }
}

async function start(): Promise<void> {
  const inExcel = await whenExcelReady();
  const button = byId<HTMLButtonElement>("read-selection");
  if (!inExcel) {
    byId("outside-excel").hidden = false;
    return;
  }
  button.addEventListener("click", () => void onReadSelection(button));
  button.disabled = false;
}

void start();
