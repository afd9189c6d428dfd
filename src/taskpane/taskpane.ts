/**
 * The Fairlead pane: wires the page to the run flow. Every call into the host lives in excel/;
 * what the cells mean is decided by the core intake (dataSummary.ts); what a run does is
 * runFlow.ts, and what Publish does publishFlow.ts; the form's meaning is form.ts. This module
 * moves values between those and the page, and keeps the pane's state: the saved series, the
 * run in progress, the last run's results (what Publish publishes), the watch.
 */
import { PUBLISH_PARTS, type PublishPart } from "../core/present/published";
import type { Cell } from "../core/report";
import { functionsEngine } from "../functions/engine";
import { version } from "../../package.json";
import { describeFailure, summariseBlocks, type DataView } from "./dataSummary";
import { currentSelection, excelTables, sourceCells, loadPaneSettings, onBookCalculated, whenExcelReady, extendUserCharts } from "./excel/host";
import { excelWorkbook } from "./excel/paneWorkbook";
import type { SelectionBlocks } from "./excel/readSelection";
import type { TableInfo } from "./excel/tables";
import { watchSources, type Watch } from "./excel/watch";
import { WriteRefused } from "./excel/writeSheets";
import { defaultForm, formFromOptions, METHOD_CHOICES, optionsFromForm, parseEventWeeks, type FormProblem, type PaneForm } from "./form";
import { publishRun, PublishStopped } from "./publishFlow";
import { RefreshScheduler } from "./refreshScheduler";
import { runAnalysis, RunStopped, type RunOutcome } from "./runFlow";
import { emptySettings, withoutSeries, withSeries, type PaneSettings, type SavedSeries } from "./settings";
import { eventsText, sourceFromSelection, sourceLabel, sameSource, withEvents, type DataSource } from "./source";

// ---- page helpers ----------------------------------------------------------------------

function byId<T extends HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new Error(`taskpane.html has no element #${id}`);
  return el as T;
}

function setText(id: string, text: string): void {
  byId(id).textContent = text;
}

function show(id: string, visible: boolean): void {
  byId(id).hidden = !visible;
}

function shown(v: Cell): string {
  if (v === null) return "—";
  if (typeof v === "number") return Number.isInteger(v) ? String(v) : v.toLocaleString(undefined, { maximumFractionDigits: 2 });
  return v;
}

function listItems(id: string, texts: string[]): void {
  byId<HTMLUListElement>(id).replaceChildren(
    ...texts.map((t) => {
      const li = document.createElement("li");
      li.textContent = t;
      return li;
    }),
  );
}

function options(select: HTMLSelectElement, items: { value: string; label: string }[], chosen?: string): void {
  select.replaceChildren(
    ...items.map((i) => {
      const o = document.createElement("option");
      o.value = i.value;
      o.textContent = i.label;
      if (i.value === chosen) o.selected = true;
      return o;
    }),
  );
}

// ---- state -----------------------------------------------------------------------------

interface PaneState {
  settings: PaneSettings;
  /** The data last read in the Data section, with where it came from. */
  current: { source: DataSource; name: string } | null;
  tables: TableInfo[];
  running: AbortController | null;
  /** A Publish is writing (Run and Publish wait for each other). */
  publishing: boolean;
  /** The last Run or refresh of this session that finished: what Publish publishes. */
  lastRun: RunOutcome | null;
  watch: Watch | null;
  refresh: RefreshScheduler | null;
  spill: RefreshScheduler | null;
  /** The Data section's event column was changed by hand in this session. */
  eventsEdited: boolean;
}

const state: PaneState = {
  settings: emptySettings(),
  current: null,
  tables: [],
  running: null,
  publishing: false,
  lastRun: null,
  watch: null,
  refresh: null,
  spill: null,
  eventsEdited: false,
};

// ---- the form --------------------------------------------------------------------------

const TEXT_FIELDS: [keyof PaneForm, string][] = [
  ["horizon", "horizon"],
  ["coverage", "coverage"],
  ["testWeeks", "test-weeks"],
  ["windows", "windows"],
  ["backtestHorizon", "backtest-horizon"],
  ["refitEvery", "refit-every"],
  ["eventWeeks", "event-weeks"],
];
const CHECK_FIELDS: [keyof PaneForm, string][] = [
  ["lunarNewYear", "lunar-new-year"],
  ["checks", "checks"],
  ["decompose", "decompose"],
  ["backtest", "backtest"],
];

