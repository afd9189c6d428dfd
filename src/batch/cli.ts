#!/usr/bin/env node
/**
 * fairlead — the command-line runner (package.json "bin"). Verbs:
 *   run <book.xlsx>       analyse the book's rate columns and write the managed sheets
 *   publish <book.xlsx>   the same, plus the published snapshot (plain values and charts), the
 *                         run's forecasts appended to the book's Fairlead Log, and the track
 *                         record rewritten from the whole log and the rates just read
 *   forecast              forecasts and intervals of one column, as a table or JSON
 * Exit codes: 0 done, 2 bad input (one line on stderr saying why), 1 internal failure.
 */
import type { AnalysisOptions, ChoiceMetric, Report } from "../core/analysis";
import type { RefitMode } from "../core/evaluate/backtest";
import type { BacktestOptions } from "../core/evaluate/plan";
import { runDefaults } from "../core/present/defaults";
import { PUBLISH_PARTS, parseParts, type PublishPart } from "../core/present/published";
import { CAUTION } from "../core/present/stamp";
import { analyseInEngine, createEngine, type Transport } from "../engine";
import { NodeTransport } from "../engine/node";
import { flag, has, levelsFlag, list, parseArgs, wholeFlag, type FlagSpec, type Parsed } from "./args";
import { EXIT_BAD_INPUT, EXIT_INTERNAL, EXIT_OK, UsageError, isBadInput } from "./errors";
import { forecastJson, jsonText, runJson } from "./json";
import { progressBar } from "./progress";
import { fairleadVersion, runBook, seriesOfBlock, withEventColumn } from "./run";
import { bookBlock, csvBlock, loadBook } from "./source";
import { summaryText } from "./summary";

const COMMON: Record<string, FlagSpec> = {
  sheet: { value: true, help: "the sheet to read (default: the first sheet with a table)" },
  table: { value: true, help: "the Excel table to read (default: the sheet's only table, else its used range)" },
  dates: { value: true, help: "header of the week-ending date column (default: the first column of dates)" },
  horizon: { value: true, help: "weeks ahead, 1 to 260 (default 12)" },
  coverage: { value: true, help: "interval coverage levels in percent, such as 80,95 (the default)" },
  method: { value: true, help: "method code: auto (default: chosen by backtest), tbats, sarima, nnar, combo, lastyear, lastweek, drift" },
  methods: { value: true, help: "the methods auto compares, such as tbats,sarima,lastyear" },
  backtest: { value: true, help: "off, or settings such as weeks=52,ahead=4,refit=every (refit: every, fixed or a number of weeks)" },
  choose: { value: true, help: "the measure auto chooses by: mase (default), mape, rmse or smape" },
  "lunar-new-year": { value: false, help: "add lunar-new-year regressors (used by SARIMA and TBATS)" },
  "event-weeks": { value: true, help: "weeks of events of your own as one regressor (SARIMA and TBATS): dates YYYY-MM-DD, any day of each week, past and coming, separated by commas" },
  "event-column": { value: true, help: "header (or letter) of a column marking event weeks with 1, x or TRUE beside the dates (rows below the last rate count when dated); joins --event-weeks; never read as rates" },
  json: { value: false, help: "print JSON on stdout instead of the summary" },
  timing: { value: false, help: "include run times in the JSON (they differ from run to run)" },
  quiet: { value: false, help: "no progress on stderr" },
  workers: { value: true, help: "worker threads (default: the machine's cores)" },
};

const RUN_FLAGS: Record<string, FlagSpec> = {
  ...COMMON,
  column: { value: true, repeat: true, help: "header of a rate column to analyse (repeat, or separate by commas; default: every column of numbers)" },
  out: { value: true, help: "the output book (default: <book>.fairlead.xlsx)" },
  into: { value: true, help: "write the results into this book (a copy of it, at --out) instead of a copy of the input" },
  "in-place": { value: false, help: "rewrite the input book itself; only Fairlead's own sheets change" },
  "no-charts": { value: false, help: "leave the chart images out" },
  "no-checks": { value: false, help: "skip the stationarity, seasonality and nonlinearity checks" },
};

