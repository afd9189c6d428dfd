/**
 * functions.json as Excel reads it, generated from the JSDoc of src/functions/functions.ts by
 * custom-functions-metadata (the generator the build's webpack plugin runs): the names, each
 * function's parameters in order with their optionality and shape, the spilled (matrix)
 * results, and a description with an example for every function and argument, which the
 * formula bar shows while a formula is typed.
 */
import * as path from "path";
import { generateCustomFunctionsMetadata } from "custom-functions-metadata";

interface Param {
  name: string;
  description?: string;
  type: string;
  dimensionality?: string;
  optional?: boolean;
}
interface Fn {
  id: string;
  name: string;
  description?: string;
  parameters: Param[];
  result: { dimensionality?: string };
}

let functions: Fn[];

beforeAll(async () => {
  const result = await generateCustomFunctionsMetadata(path.join(__dirname, "..", "..", "src", "functions", "functions.ts"));
  expect(result.errors).toEqual([]);
  functions = (JSON.parse(result.metadataJson) as { functions: Fn[] }).functions;
}, 60_000);

// Name: [parameter, optional, shape] in order. The shapes are the contract with the sheet:
// ranges come as matrices, single values as scalars.
const EXPECTED: Record<string, [string, boolean, "matrix" | "scalar"][]> = {
  OUTLOOK: [["rates", false, "matrix"], ["weeks", false, "scalar"], ["method", true, "scalar"], ["coverage", true, "matrix"], ["dates", true, "matrix"], ["headers", true, "scalar"], ["lunar_new_year", true, "scalar"], ["event_weeks", true, "matrix"]],
  MEANAHEAD: [["rates", false, "matrix"], ["from_week", false, "scalar"], ["to_week", false, "scalar"], ["method", true, "scalar"], ["coverage", true, "matrix"], ["dates", true, "matrix"], ["headers", true, "scalar"], ["lunar_new_year", true, "scalar"], ["event_weeks", true, "matrix"]],
  CHANCE: [["rates", false, "matrix"], ["level", false, "scalar"], ["week", false, "scalar"], ["direction", true, "scalar"], ["method", true, "scalar"], ["dates", true, "matrix"], ["headers", true, "scalar"], ["lunar_new_year", true, "scalar"], ["event_weeks", true, "matrix"]],
  WEEKFACTORS: [["rates", false, "matrix"], ["dates", true, "matrix"], ["kind", true, "scalar"], ["headers", true, "scalar"]],
  DECOMPOSE: [["rates", false, "matrix"], ["dates", true, "matrix"], ["headers", true, "scalar"]],
  STATIONARITY: [["rates", false, "matrix"], ["transform", true, "scalar"], ["headers", true, "scalar"]],
  NONLINEARITY: [["rates", false, "matrix"], ["headers", true, "scalar"]],
  BACKTEST: [["rates", false, "matrix"], ["test_weeks", true, "scalar"], ["horizon", true, "scalar"], ["refit", true, "scalar"], ["methods", true, "matrix"], ["headers", true, "scalar"]],
  FITSUMMARY: [["rates", false, "matrix"], ["method", true, "scalar"], ["headers", true, "scalar"]],
};

describe("functions.json", () => {
  test("declares exactly the DESIGN.md functions, under their own names", () => {
    expect(functions.map((f) => f.id).sort()).toEqual(Object.keys(EXPECTED).sort());
    for (const f of functions) expect(f.name).toBe(f.id);
  });

  test.each(Object.entries(EXPECTED))("%s: parameters, optionality and shapes in order; a spilled result", (id, params) => {
    const f = functions.find((x) => x.id === id) as Fn;
    expect(f.parameters.map((p) => [p.name, p.optional === true, p.dimensionality ?? "scalar"])).toEqual(params);
    expect(f.result.dimensionality).toBe("matrix");
    // Optional arguments come after the required ones (Excel's rule for custom functions).
    const firstOptional = f.parameters.findIndex((p) => p.optional);
    if (firstOptional >= 0) expect(f.parameters.slice(firstOptional).every((p) => p.optional)).toBe(true);
  });

  test("every function and every argument has a description; every argument gives an example", () => {
    for (const f of functions) {
      expect(f.description).toMatch(/^[A-Z].{20,}\.$/);
      for (const p of f.parameters) {
        expect(p.description ?? "").toMatch(/such as/);
      }
    }
  });
});
