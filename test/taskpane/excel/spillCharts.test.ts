/**
 * extendSpillCharts against office-addin-mock: a workbook with a user chart over a
 * =FAIRLEAD.DECOMPOSE spill that grew by a week, a chart over plain cells, a chart over a
 * spill of another function, and one of the pane's own charts. The mock answers a property
 * only after load and sync; collections load "items/…" the way Excel does (load `items`,
 * then the named properties on every item), which the mock itself does not model.
 */
import { OfficeMockObject } from "office-addin-mock";
import { mockCollection } from "./mockCollection";

import { canReadSeriesSources, extendSpillCharts } from "../../../src/taskpane/excel/spillCharts";
import { parseAddress } from "../../../src/taskpane/spillAddress";

type Data = Record<string, unknown>;

interface SpillDef {
  /** Where the spill is now, as Range.address gives it. */
  address: string;
  formula: string;
}

interface SeriesDef {
  name: string;
  categories: string;
  values: string;
  /** The host cannot give this series' sources (a pivot chart, say): the batch fails. */
  refuses?: boolean;
}

interface SeriesSeen {
  valuesTo?: { sheet: string; address: string };
  xTo?: { sheet: string; address: string };
  asked: string[];
}

class Book {
  private mocks: OfficeMockObject[] = [];
  syncs = 0;
  failNextSync = false;
  series = new Map<string, SeriesSeen>();
  seriesLoads: string[] = [];

  mock<T>(data: Data): T {
    const m = new OfficeMockObject(data);
    this.mocks.push(m);
    return m as unknown as T;
  }

  /** A mock whose isNullObject is set as Excel sets it on sync (not a loadable property). */
  nullable(data: Data, isNull: boolean): OfficeMockObject {
    const m = this.mock<OfficeMockObject>(data);
    (m as unknown as { isNullObject: boolean }).isNullObject = isNull;
    return m;
  }

  collection(items: OfficeMockObject[], onLoad?: () => void): Data {
    return mockCollection(items, {}, onLoad);
  }

  seriesMock(chart: string, d: SeriesDef): OfficeMockObject {
    const seen: SeriesSeen = { asked: [] };
    this.series.set(`${chart}/${d.name}`, seen);
    const book = this;
    return this.mock({
      name: d.name,
      getDimensionDataSourceString(dim: string) {
        seen.asked.push(dim);
        if (d.refuses) book.failNextSync = true;
        return { value: dim === "Categories" ? d.categories : dim === "Values" ? d.values : "" };
      },
      setValues(r: { sheet: string; address: string }) {
        seen.valuesTo = r;
      },
      setXAxisValues(r: { sheet: string; address: string }) {
        seen.xTo = r;
      },
    });
  }

  chartMock(name: string, series: SeriesDef[]): OfficeMockObject {
    return this.mock({
      name,
      chartType: "Line",
      series: this.collection(
        series.map((s) => this.seriesMock(name, s)),
        () => this.seriesLoads.push(name),
      ),
    });
  }

  sheetMock(name: string, charts: OfficeMockObject[], spills: SpillDef[]): OfficeMockObject {
    const book = this;
    const rects = spills.map((s) => ({ def: s, rect: parseAddress(s.address) }));
    return this.mock({
      name,
      charts: this.collection(charts),
      getCell(row: number, col: number) {
        const hit = rects.find(({ rect }) => rect && row >= rect.firstRow && row <= rect.lastRow && col >= rect.firstCol && col <= rect.lastCol);
        const spill = hit ? book.nullable({ address: hit.def.address }, false) : null;
        const parent = hit
          ? book.nullable({ formulas: [[hit.def.formula]], getSpillingToRangeOrNullObject: () => spill }, false)
          : book.nullable({ formulas: [[""]] }, true);
        return { getSpillParentOrNullObject: () => parent };
      },
      getRange(address: string) {
        return { sheet: name, address };
      },
    });
  }

  context(sheets: OfficeMockObject[]): Excel.RequestContext {
    const workbook = this.mock({ worksheets: this.collection(sheets) });
    return {
      workbook,
      sync: async () => {
        this.syncs++;
        if (this.failNextSync) {
          this.failNextSync = false;
          throw new Error("GeneralException");
        }
        for (const m of this.mocks) await m.sync();
        // The mock copies loaded values up to parents in later microtasks: let them run.
        await new Promise((r) => setImmediate(r));
      },
    } as unknown as Excel.RequestContext;
  }
}

const always = (): boolean => true;

