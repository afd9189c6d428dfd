/** The worker-side loop (worker.ts) over a stand-in port, with a hand-driven clock. */
import { InputError } from "../../src/core/series/errors";
import type { JobDefinition } from "../../src/engine/jobs";
import type { JobRequest, WorkerReply } from "../../src/engine/protocol";
import { serve } from "../../src/engine/worker";

function harness(jobs: Record<string, JobDefinition>, clock: { t: number }) {
  const replies: WorkerReply[] = [];
  let deliver: ((m: JobRequest) => void) | null = null;
  serve(
    {
      // structuredClone, as postMessage does: an output that cannot be cloned throws here.
      postMessage: (m) => replies.push(structuredClone(m)),
      onMessage: (h) => {
        deliver = h;
      },
    },
    { lookup: (k) => jobs[k], now: () => clock.t },
  );
  const send = async (m: JobRequest): Promise<void> => {
    (deliver as unknown as (m: JobRequest) => void)(m);
    await new Promise((r) => setTimeout(r, 0));
  };
  return { replies, send };
}

describe("serve()", () => {
  test("progress is throttled to one message per 50 ms, clamped, never decreasing, closed at 1, then done", async () => {
    const clock = { t: 0 };
    const jobs: Record<string, JobDefinition> = {
      steps: {
        title: () => "stepping job",
        run(_input, ctx) {
          // 200 reports, 2 ms apart on the clock: 400 ms → at most one message per 50 ms.
          for (let i = 1; i <= 200; i++) {
            clock.t += 2;
            const f = i === 100 ? 0.1 : i / 200; // one report goes backwards: it must not show
            ctx.progress(f, `step ${i}`);
          }
          ctx.progress(1.7, "past the end"); // clamped to 1
          return 42;
        },
      },
    };
    const { replies, send } = harness(jobs, clock);
    await send({ id: 7, kind: "steps", input: null });
    const progress = replies.filter((r): r is Extract<WorkerReply, { type: "progress" }> => r.type === "progress");
    // Posted at t = 2, 52, 102, …, 352 (8 messages) plus the held-back final report.
    expect(progress.length).toBe(9);
    for (let i = 1; i < progress.length; i++) expect(progress[i].fraction).toBeGreaterThanOrEqual(progress[i - 1].fraction);
    expect(progress[progress.length - 1]).toEqual({ id: 7, type: "progress", fraction: 1, sentence: "past the end" });
    expect(replies[replies.length - 1]).toEqual({ id: 7, type: "done", output: 42 });
    expect(replies.every((r) => r.id === 7)).toBe(true);
  });

  test("a job that never reports 1 still ends its progress at 1, with a sentence naming it", async () => {
    const clock = { t: 0 };
    const { replies, send } = harness({ quiet: { title: () => "quiet job", run: () => "ok" } }, clock);
    await send({ id: 1, kind: "quiet", input: null });
    expect(replies).toEqual([
      { id: 1, type: "progress", fraction: 1, sentence: "Quiet job: done" },
      { id: 1, type: "done", output: "ok" },
    ]);
  });

  test("an InputError keeps its code, sentence and cell", async () => {
    const clock = { t: 0 };
    const { replies, send } = harness(
      {
        bad: {
          run: () => {
            throw new InputError("NOT_WEEKLY", "The dates in rows 3 and 4 are 9 days apart; weekly rates need 7.", { row: 3, col: 0 });
          },
        },
      },
      clock,
    );
    await send({ id: 2, kind: "bad", input: null });
    expect(replies).toEqual([
      { id: 2, type: "error", message: "The dates in rows 3 and 4 are 9 days apart; weekly rates need 7.", code: "NOT_WEEKLY", cell: { row: 3, col: 0 } },
    ]);
  });

  test("any other exception becomes one sentence naming the job, without a stack trace", async () => {
    const clock = { t: 0 };
    const { replies, send } = harness(
      {
        broken: {
          title: () => "TBATS backtest",
          run: () => {
            throw new TypeError("Cannot read properties of undefined (reading 'length')\n    at filter (filter.ts:10:5)");
          },
        },
      },
      clock,
    );
    await send({ id: 3, kind: "broken", input: null });
    expect(replies).toEqual([
      { id: 3, type: "error", message: "The TBATS backtest failed inside the engine (Cannot read properties of undefined (reading 'length'))." },
    ]);
  });

  test("an unknown kind and an output that cannot be copied back are refused in sentences", async () => {
    const clock = { t: 0 };
    const { replies, send } = harness({ fn: { title: () => "odd job", run: () => ({ f: () => 1 }) } }, clock);
    await send({ id: 4, kind: "nope", input: null });
    await send({ id: 5, kind: "fn", input: null });
    expect(replies[0]).toEqual({ id: 4, type: "error", message: 'The engine has no job called "nope".' });
    const last = replies[replies.length - 1];
    expect(last.type).toBe("error");
    expect(last.type === "error" && last.message).toMatch(/^The odd job finished, but its result could not be copied back from the worker/);
  });

  test("jobs sent together run one at a time, in order", async () => {
    const clock = { t: 0 };
    const order: number[] = [];
    const { replies, send } = harness(
      {
        slow: {
          async run(input) {
            order.push(input as number);
            await new Promise((r) => setTimeout(r, 5));
            order.push(-(input as number));
            return input;
          },
        },
      },
      clock,
    );
    void send({ id: 1, kind: "slow", input: 1 });
    await send({ id: 2, kind: "slow", input: 2 });
    await new Promise((r) => setTimeout(r, 30));
    expect(order).toEqual([1, -1, 2, -2]);
    expect(replies.filter((r) => r.type === "done").map((r) => r.id)).toEqual([1, 2]);
  });
});
