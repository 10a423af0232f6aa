/**
 * The `hawser` binary: exit status (0 done, 1 bad input naming file and line, 2 bad usage), atomic
 * output, CSV and JSONL rows in input order, `info`, and an empty mentions file.
 */
import { spawn, spawnSync } from "node:child_process";
import { closeSync, existsSync, openSync, readdirSync, readFileSync, symlinkSync, utimesSync } from "node:fs";
import { join } from "node:path";
import { parse } from "csv-parse/sync";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SAMPLES_DIR } from "../src/commands/demo.js";
import { CSV_COLUMNS } from "../src/link/write.js";
import { openKb } from "../src/kb/kb.js";
import { SCHEMA_VERSION } from "../src/kb/schema.js";
import { CLI, hawser, requireBuiltCli } from "./helpers/cli.js";
import { GAZETTE_CSV, GAZETTE_ROWS, jsonl, tempDir, writeText } from "./helpers/gazette.js";

let t: ReturnType<typeof tempDir>;
let kb: string;

/** Mentions in a fixed order: links, NIL, a date, an acronym, a repeat. */
const MENTIONS = [
  { id: "a1", text: "Stenmoor", type: "LOC" },
  { id: "a2", text: "Quentin Fairweather", type: "PER" },
  { id: "a3", text: "S.G.E.", type: "ORG", context: "corn prices on the quay" },
  { id: "a4", text: "4 June 1903", type: "DATE" },
  { id: "a5", text: "Pell, Tobias, & Sons", type: "ORG" },
  { id: "a6", text: "Stenmoor", type: "LOC" },
];

beforeAll(() => {
  requireBuiltCli();
  t = tempDir("hawser-cli-");
  writeText(t.file("gazette.csv"), GAZETTE_CSV);
  kb = t.file("gazette.kb");
  const r = hawser(["index", "gazette.csv", "--out", kb], t.dir);
  if (r.status !== 0) throw new Error(`hawser index failed (${r.status}): ${r.stderr}`);
  writeText(t.file("mentions.jsonl"), jsonl(MENTIONS));
});
afterAll(() => t?.cleanup());

/** Files in the temporary folder whose name starts with `prefix` (temporary outputs included). */
const filesLike = (prefix: string) => readdirSync(t.dir).filter((f) => f.includes(prefix));