const PUBLISH_FLAGS: Record<string, FlagSpec> = {
  ...RUN_FLAGS,
  parts: { value: true, help: `what the published sheet shows: any of ${PUBLISH_PARTS.map((p) => p.part).join(",")} (default: all four)` },
  json: { value: false, help: "print JSON on stdout instead of the summary (the book is written all the same)" },
};

const FORECAST_FLAGS: Record<string, FlagSpec> = {
  ...COMMON,
  csv: { value: true, help: "a CSV file with a header line (instead of an .xlsx book)" },
  column: { value: true, help: "header of the rate column" },
};

const USAGE = `fairlead ${fairleadVersion()} — weekly freight-rate outlooks from the command line

  fairlead run <book.xlsx> [--sheet S] [--table T] [--column C …] [--dates D] [--horizon H]
               [--method M] [--methods a,b] [--backtest off|weeks=52,ahead=4,refit=every]
               [--coverage 80,95] [--out out.xlsx | --into other.xlsx | --in-place] [--json]
  fairlead publish <book.xlsx> [the options of run] [--parts outlook,season,checks,backtest]
               also writes Fairlead Published (plain values and charts for readers without
               the add-in), adds the run's forecasts to Fairlead Log (rows already there stay
               as they are) and rewrites Fairlead Track Record from the log and the rates
  fairlead forecast (--csv file.csv | <book.xlsx>) --column C [--dates D] [--horizon H]
               [--method M] [--coverage 80,95] [--json]
  fairlead help <verb>   every option of a verb

${CAUTION}
`;

/** The help of one verb (`fairlead help publish`): every option it takes, with what it does. */
function verbHelp(verb: string): string {
  const spec = verb === "run" ? RUN_FLAGS : verb === "publish" ? PUBLISH_FLAGS : verb === "forecast" ? FORECAST_FLAGS : null;
  if (!spec) throw new UsageError(`fairlead has no verb "${verb}"; use run, publish or forecast.`);
  const width = Math.max(...Object.keys(spec).map((k) => k.length + (spec[k].value ? 6 : 0)));
  const lines = Object.entries(spec).map(([k, f]) => `  --${`${k}${f.value ? " VALUE" : ""}`.padEnd(width)}  ${f.help}`);
  return `fairlead ${verb} — options:\n${lines.join("\n")}\n`;
}

/**
 * What the command line runs with: tests give an inline engine, a fixed time and their own
 * output (the progress bar still goes to the process's stderr unless --quiet).
 */
export interface CliContext {
  /** How the engine runs its jobs (default: worker threads). */
  transport?: Transport;
  /** The run's time (default: now). */
  now?: Date;
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
}

function choice(p: Parsed): ChoiceMetric | undefined {
  const c = flag(p, "choose");
  if (c === undefined) return undefined;
  const v = c.trim().toLowerCase();
  if (!["mase", "mape", "rmse", "smape"].includes(v)) throw new UsageError(`--choose takes mase, mape, rmse or smape; got "${c}".`);
  return v as ChoiceMetric;
}

function refitModes(text: string): RefitMode[] {
  return text.split(/[;/]/).map((m) => {
    const v = m.trim().toLowerCase();
    if (v === "every" || v === "fixed") return v;
    if (/^\d+$/.test(v) && Number(v) >= 1) return Number(v) === 1 ? "every" : Number(v);
    throw new UsageError(`refit takes every, fixed or a whole number of weeks; got "${m}".`);
  });
}

/** --backtest off | weeks=52,ahead=4,refit=every,windows=1 over the defaults. */
function backtestOption(p: Parsed, base: BacktestOptions | null | undefined): BacktestOptions | null {
  const v = flag(p, "backtest");
  const methods = list(p, "methods");
  if (v === undefined) return base ? { ...base, ...(methods ? { methods } : {}) } : methods ? { methods } : (base ?? null);
  if (v.trim().toLowerCase() === "off") {
    if (methods) throw new UsageError("--methods lists the methods a backtest compares; it cannot go with --backtest off.");
    return null;
  }
  const out: BacktestOptions = { ...(base ?? {}) };
  for (const part of v.split(",")) {
    const [key, raw] = part.split("=").map((x) => x?.trim());
    const whole = (what: string): number => {
      if (!raw || !/^\d+$/.test(raw) || Number(raw) < 1) throw new UsageError(`--backtest ${what} must be a whole number of at least 1; got "${raw ?? ""}".`);
      return Number(raw);
    };
    if (key === "weeks") out.testWeeks = whole("weeks");
    else if (key === "ahead") out.horizon = whole("ahead");
    else if (key === "windows") out.windows = whole("windows");
    else if (key === "refit" && raw) out.modes = refitModes(raw);
    else throw new UsageError(`--backtest takes off, or weeks=…, ahead=…, refit=…, windows=… separated by commas; got "${part}".`);
  }
  if (methods) out.methods = methods;
  return out;
}

