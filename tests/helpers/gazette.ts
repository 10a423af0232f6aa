/**
 * Shared fixtures for the core-pipeline tests: temporary folders and a small invented entity table
 * from the archive of a fictional river-port trade gazette (1890-1930). Every name is invented.
 */
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

/** A fresh temporary folder; `cleanup` removes it and everything in it. */
export function tempDir(prefix = "hawser-test-"): {
  dir: string;
  file: (name: string) => string;
  cleanup: () => void;
} {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return {
    dir,
    file: (name: string) => join(dir, name),
    cleanup: () => rmSync(dir, { recursive: true, force: true }),
  };
}

/** Write `text` (or raw bytes) to `file` and return the path. */
export function writeText(file: string, text: string | Uint8Array): string {
  writeFileSync(file, text);
  return file;
}

/** JSONL text of the given objects, one a line. */
export function jsonl(rows: readonly unknown[]): string {
  return rows.map((r) => `${JSON.stringify(r)}\n`).join("");
}

/**
 * The gazette table (CSV). Look-alikes on purpose: two Aldous with different roles and the same
 * initials, the towns Stenmouth and Stenmoor, a firm named after its town, an acronym firm, a
 * father and son told apart only by Sr./Jr., and two firms with the same name in two towns.
 */
export const GAZETTE_CSV = [
  "id,name,type,aliases,description,prior,port",
  'P01,Josiah Hale Aldous,person,Capt. Josiah Aldous,"master mariner, captain of the steam packet Wenna Belle on the upper river",40,Stenmouth',
  "P02,Jonas Hale Aldous,person,,clerk to the harbour board who kept the customs ledgers and tonnage dues,30,Stenmouth",
  "P03,Tobias Pell Sr.,person,,founder of the rope walk and elder of the chapel,20,Stenmoor",
  "P04,Tobias Pell Jr.,person,,son of the founder; manager of the rope walk after 1911,20,Stenmoor",
  "P05,Ezra Quillon Marsh,person,Quillon Marsh,wharfinger at the coal staithes,15,Fort Carrow",
  "P06,Bérénice Ñuñez,person,,milliner and importer of lace by the weekly packet,5,Saint Wenna",
  "P07,Harrington Vole,person,,auctioneer of timber and salvage,12,Port Ellery",
  "L01,Stenmouth,town,Stenmouth-on-Sten,market town and river port at the mouth of the Sten,12000,",
  "L02,Stenmoor,village,,moorland village above the weir,800,",
  "L03,Fort Carrow,town,Ft. Carrow,garrison town on the lower reach,4000,",
  "L04,Saint Wenna,town,St. Wenna,fishing town with a tidal harbour,2500,",
  "L05,Port Ellery,town,Pt. Ellery,ferry port across the estuary,3000,",
  "L06,Mount Sorrel,village,Mt. Sorrel,hill village with a slate quarry,600,",
  "O01,Stenmouth Grain Exchange,firm,S.G.E.,corn and barley market hall on the quay,300,Stenmouth",
  "O02,Stenmouth Packet Company Ltd.,firm,Stenmouth Packet Co.,steamers between the river ports,250,Stenmouth",
  "O03,Pell & Sons Ltd.,firm,Pell and Sons Limited,rope and twine makers,120,Stenmoor",
  "O04,Carrow Lime Works,firm,,lime kilns and quarry,60,Fort Carrow",
  "O05,Ellery Ferry Company,firm,,ferry boats across the estuary,50,Port Ellery",
  "O06,Sorrel Slate Company,firm,,slate quarry and dressing sheds,40,Mount Sorrel",
  "V01,Wenna Belle,vessel,,steam packet of the upper river,10,Stenmouth",
  "",
].join("\n");

/** Number of rows in GAZETTE_CSV. */
export const GAZETTE_ROWS = 20;

/** Write GAZETTE_CSV into `dir` and build its KB there; returns both paths. */
export async function buildGazetteKb(dir: string): Promise<{ table: string; kb: string }> {
  const { buildKb } = await import("../../src/kb/build.js");
  const table = writeText(join(dir, "gazette.csv"), GAZETTE_CSV);
  const kb = join(dir, "gazette.kb");
  await buildKb({ table, out: kb });
  return { table, kb };
}
