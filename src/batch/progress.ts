/**
 * Progress on stderr: a bar redrawn in place on a terminal; on a log (not a terminal), one line
 * at each further tenth done, so a scheduled job's log shows where a slow run is without
 * filling up. stdout stays clean for the summary or the JSON.
 */
export interface ProgressSink {
  update(fraction: number, sentence: string): void;
  done(): void;
}

const BAR = 24;

export function progressBar(stream: NodeJS.WriteStream = process.stderr, enabled = true): ProgressSink {
  if (!enabled) return { update: () => undefined, done: () => undefined };
  const tty = stream.isTTY === true;
  let lastDraw = 0;
  let lastTenth = -1;
  let drawn = false;
  return {
    update(fraction, sentence) {
      const f = Math.max(0, Math.min(1, fraction));
      if (tty) {
        const now = Date.now();
        if (now - lastDraw < 80 && f < 1) return;
        lastDraw = now;
        const filled = Math.round(f * BAR);
        const width = (stream.columns ?? 100) - BAR - 10;
        const text = sentence.length > width ? `${sentence.slice(0, Math.max(0, width - 1))}…` : sentence;
        stream.write(`\r[${"#".repeat(filled)}${"-".repeat(BAR - filled)}] ${String(Math.floor(f * 100)).padStart(3)}% ${text}\x1b[K`);
        drawn = true;
      } else {
        const tenth = Math.floor(f * 10);
        if (tenth <= lastTenth) return;
        lastTenth = tenth;
        stream.write(`fairlead: ${tenth * 10}% ${sentence}\n`);
      }
    },
    done() {
      if (tty && drawn) stream.write("\r\x1b[K");
    },
  };
}
