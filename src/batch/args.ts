/**
 * Command-line arguments: a verb, positional arguments and --flags, checked against what each
 * verb accepts, so a mistyped option is a one-line refusal instead of being ignored.
 */
import { UsageError } from "./errors";

export interface FlagSpec {
  /** Takes a value (--horizon 12) or stands alone (--json). */
  value: boolean;
  /** May be given more than once (values collected in order). */
  repeat?: boolean;
  help: string;
}

export interface Parsed {
  positional: string[];
  flags: Map<string, string[]>;
}

export function parseArgs(argv: readonly string[], spec: Record<string, FlagSpec>, verb: string): Parsed {
  const positional: string[] = [];
  const flags = new Map<string, string[]>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith("--") || a === "--") {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf("=");
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    const s = spec[name];
    if (!s) {
      const known = Object.keys(spec).map((k) => `--${k}`).join(", ");
      throw new UsageError(`"${verb}" has no option --${name}; it takes ${known}.`);
    }
    let value = "";
    if (s.value) {
      if (eq > 0) value = a.slice(eq + 1);
      else if (i + 1 < argv.length && !argv[i + 1].startsWith("--")) value = argv[++i];
      else throw new UsageError(`--${name} needs a value: ${s.help}`);
      if (value.trim() === "") throw new UsageError(`--${name} needs a value: ${s.help}`);
    } else if (eq > 0) {
      throw new UsageError(`--${name} takes no value.`);
    }
    const list = flags.get(name) ?? [];
    if (list.length > 0 && !s.repeat) throw new UsageError(`--${name} is given twice; give it once.`);
    list.push(value);
    flags.set(name, list);
  }
  return { positional, flags };
}

export function flag(p: Parsed, name: string): string | undefined {
  return p.flags.get(name)?.[0];
}

export function has(p: Parsed, name: string): boolean {
  return p.flags.has(name);
}

/** A comma-separated or repeated list option: --column A --column B, or --column "A,B". */
export function list(p: Parsed, name: string): string[] | undefined {
  const v = p.flags.get(name);
  if (!v) return undefined;
  return v.flatMap((x) => x.split(",")).map((x) => x.trim()).filter((x) => x.length > 0);
}

export function wholeFlag(p: Parsed, name: string, min: number, max: number): number | undefined {
  const v = flag(p, name);
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!/^\s*\d+\s*$/.test(v) || n < min || n > max) {
    throw new UsageError(`--${name} must be a whole number from ${min} to ${max}; got "${v}".`);
  }
  return n;
}

export function levelsFlag(p: Parsed, name: string): number[] | undefined {
  const items = list(p, name);
  if (!items) return undefined;
  return items.map((x) => {
    const n = Number(x.replace(/%$/, ""));
    if (!Number.isFinite(n) || n <= 0 || n >= 100) {
      throw new UsageError(`--${name} takes coverage levels in percent between 0 and 100, such as 80,95; got "${x}".`);
    }
    return n;
  });
}