function analysisOptions(p: Parsed, base: AnalysisOptions): AnalysisOptions {
  const o: AnalysisOptions = { ...base };
  const h = wholeFlag(p, "horizon", 1, 260);
  if (h !== undefined) o.horizon = h;
  const levels = levelsFlag(p, "coverage");
  if (levels) o.levels = levels;
  const m = flag(p, "method");
  if (m !== undefined) o.method = m.trim().toLowerCase();
  const c = choice(p);
  if (c) o.choose = c;
  const bt = backtestOption(p, o.method === "auto" || flag(p, "backtest") !== undefined || has(p, "methods") ? base.backtest : null);
  o.backtest = bt;
  if (o.method === "auto" && bt === null) throw new UsageError("--method auto chooses by backtest; it cannot go with --backtest off. Name a method instead.");
  if (has(p, "no-checks")) o.checks = false;
  if (has(p, "lunar-new-year")) o.calendar = { ...o.calendar, lunarNewYear: true };
  const events = list(p, "event-weeks");
  if (events) o.calendar = { ...o.calendar, events };
  return o;
}

function partsFlag(p: Parsed): PublishPart[] {
  const v = flag(p, "parts");
  if (v === undefined) return PUBLISH_PARTS.map((x) => x.part);
  try {
    return parseParts(v);
  } catch (e) {
    throw new UsageError(`--parts: ${e instanceof Error ? e.message : String(e)}`);
  }
}

/** `run`, and `publish`, which is a run that also publishes (one path: runBook). */
async function runVerb(verb: "run" | "publish", argv: string[], ctx: CliContext): Promise<number> {
  const publishing = verb === "publish";
  const p = parseArgs(argv, publishing ? PUBLISH_FLAGS : RUN_FLAGS, verb);
  if (p.positional.length !== 1) throw new UsageError(`${verb} takes one book: fairlead ${verb} <book.xlsx> [options]; got ${p.positional.length === 0 ? "none" : p.positional.join(" ")}.`);
  const json = has(p, "json");
  const options = analysisOptions(p, runDefaults());
  const parts = publishing ? partsFlag(p) : undefined;
  const progress = progressBar(process.stderr, !has(p, "quiet"));
  const result = await runBook(
    {
      book: p.positional[0],
      sheet: flag(p, "sheet"),
      table: flag(p, "table"),
      columns: list(p, "column"),
      dates: flag(p, "dates"),
      eventColumn: flag(p, "event-column"),
      options,
      out: flag(p, "out"),
      into: flag(p, "into"),
      inPlace: has(p, "in-place"),
      charts: !has(p, "no-charts"),
      workers: wholeFlag(p, "workers", 1, 64),
      transport: ctx.transport,
      now: ctx.now,
      ...(parts ? { publish: { parts } } : {}),
    },
    progress,
    publishing || !json || flag(p, "out") !== undefined || has(p, "in-place") || flag(p, "into") !== undefined,
  );
  const write = ctx.stdout ?? ((t: string) => void process.stdout.write(t));
  if (json) write(jsonText(runJson(fairleadVersion(), result.stamp.source, result.analysed, has(p, "timing"), result.seconds, result.publish)));
  else write(summaryText(result.stamp.source, result.analysed, result.written, result.seconds, result.warnings, result.publish, result.track));
  return EXIT_OK;
}

