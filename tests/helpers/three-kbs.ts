/**
 * Three KBs that tests of in-memory KB structures compare against SQLite: the sample archive's
 * table, a generated benchmark table, and a small table of the test's own (names in other
 * scripts, legal forms, punctuation). Built into a temporary folder, opened, and closed after.
 */
import { join } from "node:path";
import { afterAll, beforeAll } from "vitest";
import { generate, TABLE_FILE } from "../../benchmarks/generate.js";
import { buildKb } from "../../src/kb/build.js";
import { type Kb, openKb } from "../../src/kb/kb.js";
import { tempDir, writeText } from "./gazette.js";

export interface ThreeKbs {
  /** Sample archive, generated table, own table, in that order (filled before the tests run). */
  kbs: Kb[];
  /** Files in the temporary folder: "gen" holds the generated data, "own.kb" the own table's KB. */
  file(name: string): string;
}

/** Registers beforeAll/afterAll hooks that build and open the three KBs. */
export function threeKbs(own: {
  csv: string;
  generatedEntities: number;
  generatedMentions: number;
  seed: number;
}): ThreeKbs {
  const t = tempDir();
  const kbs: Kb[] = [];
  beforeAll(async () => {
    const gen = t.file("gen");
    generate({ entities: own.generatedEntities, mentions: own.generatedMentions, seed: own.seed, out: gen });
    const tables: Array<[string, string]> = [
      ["kb-samples/gazette-entities.csv", t.file("gazette.kb")],
      [join(gen, TABLE_FILE), t.file("gen.kb")],
      [writeText(t.file("own.csv"), own.csv), t.file("own.kb")],
    ];
    for (const [table, out] of tables) {
      await buildKb({ table, out });
      kbs.push(openKb(out));
    }
  });
  afterAll(() => {
    for (const kb of kbs) kb.close();
    t.cleanup();
  });
  return { kbs, file: (name) => t.file(name) };
}
