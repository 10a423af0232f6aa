/** `hawser index` as a library call: build a KB file from a knowledge table. */
import { type BuildKbOptions, type BuildSummary, buildKb } from "../kb/build.js";
import { readLabelMapFile } from "../labels/label-map.js";
import { requirePaths } from "../util/errors.js";
import { progress } from "../util/progress.js";

export interface IndexOptions {
  /** Knowledge table (CSV with header, TSV or JSONL). */
  table: string;
  /** KB file to write (atomically). */
  out: string;
  /** Table format; default from the extension. */
  from?: "csv" | "tsv" | "jsonl" | undefined;
  /** JSON label map overriding the built-in type spellings. */
  labels?: string | undefined;
  /** Show a progress bar on stderr. Default false (the command line shows one when stderr is a terminal). */
  progress?: boolean | undefined;
}

export async function index(options: IndexOptions): Promise<BuildSummary> {
  requirePaths("index", options, ["table", "out"], ["labels"]);
  const bar = progress("indexing", options.progress);
  let shown = 0;
  const onProgress = (rows: number) => {
    bar.tick(rows - shown);
    shown = rows;
  };
  const build: BuildKbOptions = { table: options.table, out: options.out, onProgress, progressEvery: 1000 };
  if (options.from !== undefined) build.from = options.from;
  if (options.labels !== undefined) build.labels = readLabelMapFile(options.labels);
  try {
    return await buildKb(build);
  } finally {
    bar.stop();
  }
}