async function forecastVerb(argv: string[], ctx: CliContext): Promise<number> {
  const stdout = ctx.stdout ?? ((t: string) => void process.stdout.write(t));
  const p = parseArgs(argv, FORECAST_FLAGS, "forecast");
  const started = Date.now();
  const csv = flag(p, "csv");
  if (csv && p.positional.length > 0) throw new UsageError("forecast reads either --csv file.csv or one .xlsx book, not both.");
  if (!csv && p.positional.length !== 1) throw new UsageError("forecast needs --csv file.csv or one .xlsx book.");
  const block = csv ? csvBlock(csv) : bookBlock(await loadBook(p.positional[0]), p.positional[0], { sheet: flag(p, "sheet"), table: flag(p, "table") });
  const column = flag(p, "column");
  const eventColumn = flag(p, "event-column");
  const series = seriesOfBlock(block, column ? [column] : undefined, flag(p, "dates"), eventColumn);
  if (series.length !== 1) {
    throw new UsageError(`${block.label} has ${series.length} rate columns; name one with --column.`);
  }
  // A forecast needs no checks; a backtest only when the method is chosen by one.
  const options = withEventColumn(block, analysisOptions(p, { ...runDefaults(), checks: false }), eventColumn, flag(p, "dates"));
  const progress = progressBar(process.stderr, !has(p, "quiet") && options.method === "auto");
  const engine = createEngine(ctx.transport ?? new NodeTransport(), { size: wholeFlag(p, "workers", 1, 64) });
  let report: Report;
  try {
    report = await analyseInEngine(engine, series[0], options, { onProgress: (f, s) => progress.update(f, s) });
  } finally {
    engine.close();
  }
  progress.done();
  const seconds = (Date.now() - started) / 1000;
  const out = forecastJson(report, has(p, "timing") ? seconds : null);
  if (has(p, "json")) {
    stdout(jsonText(out));
    return EXIT_OK;
  }
  const levels = out.levels;
  const lines = [`${series[0].name ?? "Series"}: ${report.model.label}, ${out.chosen}; last week ${out.last_week ?? "undated"}`];
  const head = ["Step", "Week ending", "Forecast", ...levels.flatMap((l) => [`Low ${l}%`, `High ${l}%`])];
  lines.push(head.join("\t"));
  for (const f of out.forecast) {
    const cells = [String(f.step), f.week ?? "", f.point === null ? "" : f.point.toFixed(1)];
    for (const l of levels) {
      const lo = f.lower[String(l)];
      const hi = f.upper[String(l)];
      cells.push(lo === null || lo === undefined ? "" : lo.toFixed(1), hi === null || hi === undefined ? "" : hi.toFixed(1));
    }
    lines.push(cells.join("\t"));
  }
  // The terminal gets what was done to the data and how the method was chosen; the model's
  // own notes (every member's, for a combination) are in the JSON.
  const shown = out.warnings.filter((w) => series[0].warnings.includes(w) || w.startsWith("Chosen by "));
  for (const w of shown) lines.push(w);
  if (out.warnings.length > shown.length) { const k = out.warnings.length - shown.length; lines.push(`${k} note${k === 1 ? "" : "s"} on the fitted model: see --json.`); }
  lines.push(CAUTION);
  stdout(`${lines.join("\n")}\n`);
  return EXIT_OK;
}

export async function main(argv: string[], ctx: CliContext = {}): Promise<number> {
  const [verb, ...rest] = argv;
  const stdout = ctx.stdout ?? ((t: string) => void process.stdout.write(t));
  const stderr = ctx.stderr ?? ((t: string) => void process.stderr.write(t));
  try {
    if (verb === "run" || verb === "publish") return await runVerb(verb, rest, ctx);
    if (verb === "forecast") return await forecastVerb(rest, ctx);
    if (verb === undefined || verb === "help" || verb === "--help" || verb === "-h") {
      stdout(verb === "help" && rest.length > 0 ? verbHelp(rest[0]) : USAGE);
      return verb === undefined ? EXIT_BAD_INPUT : EXIT_OK;
    }
    if (verb === "--version") {
      stdout(`${fairleadVersion()}\n`);
      return EXIT_OK;
    }
    throw new UsageError(`fairlead has no verb "${verb}"; use run, publish or forecast (fairlead help lists their options).`);
  } catch (e) {
    if (isBadInput(e)) {
      stderr(`fairlead: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    const why = e instanceof Error ? (e.stack ?? e.message) : String(e);
    stderr(`fairlead: internal error, please report it with the command you ran:\n${why}\n`);
    return EXIT_INTERNAL;
  }
}

if (require.main === module) {
  main(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`fairlead: internal error: ${String(e)}\n`);
      process.exitCode = EXIT_INTERNAL;
    },
  );
}

