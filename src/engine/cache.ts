/**
 * The result cache: job key (hash.ts `jobKey`) → output, least recently used first out,
 * bounded by a number of entries. It holds its own copy of each output and hands out copies
 * (structured clones), so a caller that edits a result cannot change what the next caller
 * gets. In the shared runtime one cache serves the worksheet functions and the pane.
 */

export interface CacheStats {
  entries: number;
  maxEntries: number;
  hits: number;
  misses: number;
}

export const DEFAULT_CACHE_ENTRIES = 128;

/** structuredClone where the host has it (Node ≥ 17, current browsers); the value itself otherwise. */
export function copyOf<T>(value: T): T {
  const clone = (globalThis as { structuredClone?: <V>(v: V) => V }).structuredClone;
  return clone ? clone(value) : value;
}

export class ResultCache {
  readonly maxEntries: number;
  // A Map iterates in insertion order: re-inserting on every hit keeps the oldest first.
  private readonly entries = new Map<string, { value: unknown }>();
  private hitCount = 0;
  private missCount = 0;

  constructor(maxEntries: number = DEFAULT_CACHE_ENTRIES) {
    if (!Number.isInteger(maxEntries) || maxEntries < 1) {
      throw new RangeError(`the result cache needs room for at least one entry; got ${maxEntries}`);
    }
    this.maxEntries = maxEntries;
  }

  /** A copy of the stored output (and marks it recently used), or undefined on a miss. */
  get(key: string): { value: unknown } | undefined {
    const e = this.entries.get(key);
    if (!e) {
      this.missCount++;
      return undefined;
    }
    this.hitCount++;
    this.entries.delete(key);
    this.entries.set(key, e);
    return { value: copyOf(e.value) };
  }

  has(key: string): boolean {
    return this.entries.has(key);
  }

  /** Stores a copy of `value`, evicting the least recently used entries beyond the bound. */
  set(key: string, value: unknown): void {
    this.entries.delete(key);
    this.entries.set(key, { value: copyOf(value) });
    while (this.entries.size > this.maxEntries) {
      const oldest = this.entries.keys().next().value as string;
      this.entries.delete(oldest);
    }
  }

  delete(key: string): boolean {
    return this.entries.delete(key);
  }

  clear(): void {
    this.entries.clear();
  }

  get size(): number {
    return this.entries.size;
  }

  /** Keys from least to most recently used. */
  keys(): string[] {
    return [...this.entries.keys()];
  }

  stats(): CacheStats {
    return { entries: this.entries.size, maxEntries: this.maxEntries, hits: this.hitCount, misses: this.missCount };
  }
}