function readForm(): PaneForm {
  const f = defaultForm();
  const record = f as unknown as Record<string, string | boolean>;
  for (const [key, id] of TEXT_FIELDS) record[key] = byId<HTMLInputElement>(id).value;
  for (const [key, id] of CHECK_FIELDS) record[key] = byId<HTMLInputElement>(id).checked;
  f.method = byId<HTMLSelectElement>("method").value;
  f.seasonKind = byId<HTMLSelectElement>("season-kind").value as PaneForm["seasonKind"];
  f.refit = byId<HTMLSelectElement>("refit").value as PaneForm["refit"];
  return f;
}

function fillForm(f: PaneForm): void {
  const record = f as unknown as Record<string, string | boolean>;
  for (const [key, id] of TEXT_FIELDS) byId<HTMLInputElement>(id).value = String(record[key]);
  for (const [key, id] of CHECK_FIELDS) byId<HTMLInputElement>(id).checked = Boolean(record[key]);
  byId<HTMLSelectElement>("method").value = f.method;
  byId<HTMLSelectElement>("season-kind").value = f.seasonKind;
  byId<HTMLSelectElement>("refit").value = f.refit;
  syncForm();
}

/** The summaries beside the folded section titles, and fields that only matter for some choices. */
function syncForm(): void {
  const f = readForm();
  const method = METHOD_CHOICES.find((m) => m.code === f.method)?.label ?? f.method;
  setText("outlook-summary", `${method}; ${f.horizon} weeks; ${f.coverage}%${f.lunarNewYear ? "; lunar new year" : ""}${eventCount(f) ? `; ${eventCount(f)} event week${eventCount(f) === 1 ? "" : "s"}` : ""}`);
  setText("season-summary", f.checks ? `factors by ISO week${f.seasonKind === "auto" ? "" : `, ${f.seasonKind}`}${f.decompose ? "; STL by week" : ""}` : "off (needs the checks)");
  setText("checks-summary", f.checks ? "on" : "off");
  const bt = f.backtest || f.method === "auto";
  setText("backtest-summary", bt ? `${f.testWeeks} weeks × ${f.windows}, ${f.backtestHorizon} ahead, ${byId<HTMLSelectElement>("refit").selectedOptions[0]?.textContent?.toLowerCase() ?? ""}` : "off");
  const interval = f.refit === "interval";
  show("refit-every", interval);
  show("refit-every-label", interval);
}

/** How many event-week dates the field holds (0 when empty or not readable yet). */
function eventCount(f: PaneForm): number {
  return parseEventWeeks(f.eventWeeks)?.length ?? 0;
}

function showProblems(problems: FormProblem[]): void {
  const fields = new Set(problems.map((p) => p.field));
  for (const field of ["horizon", "coverage", "eventWeeks", "testWeeks", "windows", "backtestHorizon", "refitEvery", "backtest"] as const) {
    const box = document.getElementById(`${field}-problem`);
    if (!box) continue;
    const p = problems.find((x) => x.field === field);
    box.textContent = p?.message ?? "";
    box.hidden = !p;
  }
  for (const [key, id] of TEXT_FIELDS) byId(id).setAttribute("aria-invalid", fields.has(key) ? "true" : "false");
  // Open the sections holding a problem, and put the caret on the first one.
  const sectionOf: Partial<Record<keyof PaneForm, string>> = {
    horizon: "outlook-section",
    coverage: "outlook-section",
    eventWeeks: "outlook-section",
    method: "outlook-section",
    backtest: "backtest-section",
    testWeeks: "backtest-section",
    windows: "backtest-section",
    backtestHorizon: "backtest-section",
    refitEvery: "backtest-section",
  };
  for (const p of problems) {
    const s = sectionOf[p.field];
    if (s) byId<HTMLDetailsElement>(s).open = true;
  }
  const first = problems[0];
  const target = first ? TEXT_FIELDS.find(([k]) => k === first.field)?.[1] : undefined;
  if (target) byId<HTMLInputElement>(target).focus();
}

// ---- Data ------------------------------------------------------------------------------

function sourceKind(): "selection" | "table" {
  return byId<HTMLInputElement>("source-kind").querySelector<HTMLInputElement>("input:checked")?.value === "table" ? "table" : "selection";
}

