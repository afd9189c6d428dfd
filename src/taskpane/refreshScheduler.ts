/**
 * Turns the stream of change events from the workbook into analysis runs. A paste of next
 * week's row fires several events (one per area, table and sheet); running the models for
 * each would redo the same work and show half-pasted data, so runs wait for a quiet period
 * after the last change. Runs never overlap: a change during a run asks for one more run
 * after it, however many changes arrive meanwhile.
 *
 * Pure: the timers are passed in (the browser's by default), so tests drive the clock.
 */
export interface Timers {
  setTimeout(f: () => void, ms: number): unknown;
  clearTimeout(h: unknown): void;
}

export interface RefreshOptions {
  /** Quiet time after the last change before a run starts; 2000 ms by default. */
  quietMs?: number;
  timers?: Timers;
  /** Receives what a run threw; the scheduler keeps going. */
  onError?: (e: unknown) => void;
}

const DEFAULT_QUIET_MS = 2000;

// Looked up at call time, so fake timers installed after construction are honoured too.
const globalTimers: Timers = {
  setTimeout: (f, ms) => globalThis.setTimeout(f, ms),
  clearTimeout: (h) => globalThis.clearTimeout(h as ReturnType<typeof globalThis.setTimeout>),
};

export class RefreshScheduler {
  private readonly run: () => Promise<void>;
  private readonly quietMs: number;
  private readonly timers: Timers;
  private readonly onError: (e: unknown) => void;
  private timer: unknown = null;
  private waiting = false;
  private busy = false;
  private again = false;
  private disposed = false;

  constructor(run: () => Promise<void>, options: RefreshOptions = {}) {
    this.run = run;
    this.quietMs = options.quietMs ?? DEFAULT_QUIET_MS;
    if (!(this.quietMs >= 0) || !Number.isFinite(this.quietMs)) {
      throw new RangeError(`quietMs must be a non-negative number of milliseconds, not ${options.quietMs}.`);
    }
    this.timers = options.timers ?? globalTimers;
    // Without a handler a failed run must still be seen by whoever debugs the pane.
    this.onError = options.onError ?? ((e) => console.error("Fairlead: a refresh failed", e));
  }

  /** A change arrived: (re)start the quiet period, or, during a run, ask for one more run after it. */
  poke(): void {
    if (this.disposed) return;
    if (this.busy) {
      this.again = true;
      return;
    }
    this.startQuiet();
  }

  /** True while a run is waiting: in its quiet period, or asked for during the current run. */
  get pending(): boolean {
    return this.waiting || this.again;
  }

  get running(): boolean {
    return this.busy;
  }

  /** No more runs. A run in progress finishes, but nothing follows it. */
  dispose(): void {
    this.disposed = true;
    this.again = false;
    this.clearQuiet();
  }

  private startQuiet(): void {
    this.clearQuiet();
    this.waiting = true;
    this.timer = this.timers.setTimeout(() => {
      this.waiting = false;
      this.timer = null;
      void this.fire();
    }, this.quietMs);
  }

  private clearQuiet(): void {
    if (this.waiting) this.timers.clearTimeout(this.timer);
    this.waiting = false;
    this.timer = null;
  }

  private async fire(): Promise<void> {
    if (this.disposed) return;
    this.busy = true;
    try {
      await this.run();
    } catch (e) {
      this.report(e);
    } finally {
      this.busy = false;
    }
    if (this.again && !this.disposed) {
      this.again = false;
      // The changes that came during the run may be the start of another burst: wait again.
      this.startQuiet();
    }
  }

  private report(e: unknown): void {
    try {
      this.onError(e);
    } catch {
      // An error handler that throws must not stop later runs.
    }
  }
}
