/**
 * The pane's form and the analysis options it stands for.
 */
import { runDefaults } from "../../src/core/present/defaults";
import { defaultForm, formFromOptions, optionsFromForm, parseCoverage, type PaneForm } from "../../src/taskpane/form";

describe("the pane's form", () => {
  it("starts from the batch runner's defaults, so Run alone gives what `fairlead run` gives", () => {
    const { options, problems } = optionsFromForm(defaultForm());
    expect(problems).toEqual([]);
    expect(options).toEqual(runDefaults());
  });

  it("reads coverage the way people type it", () => {
    expect(parseCoverage("80, 95")).toEqual([80, 95]);
    expect(parseCoverage("95% 80%")).toEqual([80, 95]);
    expect(parseCoverage("90;90")).toEqual([90]);
    expect(parseCoverage("")).toBeNull();
    expect(parseCoverage("80, 100")).toBeNull();
    expect(parseCoverage("eighty")).toBeNull();
  });

  it("names each field to correct", () => {
    const f: PaneForm = { ...defaultForm(), horizon: "0", coverage: "120", testWeeks: "x", refit: "interval", refitEvery: "1" };
    const { problems } = optionsFromForm(f);
    expect(problems.map((p) => p.field)).toEqual(["horizon", "coverage", "testWeeks", "refitEvery"]);
    expect(problems[0].message).toMatch(/1 to 260/);
  });

  it("refuses auto without a backtest, and leaves the backtest out for a named method without one", () => {
    expect(optionsFromForm({ ...defaultForm(), backtest: false }).problems.map((p) => p.field)).toEqual(["backtest"]);
    const { options } = optionsFromForm({ ...defaultForm(), method: "tbats", backtest: false });
    expect(options.backtest).toBeUndefined();
    expect(options.method).toBe("tbats");
  });

  it.each<[string, Partial<PaneForm>]>([
    ["defaults", {}],
    ["SARIMA with the lunar new year, additive, STL", { method: "sarima", lunarNewYear: true, seasonKind: "additive", decompose: true }],
    ["SARIMA with the lunar new year and two event weeks", { method: "sarima", lunarNewYear: true, eventWeeks: "2024-10-01, 2025-03-04" }],
    ["both refit modes over three windows", { refit: "both", windows: "3", testWeeks: "26", backtestHorizon: "8" }],
    ["re-estimation every 4 weeks", { refit: "interval", refitEvery: "4" }],
    ["no checks, 90% only, 26 weeks", { checks: false, coverage: "90", horizon: "26", method: "nnar", backtest: false }],
  ])("fills back in from the options it made: %s", (_, change) => {
    const f = { ...defaultForm(), ...change };
    const { options, problems } = optionsFromForm(f);
    expect(problems).toEqual([]);
    const back = formFromOptions(options);
    expect(optionsFromForm(back).options).toEqual(options);
    expect(back.method).toBe(f.method);
    expect(back.refit).toBe(f.refit);
  });

  it("reads event weeks separated by commas, spaces or lines, and names the field when one is not a date", () => {
    const { options, problems } = optionsFromForm({ ...defaultForm(), eventWeeks: "2024-10-01,2025-03-04\n 2026-02-17" });
    expect(problems).toEqual([]);
    expect(options.calendar).toEqual({ events: ["2024-10-01", "2025-03-04", "2026-02-17"] });
    expect(optionsFromForm({ ...defaultForm(), eventWeeks: "" }).options.calendar).toBeUndefined();
    const bad = optionsFromForm({ ...defaultForm(), eventWeeks: "2024-10-01, 4 March" });
    expect(bad.problems.map((p) => p.field)).toEqual(["eventWeeks"]);
    expect(bad.problems[0].message).toMatch(/^Event weeks: dates written YYYY-MM-DD/);
  });

  it("maps the re-estimation choice to the backtest's modes", () => {
    const modes = (refit: PaneForm["refit"]) => optionsFromForm({ ...defaultForm(), refit, refitEvery: "6" }).options.backtest?.modes;
    expect(modes("every")).toEqual(["every"]);
    expect(modes("fixed")).toEqual(["fixed"]);
    expect(modes("both")).toEqual(["every", "fixed"]);
    expect(modes("interval")).toEqual([6]);
  });
});
