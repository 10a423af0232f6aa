/** `hawser agree` as a library call: agreement of two labeled files over the same mentions. */
import { type Agreement, agreement } from "../evaluate/agree.js";
import { AtomicWriter, checkOutputFile } from "../util/atomic-file.js";
import { requirePaths, UsageError } from "../util/errors.js";
import { readLabeled } from "./evaluate.js";

export interface AgreeOptions {
  /** First annotator's labeled file. */
  a: string;
  /** Second annotator's labeled file. */
  b: string;
  /** Write the disagreements to adjudicate here (JSONL, atomically). */
  out?: string | undefined;
}

export async function agree(options: AgreeOptions): Promise<Agreement> {
  requirePaths("agree", options, ["a", "b"], ["out"]);
  if (options.out !== undefined && /\.(csv|tsv)$/i.test(options.out))
    throw new UsageError(
      `--out ${options.out}: agree writes its disagreements as JSONL; name the file .jsonl`,
    );
  const a = await readLabeled(options.a);
  const b = await readLabeled(options.b);
  const result = agreement(a, b, { fileA: options.a, fileB: options.b });
  if (options.out !== undefined) {
    checkOutputFile(options.out, "--out", [
      ["the first labeled file", options.a],
      ["the second labeled file", options.b],
    ]);
    const w = new AtomicWriter(options.out);
    try {
      for (const d of result.disagreements) await w.write(`${JSON.stringify(d)}\n`);
      await w.commit();
    } catch (e) {
      w.abort();
      throw e;
    }
  }
  return result;
}