function showSummary(view: DataView): void {
  show("data-error", false);
  const pairs: [string, string][] = [
    ["Rates from", view.ratesAddress],
    ["Dates from", view.datesAddress ?? "none found"],
    ...(view.events ? [["Event weeks marked", `${view.events.weeks.join(", ")} (${view.events.address})`] as [string, string]] : []),
    ...view.table.rows.map((row): [string, string] => [shown(row[0]), shown(row[1])]),
  ];
  byId<HTMLDListElement>("data-facts").replaceChildren(
    ...pairs.flatMap(([k, v]) => {
      const dt = document.createElement("dt");
      dt.textContent = k;
      const dd = document.createElement("dd");
      dd.textContent = v;
      return [dt, dd];
    }),
  );
  listItems("warning-list", view.table.notes);
  show("data-warnings", view.table.notes.length > 0);
  show("data-result", true);
}

function showDataError(message: string): void {
  show("data-result", false);
  const box = byId("data-error");
  box.textContent = message;
  box.hidden = false;
}

function tableChosen(): DataSource | null {
  const t = state.tables.find((x) => x.name === byId<HTMLSelectElement>("table-name").value);
  if (!t) return null;
  const rates = byId<HTMLSelectElement>("table-rates").value;
  const dates = byId<HTMLSelectElement>("table-dates").value;
  return withEvents({ kind: "table", table: t.name, rates, dates: dates === "" ? null : dates }, byId<HTMLSelectElement>("table-events").value);
}

function fillTableColumns(): void {
  const t = state.tables.find((x) => x.name === byId<HTMLSelectElement>("table-name").value);
  if (!t) return;
  const rateChoices = (t.ratesColumns.length > 0 ? t.ratesColumns : t.columns).map((c) => ({ value: c, label: c }));
  options(byId("table-rates"), rateChoices, rateChoices[0]?.value);
  options(byId("table-dates"), [{ value: "", label: "None (undated)" }, ...t.columns.map((c) => ({ value: c, label: c }))], t.datesColumn ?? "");
  options(byId("table-events"), [{ value: "", label: "None" }, ...t.columns.map((c) => ({ value: c, label: c }))], "");
}

async function loadTables(): Promise<void> {
  try {
    state.tables = await excelTables();
  } catch {
    state.tables = [];
  }
  show("no-tables", state.tables.length === 0);
  options(
    byId("table-name"),
    state.tables.map((t) => ({ value: t.name, label: `${t.name} (${t.sheet}, ${t.rows} rows)` })),
  );
  fillTableColumns();
}

/** Reads the Data section's source and shows what was read; the source, or null on failure. */
async function readData(): Promise<{ source: DataSource; name: string } | null> {
  const button = byId<HTMLButtonElement>("read-data");
  button.disabled = true;
  setText("data-status", sourceKind() === "table" ? "Reading the table…" : "Reading the selection…");
  let blocks: SelectionBlocks | undefined;
  try {
    let source: DataSource;
    if (sourceKind() === "table") {
      const chosen = tableChosen();
      if (!chosen) throw new Error("no table");
      source = chosen;
    } else {
      const selected = await currentSelection();
      blocks = selected;
      source = withEvents(sourceFromSelection(selected), byId<HTMLInputElement>("range-events").value);
    }
    // A series analysed before: show the options it was run with, and keep its event column
    // unless the field was edited in this session (a blank field at start-up is not a choice).
    const saved = state.settings.series.find((s) => sameSource(s.source, source));
    const restored = saved !== undefined && !state.eventsEdited && eventsText(source) === "" && eventsText(saved.source) !== "";
    if (saved && restored) {
      source = withEvents(source, eventsText(saved.source));
      byId<HTMLInputElement | HTMLSelectElement>(source.kind === "table" ? "table-events" : "range-events").value = eventsText(saved.source);
    }
    // What a run reads: the same columns from the same top row down to the last filled cell,
    // so the summary shows exactly the weeks Run will analyse (and a refresh will extend).
    const read = await sourceCells(source);
    blocks = read;
    const name = read.name;
    const view = summariseBlocks(read);
    showSummary(view);
    const marked = view.events ? `, ${view.events.weeks.length} event week${view.events.weeks.length === 1 ? "" : "s"} marked in ${view.events.column}${restored ? " (as in its last run)" : ""}` : "";
    setText("data-status", `Read ${view.weeks} weeks of ${name}${marked}.`);
    if (saved) fillForm(formFromOptions(saved.options));
    state.current = { source, name };
    return state.current;
  } catch (e) {
    const message =
      sourceKind() === "table" && state.tables.length === 0
        ? "This book has no Excel tables; use Selected cells."
        : describeFailure(e, blocks).replace("Choose Read selection again", "Choose Read the rates again");
    showDataError(message);
    setText("data-status", "The rates could not be read.");
    state.current = null;
    return null;
  } finally {
    button.disabled = false;
  }
}

