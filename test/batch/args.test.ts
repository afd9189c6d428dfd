import { levelsFlag, list, parseArgs, wholeFlag, type FlagSpec } from "../../src/batch/args";
import { UsageError } from "../../src/batch/errors";

const SPEC: Record<string, FlagSpec> = {
  column: { value: true, repeat: true, help: "a column" },
  horizon: { value: true, help: "weeks ahead" },
  coverage: { value: true, help: "levels" },
  json: { value: false, help: "json" },
};

describe("parseArgs", () => {
  test("values after the flag or after =, repeats collected, positionals kept in order", () => {
    const p = parseArgs(["book.xlsx", "--column", "A", "--column=B,C", "--horizon", "8", "--json"], SPEC, "run");
    expect(p.positional).toEqual(["book.xlsx"]);
    expect(list(p, "column")).toEqual(["A", "B", "C"]);
    expect(wholeFlag(p, "horizon", 1, 260)).toBe(8);
    expect(p.flags.has("json")).toBe(true);
  });

  test.each([
    [["--colour", "x"], /"run" has no option --colour; it takes --column/],
    [["--horizon"], /--horizon needs a value: weeks ahead/],
    [["--horizon", "4", "--horizon", "5"], /--horizon is given twice/],
    [["--json=yes"], /--json takes no value/],
  ])("%j is refused with a sentence", (argv, message) => {
    expect(() => parseArgs(argv, SPEC, "run")).toThrow(UsageError);
    expect(() => parseArgs(argv, SPEC, "run")).toThrow(message);
  });

  test("numbers are checked: whole weeks in range, coverage strictly between 0 and 100", () => {
    expect(() => wholeFlag(parseArgs(["--horizon", "2.5"], SPEC, "run"), "horizon", 1, 260)).toThrow(/whole number from 1 to 260; got "2.5"/);
    expect(() => wholeFlag(parseArgs(["--horizon", "300"], SPEC, "run"), "horizon", 1, 260)).toThrow(/from 1 to 260/);
    expect(levelsFlag(parseArgs(["--coverage", "80,95%"], SPEC, "run"), "coverage")).toEqual([80, 95]);
    expect(() => levelsFlag(parseArgs(["--coverage", "80,100"], SPEC, "run"), "coverage")).toThrow(/between 0 and 100/);
  });
});
