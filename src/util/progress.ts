/**
 * Progress on stderr: a bar (cli-progress) when stderr is a terminal, nothing when it is piped or
 * when progress is turned off, so data on stdout stays clean.
 */
import cliProgress from "cli-progress";
import { onInterrupt } from "./interrupt.js";

export interface Progress {
  tick(n?: number): void;
  stop(): void;
}

const SILENT: Progress = { tick() {}, stop() {} };

/** Ticks between redraws: redrawing per row would cost more than linking. */
const REDRAW_EVERY = 500;

/**
 * A progress display; off unless `enabled` (library calls print nothing unless asked: the command
 * line asks when stderr is a terminal).
 */
export function progress(label: string, enabled = false): Progress {
  if (!enabled) return SILENT;
  const bar = new cliProgress.SingleBar(
    {
      format: `${label} {value} rows | {rate}/s | {duration}s`,
      stream: process.stderr,
      hideCursor: true,
      fps: 5,
    },
    cliProgress.Presets.shades_classic,
  );
  const started = Date.now();
  let n = 0;
  bar.start(0, 0, { rate: 0 });
  // The bar hides the cursor and turns line wrapping off until stopped: an interruption stops it
  // too (the command line's signal handler), or the terminal is left without them.
  const done = onInterrupt({ run: () => bar.stop() });
  return {
    tick(k = 1) {
      n += k;
      if (n % REDRAW_EVERY < k) {
        const secs = (Date.now() - started) / 1000;
        bar.update(n, { rate: secs > 0 ? Math.round(n / secs) : 0 });
      }
    },
    stop() {
      const secs = (Date.now() - started) / 1000;
      bar.update(n, { rate: secs > 0 ? Math.round(n / secs) : 0 });
      bar.stop();
      done();
    },
  };
}