// ---- Run -------------------------------------------------------------------------------

function setRunning(running: boolean, label = "Running"): void {
  byId<HTMLButtonElement>("run").disabled = running;
  byId<HTMLButtonElement>("publish").disabled = running || !state.lastRun;
  byId<HTMLButtonElement>("read-data").disabled = running;
  show("cancel", running);
  show("progress-box", running || byId<HTMLProgressElement>("progress").value > 0);
  if (running) {
    byId<HTMLProgressElement>("progress").value = 0;
    setText("progress-text", `${label}…`);
    show("run-error", false);
    show("adopt", false);
  }
}

function progress(fraction: number, sentence: string): void {
  byId<HTMLProgressElement>("progress").value = Math.max(0, Math.min(1, fraction));
  setText("progress-text", `${Math.floor(fraction * 100)}% · ${sentence}`);
}

/** Shows a refusal in `boxId`, with its "Rewrite them" button when sheets could be adopted. */
function showRefusal(boxId: string, adoptId: string, message: string, adoptable: string[]): void {
  const box = byId(boxId);
  box.textContent = message;
  box.hidden = false;
  const adopt = byId<HTMLButtonElement>(adoptId);
  adopt.hidden = adoptable.length === 0;
  adopt.dataset.sheets = JSON.stringify(adoptable);
}

function showRunError(message: string, adoptable: string[] = []): void {
  showRefusal("run-error", "adopt", message, adoptable);
}

function showOutcome(outcome: RunOutcome, refreshed: boolean): void {
  const when = new Date().toLocaleTimeString(undefined, { hour: "2-digit", minute: "2-digit" });
  const names = outcome.analysed.map((a) => a.name).join(", ");
  setText("run-done", `${refreshed ? "Refreshed" : "Done"} at ${when}: ${names}, as of week ending ${outcome.analysed[0]?.report.lastWeek ?? "—"}.`);
  listItems(
    "run-sheets",
    outcome.written.sheets.map((s) => `${s.name}: ${s.rows} rows${s.charts.length ? `, ${s.charts.length} chart${s.charts.length === 1 ? "" : "s"}` : ""}${s.created ? " (new sheet)" : ""}`),
  );
  listItems("run-warning-list", outcome.warnings);
  show("run-warnings", outcome.warnings.length > 0);
  show("run-result", true);
  setText("progress-text", `100% · ${refreshed ? "Refreshed" : "Done"}`);
}

async function run(series: SavedSeries[], opts: { refreshed: boolean; adopt?: string[] }): Promise<void> {
  if (state.running || state.publishing) return;
  const controller = new AbortController();
  state.running = controller;
  setRunning(true, opts.refreshed ? "Refreshing" : "Running");
  try {
    const outcome = await runAnalysis(
      { series, settings: state.settings, kind: opts.refreshed ? "refresh" : "run", write: { activate: !opts.refreshed, adopt: opts.adopt } },
      { workbook: excelWorkbook, engine: functionsEngine(), version },
      { onProgress: progress, signal: controller.signal },
    );
    state.settings = outcome.settings;
    state.lastRun = outcome;
    showOutcome(outcome, opts.refreshed);
    showPublishReady();
    renderWatched();
    await restartWatch();
    if (opts.refreshed) await extendSpillCharts();
  } catch (e) {
    if (e instanceof WriteRefused) showRunError(e.message, e.adoptable);
    else if (e instanceof RunStopped) showRunError(e.message);
    else showRunError(`Excel did not take the results: ${e instanceof Error ? e.message : String(e)}. Nothing of yours was changed; run again.`);
    setText("progress-text", "Stopped");
  } finally {
    state.running = null;
    setRunning(false);
  }
}

async function onRun(adopt?: string[]): Promise<void> {
  const { options: analysis, problems } = optionsFromForm(readForm());
  showProblems(problems);
  if (problems.length > 0) return;
  const current = state.current ?? (await readData());
  if (!current) return;
  const entry: SavedSeries = { source: current.source, name: current.name, options: analysis };
  await run(withSeries(state.settings.series, entry), { refreshed: false, adopt });
}

