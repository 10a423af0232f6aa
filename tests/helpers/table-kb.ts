/** A KB built in a temporary folder from a table's CSV text, opened, with a linker at the defaults. */
import { buildKb } from "../../src/kb/build.js";
import { type Kb, openKb } from "../../src/kb/kb.js";
import { createLinker, type Linker } from "../../src/link/linker.js";
import { tempDir, writeText } from "./gazette.js";

export interface TableKb {
  kb: Kb;
  linker: Linker;
  /** Closes the KB and removes the folder. */
  close(): void;
}

export async function openTableKb(csv: string, prefix = "hawser-test-"): Promise<TableKb> {
  const t = tempDir(prefix);
  await buildKb({ table: writeText(t.file("table.csv"), csv), out: t.file("table.kb") });
  const kb = openKb(t.file("table.kb"));
  return {
    kb,
    linker: createLinker(kb),
    close() {
      kb.close();
      t.cleanup();
    },
  };
}
