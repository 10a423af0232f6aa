/**
 * What links the rows of a command's run: a linker on this thread, or a pool of threads
 * (src/link/parallel.ts). `link` and `eval` take either through `jobs`; the rows are the same.
 */
import { type Kb, openKb } from "../kb/kb.js";
import type { LabelMap } from "../labels/label-map.js";
import type { LinkRow, Mention } from "../types.js";
import { createLinker, type Linker, type LinkerOptions } from "./linker.js";
import { LinkPool } from "./parallel.js";

export interface Linking {
  /** The rows of a stream of mentions, in order (Linker.linkAll). */
  linkAll(mentions: Iterable<Mention> | AsyncIterable<Mention>): AsyncIterable<LinkRow>;
  /** Counts of unknown and non-linkable labels of the mentions linked. */
  readonly labels: LabelMap;
  /** Closes the KB or stops the threads. */
  close(): void | Promise<void>;
}

/** Linking on this thread with `kb`, closed with the Linking (or at once when the options are refused). */
export function linkingHere(kb: Kb, options: LinkerOptions): Linking {
  let linker: Linker;
  try {
    linker = createLinker(kb, options);
  } catch (e) {
    kb.close();
    throw e;
  }
  return { linkAll: (m) => linker.linkAll(m), labels: linker.labels, close: () => kb.close() };
}

/** Linking on `jobs` threads (1: this thread) with the KB file `kb`. */
export async function linkingOn(jobs: number, kb: string, options: LinkerOptions): Promise<Linking> {
  if (jobs === 1) return linkingHere(openKb(kb), options);
  const pool = await LinkPool.start(kb, options, jobs);
  return { linkAll: (m) => pool.linkAll(m), labels: pool.labels, close: () => pool.close() };
}
