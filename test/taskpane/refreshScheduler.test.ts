import { RefreshScheduler, Timers } from "../../src/taskpane/refreshScheduler";

/** A run that stays in progress until the test finishes it. */
function controlledRun(): { run: jest.Mock<Promise<void>, []>; finish: (error?: Error) => Promise<void> } {
  let settle: ((e?: Error) => void) | null = null;
  const run = jest.fn(
    () =>
      new Promise<void>((resolve, reject) => {
        settle = (e) => (e ? reject(e) : resolve());
      }),
  );
  return {
    run,
    finish: async (error?: Error) => {
      if (!settle) throw new Error("no run in progress");
      const s = settle;
      settle = null;
      s(error);
      // Let the scheduler's await and finally block run.
      await Promise.resolve();
      await Promise.resolve();
      await Promise.resolve();
    },
  };
}

beforeEach(() => jest.useFakeTimers());
afterEach(() => jest.useRealTimers());

describe("RefreshScheduler", () => {
  it("gives one run for a burst of changes, after the quiet period that follows the last", async () => {
    const run = jest.fn(async () => undefined);
    const s = new RefreshScheduler(run, { quietMs: 2000 });
    s.poke();
    jest.advanceTimersByTime(1500);
    s.poke(); // a paste fires several events in a row
    jest.advanceTimersByTime(1500);
    s.poke();
    expect(s.pending).toBe(true);
    jest.advanceTimersByTime(1999);
    expect(run).not.toHaveBeenCalled();
    jest.advanceTimersByTime(1);
    expect(run).toHaveBeenCalledTimes(1);
    await Promise.resolve();
    await Promise.resolve();
    expect(s.pending).toBe(false);
    expect(s.running).toBe(false);
    jest.advanceTimersByTime(10_000);
    expect(run).toHaveBeenCalledTimes(1);
  });

  it("waits 2 seconds by default", () => {
    const run = jest.fn(async () => undefined);
    const s = new RefreshScheduler(run);
    s.poke();
    jest.advanceTimersByTime(1999);
    expect(run).not.toHaveBeenCalled();
    jest.advanceTimersByTime(1);
    expect(run).toHaveBeenCalledTimes(1);
  });

  it("runs exactly once more after a run during which changes arrived, never two at once", async () => {
    const { run, finish } = controlledRun();
    const s = new RefreshScheduler(run, { quietMs: 500 });
    s.poke();
    jest.advanceTimersByTime(500);
    expect(run).toHaveBeenCalledTimes(1);
    expect(s.running).toBe(true);

    s.poke();
    s.poke();
    jest.advanceTimersByTime(5000); // however long the run takes, no second run starts
    expect(run).toHaveBeenCalledTimes(1);
    expect(s.pending).toBe(true);

    await finish();
    expect(s.running).toBe(false);
    expect(s.pending).toBe(true);
    jest.advanceTimersByTime(499); // the quiet period again
    expect(run).toHaveBeenCalledTimes(1);
    jest.advanceTimersByTime(1);
    expect(run).toHaveBeenCalledTimes(2);

    await finish();
    jest.advanceTimersByTime(10_000);
    expect(run).toHaveBeenCalledTimes(2);
    expect(s.pending).toBe(false);
  });

  it("runs nothing after dispose, and clears a waiting timer", async () => {
    const cleared: unknown[] = [];
    const timers: Timers = {
      setTimeout: (f, ms) => setTimeout(f, ms),
      clearTimeout: (h) => {
        cleared.push(h);
        clearTimeout(h as ReturnType<typeof setTimeout>);
      },
    };
    const run = jest.fn(async () => undefined);
    const s = new RefreshScheduler(run, { quietMs: 100, timers });
    s.poke();
    s.dispose();
    expect(cleared).toHaveLength(1);
    expect(s.pending).toBe(false);
    jest.advanceTimersByTime(1000);
    s.poke();
    jest.advanceTimersByTime(1000);
    expect(run).not.toHaveBeenCalled();
    expect(jest.getTimerCount()).toBe(0);
  });

  it("lets a run in progress finish after dispose, with nothing after it", async () => {
    const { run, finish } = controlledRun();
    const s = new RefreshScheduler(run, { quietMs: 100 });
    s.poke();
    jest.advanceTimersByTime(100);
    s.poke();
    s.dispose();
    await finish();
    jest.advanceTimersByTime(1000);
    expect(run).toHaveBeenCalledTimes(1);
    expect(s.pending).toBe(false);
  });

  it("reports a failed run and keeps running later ones", async () => {
    const { run, finish } = controlledRun();
    const errors: unknown[] = [];
    const s = new RefreshScheduler(run, { quietMs: 100, onError: (e) => errors.push(e) });
    s.poke();
    jest.advanceTimersByTime(100);
    s.poke(); // asked for during the failing run
    const failure = new Error("sheet busy");
    await finish(failure);
    expect(errors).toEqual([failure]);
    jest.advanceTimersByTime(100);
    expect(run).toHaveBeenCalledTimes(2);
    await finish();

    s.poke();
    jest.advanceTimersByTime(100);
    expect(run).toHaveBeenCalledTimes(3);
    await finish(new Error("again"));
    expect(errors).toHaveLength(2);
    expect(s.running).toBe(false);
  });

  it("survives a run that throws before returning a promise and an error handler that throws", async () => {
    let calls = 0;
    const run = (): Promise<void> => {
      calls++;
      throw new Error("not even a promise");
    };
    const s = new RefreshScheduler(run, {
      quietMs: 10,
      onError: () => {
        throw new Error("handler failed");
      },
    });
    s.poke();
    jest.advanceTimersByTime(10);
    await Promise.resolve();
    await Promise.resolve();
    s.poke();
    jest.advanceTimersByTime(10);
    expect(calls).toBe(2);
  });

  it("uses the timers it is given", () => {
    const queued: { f: () => void; ms: number }[] = [];
    const timers: Timers = {
      setTimeout: (f, ms) => queued.push({ f, ms }),
      clearTimeout: () => undefined,
    };
    const run = jest.fn(async () => undefined);
    new RefreshScheduler(run, { quietMs: 750, timers }).poke();
    expect(queued.map((q) => q.ms)).toEqual([750]);
    queued[0].f();
    expect(run).toHaveBeenCalledTimes(1);
  });

  it("refuses a negative quiet period", () => {
    expect(() => new RefreshScheduler(async () => undefined, { quietMs: -1 })).toThrow(RangeError);
  });
});