/** The desk's book: the decomposition spilled from A4 (its header row) to D61 after a week was pasted. */
function deskBook(spillEnd = 61, extra: { refusing?: boolean } = {}): { book: Book; context: Excel.RequestContext } {
  const book = new Book();
  const decomp = book.sheetMock(
    "Decomp sheet",
    [
      book.chartMock("Lane trend", [{ name: "Trend", categories: "'Decomp sheet'!$A$5:$A$60", values: "'Decomp sheet'!$C$5:$C$60" }]),
      book.chartMock("Fairlead outlook-halden_corvane_feu", [{ name: "History", categories: "'Decomp sheet'!$A$5:$A$60", values: "'Decomp sheet'!$B$5:$B$60" }]),
      ...(extra.refusing ? [book.chartMock("Pivot view", [{ name: "Sum", categories: "", values: "", refuses: true }])] : []),
    ],
    [{ address: `'Decomp sheet'!A4:D${spillEnd}`, formula: "=fairlead.decompose(Rates!A1:B200)" }],
  );
  const rates = book.sheetMock(
    "Rates",
    [
      book.chartMock("Raw rates", [{ name: "Rate", categories: "Rates!$A$2:$A$50", values: "Rates!$B$2:$B$50" }]),
      book.chartMock("Steps", [{ name: "Step", categories: "", values: "Rates!$D$2:$D$60" }]),
    ],
    [{ address: "Rates!D2:D71", formula: "=SEQUENCE(70)" }],
  );
  return { book, context: book.context([decomp, rates]) };
}

describe("extendSpillCharts", () => {
  test("a user chart over a FAIRLEAD.DECOMPOSE column C5:C60, the spill now to row 61, reads C5:C61", async () => {
    const { book, context } = deskBook();
    const changes = await extendSpillCharts(context, always);
    expect(changes).toEqual([
      { sheet: "Decomp sheet", chart: "Lane trend", series: "Trend", from: "'Decomp sheet'!$A$5:$A$60", to: "'Decomp sheet'!$A$5:$A$61" },
      { sheet: "Decomp sheet", chart: "Lane trend", series: "Trend", from: "'Decomp sheet'!$C$5:$C$60", to: "'Decomp sheet'!$C$5:$C$61" },
    ]);
    const trend = book.series.get("Lane trend/Trend");
    expect(trend?.valuesTo).toEqual({ sheet: "Decomp sheet", address: "$C$5:$C$61" });
    expect(trend?.xTo).toEqual({ sheet: "Decomp sheet", address: "$A$5:$A$61" });
    // Sheets, charts, series, sources, spill parents, spill ranges, writes: independent of how many charts.
    expect(book.syncs).toBe(7);
  });

  test("a spill that shrank shortens the series", async () => {
    const { book, context } = deskBook(55);
    const changes = await extendSpillCharts(context, always);
    expect(changes.map((c) => c.to)).toEqual(["'Decomp sheet'!$A$5:$A$55", "'Decomp sheet'!$C$5:$C$55"]);
    expect(book.series.get("Lane trend/Trend")?.valuesTo?.address).toBe("$C$5:$C$55");
  });

  test("charts over plain cells and over other functions' spills are left alone", async () => {
    const { book, context } = deskBook();
    await extendSpillCharts(context, always);
    for (const key of ["Raw rates/Rate", "Steps/Step"]) {
      const s = book.series.get(key);
      expect(s?.asked).toEqual(["Categories", "Values"]);
      expect(s?.valuesTo).toBeUndefined();
      expect(s?.xTo).toBeUndefined();
    }
  });

  test("the pane's own charts are skipped without reading their series", async () => {
    const { book, context } = deskBook();
    await extendSpillCharts(context, always);
    expect(book.seriesLoads).not.toContain("Fairlead outlook-halden_corvane_feu");
    expect(book.series.get("Fairlead outlook-halden_corvane_feu/History")?.asked).toEqual([]);
  });

  test("nothing already in step: no change and no write round trip", async () => {
    const { book, context } = deskBook(60);
    expect(await extendSpillCharts(context, always)).toEqual([]);
    expect(book.syncs).toBe(6);
  });

  test("a chart whose sources the host refuses is passed over; the others are still followed", async () => {
    const { book, context } = deskBook(61, { refusing: true });
    const changes = await extendSpillCharts(context, always);
    expect(changes.map((c) => `${c.chart}: ${c.to}`)).toEqual(["Lane trend: 'Decomp sheet'!$A$5:$A$61", "Lane trend: 'Decomp sheet'!$C$5:$C$61"]);
    expect(book.series.get("Pivot view/Sum")?.valuesTo).toBeUndefined();
  });

  test("without ExcelApi 1.15 nothing is read or changed", async () => {
    const { book, context } = deskBook();
    expect(await extendSpillCharts(context, () => false)).toEqual([]);
    expect(book.syncs).toBe(0);
  });
});

describe("canReadSeriesSources", () => {
  const g = globalThis as unknown as { Office?: unknown };
  afterEach(() => {
    delete g.Office;
  });

  test("asks the host for ExcelApi 1.15", () => {
    const asked: string[] = [];
    g.Office = { context: { requirements: { isSetSupported: (set: string, version: string) => (asked.push(`${set} ${version}`), version === "1.15") } } };
    expect(canReadSeriesSources()).toBe(true);
    expect(asked).toEqual(["ExcelApi 1.15"]);
    g.Office = { context: { requirements: { isSetSupported: () => false } } };
    expect(canReadSeriesSources()).toBe(false);
  });

  test("is false outside Office", () => {
    expect(canReadSeriesSources()).toBe(false);
  });
});
