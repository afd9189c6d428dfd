/** Reads a committed reference fixture written by test/reference/generate.py. */
import * as fs from "fs";
import * as path from "path";

function revive(v: unknown): unknown {
  if (v === "NaN") return NaN;
  if (v === "Infinity") return Infinity;
  if (v === "-Infinity") return -Infinity;
  if (Array.isArray(v)) return v.map(revive);
  if (v && typeof v === "object") {
    const out: Record<string, unknown> = {};
    for (const [k, x] of Object.entries(v)) out[k] = revive(x);
    return out;
  }
  return v;
}

export function loadFixture<T>(file: string): T {
  const p = path.join(__dirname, "reference", "fixtures", file);
  const raw = JSON.parse(fs.readFileSync(p, "utf8")) as { data: unknown };
  return revive(raw.data) as T;
}