describe("hawser index", () => {
  it("builds a KB and reports the counts (exit 0)", () => {
    const r = hawser(["index", "gazette.csv", "--out", "again.kb"], t.dir);
    expect(r.status).toBe(0);
    expect(r.stderr).toContain(`indexed ${GAZETTE_ROWS} entities`);
    expect(r.stdout).toBe("");
    expect(existsSync(t.file("again.kb"))).toBe(true);
  });

  it("exits 1 on a bad table, naming file:line and the field, and writes no KB", () => {
    writeText(t.file("bad-table.csv"), "id,name,type\nL1,Stenmouth,town\nL2,,village\n");
    const r = hawser(["index", "bad-table.csv", "--out", "bad-table.kb"], t.dir);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("bad-table.csv:3");
    expect(r.stderr).toContain('"name"');
    expect(filesLike("bad-table.kb")).toEqual([]);
  });

  it("builds from a table on standard input (-), CSV with --from csv, with the same rows as from the file", () => {
    const r = hawser(["index", "--from", "csv", "-", "--out", "piped.kb"], t.dir, GAZETTE_CSV);
    expect(r.status, r.stderr).toBe(0);
    const piped = openKb(t.file("piped.kb"));
    const fromFile = openKb(kb);
    try {
      expect(piped.info.entities).toBe(GAZETTE_ROWS);
      expect(piped.info.fingerprint).toBe(fromFile.info.fingerprint); // same bytes, same KB
    } finally {
      piped.close();
      fromFile.close();
    }
  });

  it("exits 2 before any work when --out points into a missing folder or at a folder", () => {
    const missing = hawser(["index", "gazette.csv", "--out", "no-such-folder/g.kb"], t.dir);
    expect(missing.status).toBe(2);
    expect(missing.stderr).toContain("--out no-such-folder/g.kb: the folder no-such-folder does not exist");
    expect(missing.stderr).not.toContain("internal error");
    const folder = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "."], t.dir);
    expect(folder.status).toBe(2);
    expect(folder.stderr).toContain("--out . is a folder, not a file");
    const tuneOut = hawser(
      ["tune", "--kb", kb, "--gold", "mentions.jsonl", "--out", "no-such-folder/c.json"],
      t.dir,
    );
    expect(tuneOut.status).toBe(2); // before the labeled set is read (this file has no gold column)
    expect(tuneOut.stderr).toContain("the folder no-such-folder does not exist");
  });

  it("exits 2 before any work when --out names an input, a link or a device", () => {
    writeText(t.file("self.csv"), GAZETTE_CSV);
    const overTable = hawser(["index", "self.csv", "--out", "self.csv"], t.dir);
    expect(overTable.status).toBe(2);
    expect(overTable.stderr).toContain("is also the table");
    expect(readFileSync(t.file("self.csv"), "utf8")).toBe(GAZETTE_CSV);
    const overKb = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", kb], t.dir);
    expect(overKb.status).toBe(2);
    expect(overKb.stderr).toContain("is also --kb");
    const intact = openKb(kb);
    expect(intact.info.entities).toBe(GAZETTE_ROWS);
    intact.close();
    const sameTwice = hawser(
      ["tune", "--kb", kb, "--gold", "g.jsonl", "--out", "x.json", "--report", "x.json"],
      t.dir,
    );
    expect(sameTwice.status).toBe(2);
    symlinkSync(t.file("mentions.jsonl"), t.file("link.jsonl"));
    const overLink = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "link.jsonl"], t.dir);
    expect(overLink.status).toBe(2);
    expect(overLink.stderr).toContain("symbolic link");
    const device = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "/dev/null"], t.dir);
    expect(device.status).toBe(2);
    expect(device.stderr).toContain("not a plain file");
  });

  it.runIf(existsSync("/dev/full"))("says so and exits 74 when standard output cannot be written", () => {
    const full = openSync("/dev/full", "w");
    try {
      const r = spawnSync(process.execPath, [CLI, "link", "--kb", kb, "mentions.jsonl"], {
        cwd: t.dir,
        stdio: ["ignore", full, "pipe"],
      });
      expect(r.status).toBe(74);
      expect(String(r.stderr)).toContain("cannot write standard output");
      expect(String(r.stderr)).not.toContain("node:internal");
    } finally {
      closeSync(full);
    }
  });

  it("exits 2 on an empty or out-of-range number, and on an empty path list", () => {
    for (const args of [
      ["link", "--kb", kb, "mentions.jsonl", "--threshold", ""],
      ["link", "--kb", kb, "mentions.jsonl", "--min-margin", " "],
      ["link", "--kb", kb, "mentions.jsonl", "--top", ""],
      ["link", "--kb", kb, "mentions.jsonl", "--paths", ""],
      ["tune", "--kb", kb, "--gold", "mentions.jsonl", "--out", "c.json", "--l2", "-1"],
      ["tune", "--kb", kb, "--gold", "mentions.jsonl", "--out", "c.json", "--l2", "abc"],
    ]) {
      const r = hawser(args, t.dir);
      expect(r.status, args.join(" ")).toBe(2);
      expect(r.stderr, args.join(" ")).not.toContain("internal error");
    }
  });

  it("exits 2 on a table format it cannot tell, and without --out", () => {
    writeText(t.file("table.txt"), "id,name,type\nL1,Stenmouth,town\n");
    expect(hawser(["index", "table.txt", "--out", "x.kb"], t.dir).status).toBe(2);
    expect(hawser(["index", "gazette.csv"], t.dir).status).toBe(2);
  });
});

