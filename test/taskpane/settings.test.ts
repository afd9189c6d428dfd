/**
 * The pane's settings as read back from a workbook: what can be used is kept, the rest is
 * dropped with a sentence.
 */
import { ledgerOf } from "../../src/taskpane/ledger";
import { parseSettings, storedSeries, withSeries, withoutSeries, type SavedSeries } from "../../src/taskpane/settings";

const A: SavedSeries = { source: { kind: "table", table: "WeeklyRates", rates: "Halden–Corvane FEU", dates: "Week ending" }, name: "Halden–Corvane FEU", options: { method: "auto" } };
const B: SavedSeries = { source: { kind: "range", sheet: "Rates", ratesColumn: 2, datesColumn: 0, top: 0, header: true }, name: "Corvane–Estmar FEU", options: { method: "tbats", horizon: 8 } };

describe("pane settings", () => {
  it("round-trip through JSON", () => {
    const ledgers = { "Fairlead Outlook": ledgerOf("Fairlead Outlook", [["x", 1]]) };
    const stored = JSON.parse(JSON.stringify(storedSeries({ series: [A, B], watch: false, ledgers })));
    const { settings, problems } = parseSettings(stored, JSON.parse(JSON.stringify(ledgers)));
    expect(problems).toEqual([]);
    expect(settings).toEqual({ series: [A, B], watch: false, ledgers });
  });

  it("drop what they cannot use, and say so", () => {
    const { settings, problems } = parseSettings(
      { version: 1, watch: true, series: [A, { source: { kind: "range", sheet: "Rates" }, name: "x", options: {} }] },
      { "Fairlead Outlook": { sheet: "Fairlead Outlook", rows: "two" }, "Fairlead Season": ledgerOf("Fairlead Season", [[1]]) },
    );
    expect(settings.series).toEqual([A]);
    expect(Object.keys(settings.ledgers)).toEqual(["Fairlead Season"]);
    expect(problems).toHaveLength(2);
    expect(problems[0]).toMatch(/One saved series could not be read back/);
    expect(problems[1]).toMatch(/Fairlead Outlook is unreadable/);
    expect(parseSettings({ version: 2, series: [] }, null).problems[0]).toMatch(/not in a form this version/);
    expect(parseSettings(null, null)).toEqual({ settings: { series: [], watch: true, ledgers: {} }, problems: [] });
  });

  it("replace a series from the same source in place, and remove one", () => {
    const A2 = { ...A, options: { method: "sarima" } };
    expect(withSeries([A, B], A2)).toEqual([A2, B]);
    expect(withSeries([A], B)).toEqual([A, B]);
    expect(withoutSeries([A, B], { ...A.source })).toEqual([B]);
  });
});
