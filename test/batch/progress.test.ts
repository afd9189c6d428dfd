import { progressBar } from "../../src/batch/progress";

/** A stand-in for process.stderr that records what is written. */
function stream(tty: boolean): { s: NodeJS.WriteStream; text: () => string } {
  let out = "";
  const s = { isTTY: tty, columns: 80, write: (chunk: string) => ((out += chunk), true) } as unknown as NodeJS.WriteStream;
  return { s, text: () => out };
}

describe("progressBar", () => {
  test("on a log: one line at each further tenth, never twice for the same tenth, nothing going back", () => {
    const { s, text } = stream(false);
    const bar = progressBar(s);
    for (const f of [0, 0.01, 0.05, 0.12, 0.11, 0.35, 0.36, 1]) bar.update(f, `at ${f}`);
    bar.done();
    expect(text().split("\n").filter(Boolean)).toEqual(["fairlead: 0% at 0", "fairlead: 10% at 0.12", "fairlead: 30% at 0.35", "fairlead: 100% at 1"]);
  });

  test("on a terminal: a bar redrawn in place, cleared at the end; long sentences cut to the width", () => {
    const { s, text } = stream(true);
    const bar = progressBar(s);
    bar.update(0.5, "x".repeat(200));
    bar.done();
    const drawn = text();
    expect(drawn.startsWith(`\r[${"#".repeat(12)}${"-".repeat(12)}]  50% `)).toBe(true);
    const line = drawn.split("\r")[1].replace("\x1b[K", "");
    expect([...line].length).toBeLessThanOrEqual(80);
    expect(drawn.endsWith("\r\x1b[K")).toBe(true);
  });

  test("quiet: nothing at all", () => {
    const { s, text } = stream(true);
    const bar = progressBar(s, false);
    bar.update(0.5, "x");
    bar.done();
    expect(text()).toBe("");
  });
});