describe("hawser link", () => {
  it("writes one JSONL row per mention, in input order (exit 0)", () => {
    const r = hawser(["link", "--kb", kb, "mentions.jsonl"], t.dir);
    expect(r.status).toBe(0);
    const rows = r.stdout
      .trim()
      .split("\n")
      .map(
        (l) => JSON.parse(l) as { mention: string; entity: string | null; reasons: Array<{ code: string }> },
      );
    expect(rows.map((x) => x.mention)).toEqual(MENTIONS.map((x) => x.id));
    expect(rows[0]!.entity).toBe("L02");
    expect(rows[2]!.entity).toBe("O01");
    expect(rows[3]!.entity).toBeNull();
    expect(rows[3]!.reasons[0]!.code).toBe("not-linkable");
    expect(r.stderr).toContain(`of ${MENTIONS.length} mentions`);
  });

  it("reads the mentions from standard input when the file is -, JSONL unless --from says otherwise", () => {
    const fromFile = hawser(["link", "--kb", kb, "mentions.jsonl"], t.dir);
    const piped = hawser(["link", "--kb", kb, "-"], t.dir, jsonl(MENTIONS));
    expect(piped.status, piped.stderr).toBe(0);
    expect(piped.stdout).toBe(fromFile.stdout);
    const csv = `id,text,type\n${MENTIONS.map((m) => `${m.id},"${m.text}",${m.type}`).join("\n")}\n`;
    const pipedCsv = hawser(["link", "--kb", kb, "--from", "csv", "-"], t.dir, csv);
    expect(pipedCsv.status, pipedCsv.stderr).toBe(0);
    expect(
      pipedCsv.stdout
        .trim()
        .split("\n")
        .map((l) => JSON.parse(l).entity),
    ).toEqual(
      fromFile.stdout
        .trim()
        .split("\n")
        .map((l) => JSON.parse(l).entity),
    );
  });

  it("stops quietly (exit 0, no stack trace) when the reader of its output closes the pipe early", async () => {
    // As `hawser link ... | head -1` does: more rows than a pipe buffers, and the reader leaves after the first.
    const many = Array.from({ length: 3000 }, (_, i) => ({ id: `r${i}`, text: "Stenmoor", type: "LOC" }));
    writeText(t.file("many.jsonl"), jsonl(many));
    const child = spawn(process.execPath, [CLI, "link", "--kb", kb, "many.jsonl"], { cwd: t.dir });
    let stderr = "";
    child.stderr.on("data", (d) => {
      stderr += String(d);
    });
    const first = await new Promise<string>((resolve) =>
      child.stdout.once("data", (d) => resolve(String(d))),
    );
    child.stdout.destroy();
    const status = await new Promise<number | null>((resolve) => child.on("close", (code) => resolve(code)));
    expect(first).toContain('"mention":"r0"');
    expect(stderr).not.toContain("EPIPE");
    expect(status).toBe(0);
  });

  it("says how to give CSV when standard input starts with a CSV header", () => {
    const csv = "id,text,type\nm1,Stenmoor,LOC\n";
    const r = hawser(["link", "--kb", kb, "-"], t.dir, csv);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("stdin:1: malformed JSON");
    expect(r.stderr).toContain("give --from csv");
    const told = hawser(["link", "--kb", kb, "-", "--from", "csv"], t.dir, csv);
    expect(told.status).toBe(0);
    expect(JSON.parse(told.stdout).mention).toBe("m1");
  });

  it("names standard input in the error for a bad line piped in (exit 1)", () => {
    const r = hawser(["link", "--kb", kb, "-"], t.dir, `${jsonl(MENTIONS.slice(0, 2))}{"id":"x9"}\n`);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('stdin:3: field "text"');
    // Rows stream to stdout as they are linked: those before the bad line are out already, never a row for it.
    expect(
      r.stdout
        .trim()
        .split("\n")
        .map((l) => JSON.parse(l).mention),
    ).toEqual(["a1", "a2"]);
  });

  it("reads TSV from standard input with --from tsv, quotes as text, and writes no .tsv", () => {
    const tsv = 'id\ttext\ttype\nq1\tStenmoor\tLOC\nq2\t"Stenmoor"\tLOC\n';
    const r = hawser(["link", "--kb", kb, "-", "--from", "tsv"], t.dir, tsv);
    expect(r.status, r.stderr).toBe(0);
    const rows = r.stdout
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    expect(rows.map((x) => x.text)).toEqual(["Stenmoor", '"Stenmoor"']);
    const refused = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "rows.tsv"], t.dir);
    expect(refused.status).toBe(2);
    expect(refused.stderr).toContain("name the file .jsonl or .csv");
    expect(filesLike("rows.tsv")).toEqual([]);
  });

  it("says what is wrong when given link rows where a labeled set belongs, or a missing file", () => {
    const rows = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "as-gold.jsonl"], t.dir);
    expect(rows.status, rows.stderr).toBe(0);
    const agree = hawser(["agree", "as-gold.jsonl", "as-gold.jsonl"], t.dir);
    expect(agree.status).toBe(1);
    expect(agree.stderr).toContain("looks like a row of `hawser link`'s output");
    const missing = hawser(["link", "--kb", kb, "nope.jsonl"], t.dir);
    expect(missing.status).toBe(1);
    // Once, not twice ("(ENOENT): ENOENT: no such file or directory, open 'nope.jsonl'").
    expect(missing.stderr.match(/ENOENT/g)).toHaveLength(1);
    expect(missing.stderr).toContain("no such file or directory");
  });

  it("refuses a folder as a KB, a hexadecimal threshold, and says a missing label map is missing", () => {
    const folder = hawser(["link", "--kb", t.dir, "mentions.jsonl"], t.dir);
    expect(folder.status).toBe(1);
    expect(folder.stderr).toContain("is a folder, not a KB file");
    const hex = hawser(["link", "--kb", kb, "mentions.jsonl", "--threshold", "0x1"], t.dir);
    expect(hex.status).toBe(2);
    expect(hex.stderr).toContain('needs a decimal number, got "0x1"');
    const labels = hawser(["link", "--kb", kb, "mentions.jsonl", "--labels", "no-labels.json"], t.dir);
    expect(labels.status).toBe(1);
    // It said "not a JSON label map" of a file that is not there.
    expect(labels.stderr).toContain("no-labels.json: cannot read the file: no such file or directory");
  });

  it("scores predicted rows without a KB, and names CSV link rows given as a labeled set", () => {
    writeText(
      t.file("span-gold.jsonl"),
      jsonl([{ id: "a", text: "Stenmoor", start: 0, end: 8, doc: "d", gold: "L02" }]),
    );
    writeText(
      t.file("span-pred.jsonl"),
      jsonl([{ mention: "a", text: "Stenmoor", start: 0, end: 8, doc: "d", entity: "L02", candidates: [] }]),
    );
    const scored = hawser(
      ["eval", "--gold", "span-gold.jsonl", "--predicted", "span-pred.jsonl", "--json"],
      t.dir,
    );
    expect(scored.status, scored.stderr).toBe(0);
    expect(JSON.parse(scored.stdout).overall.accuracy).toBe(1);
    expect(hawser(["eval", "--gold", "span-gold.jsonl"], t.dir).stderr).toContain("eval needs --kb");
    const csv = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "rows.csv"], t.dir);
    expect(csv.status, csv.stderr).toBe(0);
    const agree = hawser(["agree", "rows.csv", "rows.csv"], t.dir);
    expect(agree.status).toBe(1);
    expect(agree.stderr).toContain("this looks like a row of `hawser link`'s output");
  });

  it("measures candidate recall at a k beyond the candidates a row lists", () => {
    // eval --k K reported recall among the --top candidates a row lists (3 by default), labeled
    // "at K". "Aldous" has two candidates, Josiah and Jonas Aldous: gold is the second.
    writeText(t.file("aldous.jsonl"), jsonl([{ id: "k1", text: "Aldous", type: "PER" }]));
    const listed = JSON.parse(hawser(["link", "--kb", kb, "aldous.jsonl", "--top", "2"], t.dir).stdout);
    const second = listed.candidates[1].entity as string;
    writeText(t.file("k-gold.jsonl"), jsonl([{ id: "k1", text: "Aldous", type: "PER", gold: second }]));
    const r = hawser(
      ["eval", "--kb", kb, "--gold", "k-gold.jsonl", "--top", "1", "--k", "2", "--json"],
      t.dir,
    );
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout).candidateRecall).toMatchObject({ k: 2, foundAtK: 1, atK: 1 });
    // The same with the default k (3) and fewer candidates listed.
    const byDefault = hawser(["eval", "--kb", kb, "--gold", "k-gold.jsonl", "--top", "1", "--json"], t.dir);
    expect(JSON.parse(byDefault.stdout).candidateRecall).toMatchObject({ k: 3, foundAtK: 1 });
  });

  it("tells what tune kept by the figures of its objective", () => {
    // With --min-precision the procedures are compared by recall at that precision: F1 alone made
    // the kept procedure look the worse.
    const samples = hawser(
      ["index", join(SAMPLES_DIR, "gazette-entities.csv"), "--out", "samples.kb"],
      t.dir,
    );
    expect(samples.status, samples.stderr).toBe(0);
    const gold = join(SAMPLES_DIR, "gazette-gold.jsonl");
    const byRecall = hawser(
      ["tune", "--kb", "samples.kb", "--gold", gold, "--out", "p.json", "--min-precision", "0.99"],
      t.dir,
    );
    expect(byRecall.status, byRecall.stderr).toBe(0);
    expect(byRecall.stdout).toMatch(
      /kept: .*held-out link precision \/ recall, for the highest recall at precision >= 0\.99: fitted [\d.]+% \/ [\d.]+%/,
    );
    // The kept procedure is not beaten: no other reaches the bar with more recall, or the same
    // recall with more precision (an equal recall once went to the simpler, 1.6 points less precise).
    const at95 = hawser(
      ["tune", "--kb", "samples.kb", "--gold", gold, "--out", "p95.json", "--min-precision", "0.95"],
      t.dir,
    );
    const line = at95.stdout.split("\n").find((l) => l.startsWith("kept: "))!;
    const figures = [...line.matchAll(/(fitted|default weights|defaults) ([\d.]+)% \/ ([\d.]+)%/g)].map(
      (m) => ({
        name: m[1]!,
        precision: Number(m[2]),
        recall: Number(m[3]),
      }),
    );
    expect(figures).toHaveLength(3);
    const keptName = line.startsWith("kept: fitted")
      ? "fitted"
      : line.startsWith("kept: default weights")
        ? "default weights"
        : "defaults";
    const kept = figures.find((f) => f.name === keptName)!;
    for (const other of figures.filter((f) => f.precision >= 95))
      expect(
        other.recall > kept.recall || (other.recall === kept.recall && other.precision > kept.precision),
        `${other.name} beats ${keptName}: ${line}`,
      ).toBe(false);
    expect(at95.stdout).not.toMatch(/note: .*link F1/);
    const byF1 = hawser(["tune", "--kb", "samples.kb", "--gold", gold, "--out", "f.json"], t.dir);
    expect(byF1.stdout).toMatch(/kept: .*\(held-out link F1: fitted [\d.]+%, /);
  });

  it("reads CoNLL from standard input as from a file, its tag scheme detected from what it reads", () => {
    // Standard input cannot be read twice: the scheme is detected from its first sentences, held.
    const conll = join(SAMPLES_DIR, "articles", "gazette.conll");
    const piped = hawser(["link", "--kb", kb, "-", "--from", "conll"], t.dir, readFileSync(conll, "utf8"));
    const named = hawser(["link", "--kb", kb, conll], t.dir);
    expect(piped.status).toBe(0);
    expect(named.status).toBe(0);
    expect(piped.stdout.trim().split("\n").length).toBeGreaterThan(1000);
    expect(piped.stdout).toBe(named.stdout);
  });

  it("fails cleanly on a bad line after many rows were written to --out (exit 1, no file, no stack trace)", () => {
    const many = Array.from({ length: 3000 }, (_, i) => ({ id: `g${i}`, text: "Stenmoor", type: "LOC" }));
    writeText(t.file("late-bad.jsonl"), `${jsonl(many)}{broken\n`);
    const r = hawser(["link", "--kb", kb, "late-bad.jsonl", "--out", "late-bad-links.jsonl"], t.dir);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("late-bad.jsonl:3001: malformed JSON");
    expect(r.stderr).not.toMatch(/ERR_STREAM|at .*node:internal/);
    expect(filesLike("late-bad-links")).toEqual([]);
  });

  it("removes the KB under construction when interrupted (exit 128 + the signal's number)", async () => {
    const rows = Array.from({ length: 200_000 }, (_, i) => `E${i},Harbour Firm ${i} Ltd,firm`);
    writeText(t.file("big.csv"), `id,name,type\n${rows.join("\n")}\n`);
    const child = spawn(process.execPath, [CLI, "index", "big.csv", "--out", "big.kb"], { cwd: t.dir });
    let stderr = "";
    child.stderr.on("data", (d) => {
      stderr += String(d);
    });
    const closed = new Promise<number | null>((resolve) => child.on("close", (code) => resolve(code)));
    // Interrupted once the temporary KB exists, mid-build.
    while (filesLike("big.kb.tmp").length === 0) await new Promise((r) => setTimeout(r, 20));
    child.kill("SIGTERM");
    expect(await closed).toBe(143);
    expect(stderr).toContain("interrupted (SIGTERM)");
    expect(filesLike("big.kb")).toEqual([]);
  });

  it("ends at once when interrupted in a computation that has no output under way (eval)", async () => {
    // eval links its whole labeled set before it prints: it once went on to the end, printed its
    // report and only then exited 130, since a signal handler waits for the event loop.
    const many = Array.from({ length: 30_000 }, (_, i) => ({
      id: `g${i}`,
      text: "Stenmoor",
      type: "LOC",
      gold: "L01",
    }));
    writeText(t.file("long-gold.jsonl"), jsonl(many));
    const child = spawn(process.execPath, [CLI, "eval", "--kb", kb, "--gold", "long-gold.jsonl"], {
      cwd: t.dir,
    });
    let stdout = "";
    child.stdout.on("data", (d) => {
      stdout += String(d);
    });
    const closed = new Promise<[number | null, NodeJS.Signals | null]>((resolve) =>
      child.on("close", (code, signal) => resolve([code, signal])),
    );
    await new Promise((r) => setTimeout(r, 500));
    child.kill("SIGINT");
    const [code, signal] = await closed;
    expect(signal === "SIGINT" || code === 130, `code ${code}, signal ${signal}`).toBe(true);
    expect(stdout).not.toContain("accuracy");
  });

  it("removes the temporary file a killed run left for the same output, and only that", async () => {
    // A run killed outright (SIGKILL) cannot remove its temporary file: the next run for the same
    // --out does, once the process that wrote it is gone and it has not been written to for a minute.
    const gone = spawnSync(process.execPath, ["-e", "0"]).pid;
    const old = new Date(Date.now() - 5 * 60_000);
    const time = Date.now() - 5 * 60_000;
    const name = (rest: string) => t.file(`.kept-links.jsonl.tmp-${rest}`);
    const stale = name(`${gone}-${time}`);
    const staleSide = name(`${gone}-${time}-journal`);
    const fresh = name(`${gone}-${time + 1}`);
    const alive = name(`${process.pid}-${time}`);
    const other = t.file(`.other.jsonl.tmp-${gone}-${time}`);
    // Names that only begin like a temporary file of kept-links.jsonl: a user's file, and the
    // temporary file of another output ("kept-links.jsonl.tmp-123-...") of a live process.
    const lookalike = name(`${gone}-${time}.backup`);
    const othersTemp = name(`123-${time}.tmp-${process.pid}-${time}`);
    const link = name(`${gone}-${time + 2}`);
    for (const f of [stale, staleSide, fresh, alive, other, lookalike, othersTemp]) writeText(f, "partial\n");
    symlinkSync(t.file("mentions.jsonl"), link);
    for (const f of [stale, staleSide, alive, other, lookalike, othersTemp]) utimesSync(f, old, old);
    const r = hawser(["link", "--kb", kb, "mentions.jsonl", "--out", "kept-links.jsonl"], t.dir);
    expect(r.status, r.stderr).toBe(0);
    for (const f of [stale, staleSide]) expect(existsSync(f), f).toBe(false);
    for (const f of [fresh, alive, other, lookalike, othersTemp, link]) expect(existsSync(f), f).toBe(true);
    expect(existsSync(t.file("mentions.jsonl"))).toBe(true);
  });

  it("links against a KB another process holds open, and the KB can be rebuilt meanwhile", () => {
    // The library keeps its read lock for as long as a KB is open (see Kb's constructor): other
    // readers and a rebuild (a new file renamed into place) must still go ahead.
    const held = openKb(kb);
    try {
      expect(held.entity(1).id).toBe("P01");
      const r = hawser(["link", "--kb", kb, "mentions.jsonl"], t.dir);
      expect(r.status).toBe(0);
      expect(r.stdout.trim().split("\n")).toHaveLength(MENTIONS.length);
      const rebuilt = hawser(["index", "gazette.csv", "--out", kb], t.dir);
      expect(rebuilt.status, rebuilt.stderr).toBe(0);
      expect(held.entity(2).id).toBe("P02");
      expect(hawser(["link", "--kb", kb, "mentions.jsonl"], t.dir).status).toBe(0);
    } finally {
      held.close();
    }
  });

  it("writes CSV with --to csv: a header and one row per mention (parsed back with csv-parse)", () => {
    const r = hawser(["link", "--kb", kb, "mentions.jsonl", "--to", "csv", "--out", "links.csv"], t.dir);
    expect(r.status).toBe(0);
    expect(r.stdout).toBe("");
    const records = parse(readFileSync(t.file("links.csv"), "utf8"), { columns: true }) as Array<
      Record<string, string>
    >;
    expect(Object.keys(records[0]!)).toEqual([...CSV_COLUMNS]);
    expect(records).toHaveLength(MENTIONS.length);
    expect(records.map((x) => x.mention)).toEqual(MENTIONS.map((x) => x.id));
    // The text with commas survives the quoting.
    expect(records[4]!.text).toBe("Pell, Tobias, & Sons");
    expect(records[0]!.entity).toBe("L02");
    expect(records[3]!.entity).toBe("");
    expect(JSON.parse(records[0]!.candidates!)[0].entity).toBe("L02");
    expect(records[0]!.reason_codes!.split(";")[0]).toBe("linked");
  });

  it("exits 1 on a malformed JSONL line in the middle, naming file and line; --out is not written", () => {
    const lines = jsonl(MENTIONS).split("\n");
    lines.splice(3, 0, '{"id": "bad", "text": "Stenmouth"');
    writeText(t.file("broken.jsonl"), lines.join("\n"));
    const toStdout = hawser(["link", "--kb", kb, "broken.jsonl"], t.dir);
    expect(toStdout.status).toBe(1);
    expect(toStdout.stderr).toContain("broken.jsonl:4");
    const r = hawser(["link", "--kb", kb, "broken.jsonl", "--out", "broken-links.jsonl"], t.dir);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("broken.jsonl:4");
    expect(filesLike("broken-links")).toEqual([]);
  });

  // The temporary output is opened synchronously and the input format is checked before it, so a
  // run refused at once leaves nothing behind.
  it("leaves no temporary output when the mentions format is refused (exit 2)", () => {
    writeText(t.file("mentions.txt"), jsonl(MENTIONS));
    for (const n of [1, 2, 3]) {
      const r = hawser(["link", "--kb", kb, "mentions.txt", "--out", `refused-${n}.jsonl`], t.dir);
      expect(r.status).toBe(2);
      expect(r.stderr).toContain("mentions.txt");
    }
    expect(filesLike("refused-")).toEqual([]);
  });

  it("exits 1 on a mention without text, naming the field", () => {
    writeText(t.file("notext.jsonl"), jsonl([MENTIONS[0], { id: "n2", type: "PER" }]));
    const r = hawser(["link", "--kb", kb, "notext.jsonl", "--out", "notext-links.jsonl"], t.dir);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("notext.jsonl:2");
    expect(r.stderr).toContain('"text"');
    expect(filesLike("notext-links")).toEqual([]);
  });

  it("exits 1 on a KB file that is not a KB, naming it", () => {
    const r = hawser(["link", "--kb", "mentions.jsonl", "mentions.jsonl"], t.dir);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("mentions.jsonl");
    expect(r.stderr).toMatch(/not a hawser KB/);
  });

  it("exits 2 on an unknown option, a missing --kb and a bad --threshold", () => {
    const unknown = hawser(["link", "--kb", kb, "mentions.jsonl", "--fastest"], t.dir);
    expect(unknown.status).toBe(2);
    expect(unknown.stderr).toContain("--fastest");
    const noKb = hawser(["link", "mentions.jsonl"], t.dir);
    expect(noKb.status).toBe(2);
    expect(noKb.stderr).toContain("--kb");
    expect(hawser(["link", "--kb", kb, "mentions.jsonl", "--threshold", "2"], t.dir).status).toBe(2);
    expect(hawser(["dredge"], t.dir).status).toBe(2);
  });

  it("writes an empty output and exits 0 for an empty mentions file", () => {
    writeText(t.file("empty.jsonl"), "");
    const toStdout = hawser(["link", "--kb", kb, "empty.jsonl"], t.dir);
    expect(toStdout.status).toBe(0);
    expect(toStdout.stdout).toBe("");
    expect(toStdout.stderr).toContain("of 0 mentions");
    const r = hawser(["link", "--kb", kb, "empty.jsonl", "--out", "empty-links.jsonl"], t.dir);
    expect(r.status).toBe(0);
    expect(readFileSync(t.file("empty-links.jsonl"), "utf8")).toBe("");
    // CSV output of no mentions is the header alone.
    const csv = hawser(["link", "--kb", kb, "empty.jsonl", "--to", "csv"], t.dir);
    expect(csv.status).toBe(0);
    expect(csv.stdout).toBe(`${CSV_COLUMNS.join(",")}\r\n`);
  });
});