// ---- Publish ---------------------------------------------------------------------------

function renderParts(): void {
  byId<HTMLFieldSetElement>("publish-parts").append(
    ...PUBLISH_PARTS.map(({ part, label }) => {
      const box = document.createElement("input");
      box.type = "checkbox";
      box.value = part;
      box.checked = true;
      box.id = `publish-${part}`;
      const l = document.createElement("label");
      l.append(box, ` ${label}`);
      return l;
    }),
  );
}

function chosenParts(): PublishPart[] {
  return Array.from(byId("publish-parts").querySelectorAll<HTMLInputElement>("input:checked")).map((i) => i.value as PublishPart);
}

/** Says what Publish would publish: the last run's series and week, or that a run comes first. */
function showPublishReady(): void {
  const last = state.lastRun;
  byId<HTMLButtonElement>("publish").disabled = !last || state.running !== null || state.publishing;
  setText(
    "publish-status",
    last
      ? `Publishes ${last.analysed.map((a) => a.name).join(", ")} as of week ending ${last.analysed[0]?.report.lastWeek ?? "—"}.`
      : "Run first: Publish shows the results of the last run.",
  );
}

function showPublishError(message: string, adoptable: string[] = []): void {
  showRefusal("publish-error", "publish-adopt", message, adoptable);
}

async function onPublish(adopt?: string[]): Promise<void> {
  const last = state.lastRun;
  if (!last || state.running || state.publishing) return;
  state.publishing = true;
  byId<HTMLButtonElement>("publish").disabled = true;
  byId<HTMLButtonElement>("run").disabled = true;
  show("publish-error", false);
  show("publish-adopt", false);
  show("publish-result", false);
  setText("publish-status", "Publishing…");
  try {
    const outcome = await publishRun({ run: last, parts: chosenParts(), settings: state.settings, write: { activate: true, adopt } }, { workbook: excelWorkbook });
    state.settings = outcome.settings;
    const when = new Date().toLocaleTimeString(undefined, { hour: "2-digit", minute: "2-digit" });
    setText("publish-status", `Published at ${when}: ${last.analysed.map((a) => a.name).join(", ")}, as of week ending ${last.analysed[0]?.report.lastWeek ?? "—"}.`);
    listItems("publish-result", outcome.sentences);
    show("publish-result", true);
  } catch (e) {
    if (e instanceof WriteRefused) showPublishError(e.message, e.adoptable);
    else if (e instanceof PublishStopped) showPublishError(e.message);
    else showPublishError(`Excel did not take the published sheets: ${e instanceof Error ? e.message : String(e)}. Publish again.`);
    setText("publish-status", "Not published.");
  } finally {
    state.publishing = false;
    byId<HTMLButtonElement>("run").disabled = false;
    byId<HTMLButtonElement>("publish").disabled = !state.lastRun;
  }
}

// ---- watched series and refresh --------------------------------------------------------

function renderWatched(): void {
  show("watched", state.settings.series.length > 0);
  byId<HTMLInputElement>("watch").checked = state.settings.watch;
  byId<HTMLUListElement>("watched-list").replaceChildren(
    ...state.settings.series.map((s) => {
      const li = document.createElement("li");
      const title = document.createElement("div");
      title.textContent = `${s.name} · ${sourceLabel(s.source)} · ${s.options.method ?? "auto"}, ${s.options.horizon ?? 12} weeks`;
      const actions = document.createElement("div");
      actions.className = "item-actions";
      const load = document.createElement("button");
      load.type = "button";
      load.className = "link";
      load.textContent = "Show its options";
      load.addEventListener("click", () => {
        fillForm(formFromOptions(s.options));
        state.current = { source: s.source, name: s.name };
        setText("data-status", `Options of ${s.name} shown; Run re-analyses it with what the form says.`);
      });
      const remove = document.createElement("button");
      remove.type = "button";
      remove.className = "link";
      remove.textContent = "Stop analysing";
      remove.setAttribute("aria-label", `Stop analysing ${s.name}`);
      remove.addEventListener("click", () => void onRemove(s.source));
      actions.append(load, remove);
      li.append(title, actions);
      return li;
    }),
  );
}

