/** Shared pieces of the engine tests. */
import type { BacktestPlan, BacktestRun } from "../../src/core/evaluate/backtest";

export interface ProgressEvent {
  fraction: number;
  sentence: string;
}

export function progressRecorder(): { events: ProgressEvent[]; listener: (fraction: number, sentence: string) => void } {
  const events: ProgressEvent[] = [];
  return { events, listener: (fraction, sentence) => events.push({ fraction, sentence }) };
}

/** Progress arrived, never went down, ended at exactly 1, and every event had a sentence. */
export function expectWellFormedProgress(events: ProgressEvent[]): void {
  expect(events.length).toBeGreaterThan(0);
  for (let i = 1; i < events.length; i++) expect(events[i].fraction).toBeGreaterThanOrEqual(events[i - 1].fraction);
  expect(events[events.length - 1].fraction).toBe(1);
  for (const e of events) {
    expect(e.fraction).toBeGreaterThanOrEqual(0);
    expect(typeof e.sentence).toBe("string");
    expect(e.sentence.length).toBeGreaterThan(0);
  }
}

/** The backtest plan of the brief: one window of 8 origins at the end, horizon 4, levels 80 and 95. */
export function smallPlan(n: number): BacktestPlan {
  return {
    n,
    horizon: 4,
    levels: [80, 95],
    windows: [{ first: n - 8, last: n - 1 }],
    methods: ["lastweek", "drift"],
    combos: [],
    modes: ["fixed"],
  };
}

/** A backtest run without its timing, which is the one field that differs run to run. */
export function withoutTiming(run: BacktestRun): Omit<BacktestRun, "milliseconds"> {
  const { milliseconds, ...rest } = run;
  void milliseconds;
  return rest;
}

/** The rejection of a promise (fails the test if it resolves). */
export async function rejectionOf(p: Promise<unknown>): Promise<unknown> {
  try {
    await p;
  } catch (e) {
    return e;
  }
  throw new Error("expected the promise to reject");
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}