describe("hawser agree", () => {
  it("prints the label pairs the two files differ on, most frequent first", () => {
    const m = (id: string, gold: string | null) => ({ id, text: "Stenmoor", type: "LOC", gold });
    writeText(
      t.file("agree-a.jsonl"),
      jsonl([m("m1", "P01"), m("m2", "P01"), m("m3", null), m("m4", "T01")]),
    );
    writeText(t.file("agree-b.jsonl"), jsonl([m("m1", null), m("m2", null), m("m3", "P02"), m("m4", "T01")]));
    const r = hawser(["agree", "agree-a.jsonl", "agree-b.jsonl"], t.dir);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("mentions 4\n");
    expect(r.stdout).toContain("  P01 -> NIL: 2\n  NIL -> P02: 1\n");
    expect(r.stdout).not.toContain("T01 -> T01");
  });
});

describe("hawser info", () => {
  it("prints the KB's facts as JSON", () => {
    const r = hawser(["info", kb], t.dir);
    expect(r.status).toBe(0);
    const info = JSON.parse(r.stdout) as Record<string, unknown>;
    expect(info.format).toBe("hawser-kb");
    expect(info.schemaVersion).toBe(SCHEMA_VERSION);
    expect(info.entities).toBe(GAZETTE_ROWS);
    expect(info.sourceFile).toBe("gazette.csv");
    expect(info.fingerprint).toMatch(/^[0-9a-f]{32}$/);
    // Measured on the table: the gazette's few hundred names are not crowded.
    expect(info.nearNameRate).toBeGreaterThanOrEqual(0);
    expect(info.nearNameRate).toBeLessThan(0.05);
    // The kind columns are listed; their values only counted.
    expect(Array.isArray(info.kindColumns)).toBe(true);
    expect(typeof info.kindValues).toBe("number");
  });

  it("exits 1 on a missing KB", () => {
    const r = hawser(["info", "nowhere.kb"], t.dir);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain("nowhere.kb");
  });
});
