/**
 * Peak resident-set-size tracking for one benchmark phase. A timer samples every 50 ms, but
 * synchronous work (a linking loop) starves timers, so hot loops also call `checkpoint()`.
 */

/** Timer period of the sampler: fine enough to catch short peaks, cheap enough to be invisible. */
export const RSS_SAMPLE_MS = 50;
/** Bytes in a mebibyte. */
const MIB = 1024 * 1024;

export class RssSampler {
  private peak = 0;
  private samples = 0;
  private timer: NodeJS.Timeout | undefined;

  /** Starts the 50 ms timer and takes a first sample. */
  start(): this {
    this.checkpoint();
    this.timer = setInterval(() => this.checkpoint(), RSS_SAMPLE_MS);
    this.timer.unref();
    return this;
  }

  /** Takes one sample now. */
  checkpoint(): void {
    const rss = process.memoryUsage.rss();
    this.samples++;
    if (rss > this.peak) this.peak = rss;
  }

  /** Stops the timer (after a last sample) and returns the peak in MiB and the sample count. */
  stop(): { peakMb: number; samples: number } {
    this.checkpoint();
    if (this.timer !== undefined) clearInterval(this.timer);
    this.timer = undefined;
    return { peakMb: Math.round((this.peak / MIB) * 10) / 10, samples: this.samples };
  }
}