async function onRemove(source: DataSource): Promise<void> {
  const rest = withoutSeries(state.settings.series, source);
  if (rest.length > 0) {
    await run(rest, { refreshed: true });
    return;
  }
  state.settings = { ...state.settings, series: [] };
  await excelWorkbook.saveSettings(state.settings);
  renderWatched();
  await restartWatch();
  setText("watch-status", "No series left to analyse; Fairlead's sheets still show the last run. Delete them if you no longer need them.");
  show("watched", true);
}

async function restartWatch(): Promise<void> {
  await state.watch?.stop().catch(() => undefined);
  state.watch = null;
  if (!state.settings.watch || state.settings.series.length === 0) {
    setText("watch-status", state.settings.series.length ? "Not watching: choose Run to refresh." : "");
    return;
  }
  try {
    state.watch = await watchSources(
      state.settings.series.map((s) => s.source),
      () => state.refresh?.poke(),
    );
    setText("watch-status", `Watching ${state.settings.series.length} series for new weeks.`);
  } catch {
    setText("watch-status", "This version of Excel cannot tell the pane about changes; choose Run to refresh.");
  }
}

async function extendSpillCharts(): Promise<void> {
  try {
    const changes = await extendUserCharts();
    if (changes.length > 0) {
      setText("watch-status", `Extended ${changes.length} chart series over FAIRLEAD results to their new length.`);
    }
  } catch {
    // Charts of the user's own are a courtesy: a failure here leaves them as they were.
  }
}

// ---- start -----------------------------------------------------------------------------

async function start(): Promise<void> {
  options(
    byId("method"),
    METHOD_CHOICES.map((m) => ({ value: m.code, label: m.label })),
  );
  renderParts();
  fillForm(defaultForm());
  const inExcel = await whenExcelReady();
  if (!inExcel) {
    show("outside-excel", true);
    return;
  }
  const loaded = await loadPaneSettings().catch(() => ({ settings: emptySettings(), problems: ["The pane's saved settings could not be read."] }));
  state.settings = loaded.settings;
  if (loaded.problems.length > 0) {
    setText("settings-problems", loaded.problems.join(" "));
    show("settings-problems", true);
  }
  state.refresh = new RefreshScheduler(() => run(state.settings.series, { refreshed: true }), {
    onError: () => setText("watch-status", "A refresh did not finish; choose Run to try again."),
  });
  state.spill = new RefreshScheduler(extendSpillCharts, { quietMs: 1000 });
  await onBookCalculated(() => state.spill?.poke()).catch(() => undefined);

  for (const input of Array.from(document.querySelectorAll<HTMLInputElement | HTMLSelectElement>("main input, main select"))) {
    input.addEventListener("change", syncForm);
  }
  for (const radio of Array.from(document.querySelectorAll<HTMLInputElement>('input[name="source-kind"]'))) {
    radio.addEventListener("change", () => {
      const table = sourceKind() === "table";
      show("table-pick", table);
      show("data-hint", !table);
      show("range-events-box", !table);
      state.current = null;
      if (table) void loadTables();
    });
  }
  byId("table-name").addEventListener("change", () => {
    fillTableColumns();
    state.current = null;
  });
  byId("table-rates").addEventListener("change", () => (state.current = null));
  byId("table-dates").addEventListener("change", () => (state.current = null));
  for (const id of ["table-events", "range-events"]) {
    byId(id).addEventListener("change", () => {
      state.current = null;
      state.eventsEdited = true;
    });
  }
  byId("read-data").addEventListener("click", () => void readData());
  byId("run").addEventListener("click", () => void onRun());
  byId("cancel").addEventListener("click", () => state.running?.abort());
  byId("adopt").addEventListener("click", () => void onRun(JSON.parse(byId("adopt").dataset.sheets ?? "[]") as string[]));
  byId("publish").addEventListener("click", () => void onPublish());
  byId("publish-adopt").addEventListener("click", () => void onPublish(JSON.parse(byId("publish-adopt").dataset.sheets ?? "[]") as string[]));
  byId<HTMLInputElement>("watch").addEventListener("change", async (ev) => {
    state.settings = { ...state.settings, watch: (ev.target as HTMLInputElement).checked };
    await excelWorkbook.saveSettings(state.settings).catch(() => undefined);
    await restartWatch();
  });
  byId<HTMLButtonElement>("read-data").disabled = false;
  byId<HTMLButtonElement>("run").disabled = false;
  renderWatched();
  await restartWatch();
}

void start();
