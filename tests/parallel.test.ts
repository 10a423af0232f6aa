/**
 * Linking on several threads (src/link/parallel.ts): the rows, warnings and failures are those
 * of one thread, on the bundled sample archive (whose mentions come in documents, so document
 * units cross batch bounds) and on streams made to cut documents and batches awkwardly.
 * The threads run the build's worker script (dist/link/link-worker.js), as the CLI tests do.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { join } from "node:path";
import { Writable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { evaluate } from "../src/commands/evaluate.js";
import { link } from "../src/commands/link.js";
import { SAMPLES_DIR } from "../src/commands/demo.js";
import { buildKb } from "../src/kb/build.js";
import { type Kb, openKb } from "../src/kb/kb.js";
import { LabelMap } from "../src/labels/label-map.js";
import { createLinker } from "../src/link/linker.js";
import { LinkPool } from "../src/link/parallel.js";
import type { LinkRow, Mention } from "../src/types.js";
import { InputError, UsageError } from "../src/util/errors.js";
import { hawser, requireBuiltCli } from "./helpers/cli.js";
import { tempDir } from "./helpers/gazette.js";
import { collect, failure } from "./helpers/streams.js";

let t: ReturnType<typeof tempDir>;
let kbFile: string;
let kb: Kb;
let mentions: Mention[];
const mentionsFile = join(SAMPLES_DIR, "gazette-mentions.jsonl");

beforeAll(async () => {
  requireBuiltCli();
  t = tempDir("hawser-parallel-");
  kbFile = t.file("kb.sqlite");
  await buildKb({ table: join(SAMPLES_DIR, "gazette-entities.csv"), out: kbFile });
  kb = openKb(kbFile);
  mentions = readFileSync(mentionsFile, "utf8")
    .trim()
    .split("\n")
    .map((l) => JSON.parse(l) as Mention);
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

/** A stream with documents longer than a batch (256), short ones, and mentions without a doc. */
function awkwardStream(): Mention[] {
  const out: Mention[] = [];
  let n = 0;
  const take = (doc: string | undefined, count: number) => {
    for (let i = 0; i < count; i++) {
      const m = mentions[n++ % mentions.length]!;
      const { doc: _doc, ...rest } = m;
      out.push({ ...rest, id: `x${out.length}`, ...(doc !== undefined ? { doc } : {}) });
    }
  };
  take("long", 600);
  take(undefined, 3);
  take("short", 2);
  take("long", 5); // the same doc again after others: a unit of its own
  take(undefined, 300);
  take("tail", 1);
  return out;
}

describe("a pool of linking threads", () => {
  it("gives the rows of one thread, in input order, for any number of threads", async () => {
    const one = await collect(createLinker(kb).linkAll(mentions));
    const awkward = awkwardStream();
    const oneAwkward = await collect(createLinker(kb).linkAll(awkward));
    expect(oneAwkward.filter((r) => r.reasons.some((x) => x.code.startsWith("doc-"))).length).toBeGreaterThan(
      0,
    );
    for (const jobs of [1, 2, 3]) {
      const pool = await LinkPool.start(kbFile, {}, jobs);
      try {
        expect(pool.jobs).toBe(jobs);
        expect(await collect(pool.linkAll(mentions))).toEqual(one);
        expect(await collect(pool.linkAll(awkward))).toEqual(oneAwkward);
      } finally {
        await pool.close();
      }
    }
  });

  it("passes its options to every thread (threshold, top, labels) and adds up label counts in order", async () => {
    const labels = () =>
      new LabelMap(
        new Map([
          [
            "SHIP",
            {
              cls: "other" as const,
              linkable: false,
              compat: { person: 0, organization: 0, location: 0, other: 1 },
            },
          ],
        ]),
      );
    const odd = mentions.slice(0, 700).map((m, i) => ({
      ...m,
      type: i % 97 === 5 ? "WEIRD" : i % 89 === 3 ? "ODD" : i % 50 === 0 ? "SHIP" : m.type,
    }));
    const options = { threshold: 0.8, top: 1, maxCandidates: 5 };
    const linker = createLinker(kb, { ...options, labels: labels() });
    const want = await collect(linker.linkAll(odd));
    const pool = await LinkPool.start(kbFile, { ...options, labels: labels() }, 2);
    try {
      expect(await collect(pool.linkAll(odd))).toEqual(want);
      expect(pool.labels.warnings()).toEqual(linker.labels.warnings());
      // WEIRD and ODD unknown, SHIP not linkable.
      expect(pool.labels.warnings().length).toBe(3);
    } finally {
      await pool.close();
    }
    expect(want.every((r) => r.candidates.length <= 1)).toBe(true);
  });

  it("gives the rows read before a failing source, then its error", async () => {
    async function* failing(): AsyncGenerator<Mention> {
      yield* mentions.slice(0, 300);
      throw new InputError({ file: "m.jsonl", line: 301 }, "not JSON");
    }
    const pool = await LinkPool.start(kbFile, {}, 2);
    try {
      const rows: LinkRow[] = [];
      const error = await failure(
        (async function* () {
          for await (const r of pool.linkAll(failing())) {
            rows.push(r);
            yield r;
          }
        })(),
      );
      expect(error).toBeInstanceOf(InputError);
      expect(error.message).toBe("m.jsonl:301: not JSON");
      const linker = createLinker(kb);
      const sequential: LinkRow[] = [];
      await failure(
        (async function* () {
          for await (const r of linker.linkAll(failing())) {
            sequential.push(r);
            yield r;
          }
        })(),
      );
      expect(rows).toEqual(sequential);
      expect(rows.length).toBe(300);
      // Broken off part way, the pool links the next stream whole.
      for await (const _ of pool.linkAll(mentions)) break;
      expect(await collect(pool.linkAll(mentions.slice(0, 50)))).toEqual(
        await collect(createLinker(kb).linkAll(mentions.slice(0, 50))),
      );
    } finally {
      await pool.close();
    }
    await expect(collect(pool.linkAll(mentions))).rejects.toThrow(UsageError);
  });

  it("refuses a bad number of threads, and passes a thread's opening error on with its class", async () => {
    for (const jobs of [0, 1.5, 65, Number.NaN])
      await expect(LinkPool.start(kbFile, {}, jobs)).rejects.toThrow(UsageError);
    const notKb = t.file("not.kb");
    writeFileSync(notKb, "{}\n");
    const e = await LinkPool.start(notKb, {}, 2).catch((x: unknown) => x as Error);
    expect(e).toBeInstanceOf(InputError);
    expect((e as Error).message).toBe(`${notKb}: not a hawser KB file`);
    await expect(LinkPool.start(kbFile, { threshold: 2 } as never, 2)).rejects.toThrow(UsageError);
    await expect(LinkPool.start(kbFile, { treshold: 0.2 } as never, 2)).rejects.toThrow(/treshold/);
  });
});

describe("what a pool is given, as one thread takes it", () => {
  /** The rows given before an error or the stop, the error (null: none), and the label warnings. */
  async function drain(rowsOf: AsyncIterable<LinkRow>, labels: LabelMap, stopAfter: number) {
    const rows: LinkRow[] = [];
    let error: unknown = null;
    try {
      for await (const r of rowsOf) {
        rows.push(r);
        if (rows.length >= stopAfter) break;
      }
    } catch (e) {
      error = e;
    }
    return { rows, error, warnings: labels.warnings() };
  }
  type Source = () => Iterable<Mention> | AsyncIterable<Mention>;
  const sequential = (source: Source, stopAfter = Infinity) => {
    const linker = createLinker(kb);
    return drain(linker.linkAll(source()), linker.labels, stopAfter);
  };
  const pooled = (pool: LinkPool, source: Source, stopAfter = Infinity) =>
    drain(pool.linkAll(source()), pool.labels, stopAfter);
  const single = () => mentions.map(({ doc: _doc, ...m }) => m);

  it("reads a mention's fields when it comes: extra fields that cannot be copied, getters, one object reused", async () => {
    // A function in a field the linker does not read once broke the pool for good.
    const withFunction = () => single().map((m, i) => (i === 600 ? { ...m, note: () => 1 } : m));
    class Held {
      constructor(private readonly m: Mention) {}
      get id() {
        return this.m.id;
      }
      get text() {
        return this.m.text;
      }
      get type() {
        return this.m.type;
      }
      get context() {
        return this.m.context;
      }
    }
    const getters = () => single().map((m) => new Held(m) as unknown as Mention);
    async function* reused(): AsyncGenerator<Mention> {
      const one = {} as Mention;
      for (const m of single().slice(0, 300)) {
        Object.assign(one, { id: m.id, text: m.text, type: m.type, context: m.context });
        yield one;
      }
    }
    const pool = await LinkPool.start(kbFile, {}, 2);
    try {
      for (const source of [withFunction, getters, reused, withFunction]) {
        const want = await sequential(source);
        expect(want.error).toBeNull();
        const got = await pooled(pool, source);
        expect(got.error).toBeNull();
        expect(got.rows).toEqual(want.rows);
      }
    } finally {
      await pool.close();
    }
  });

  it("an invalid mention: the rows before it, then the linker's error", async () => {
    const pool = await LinkPool.start(kbFile, {}, 2);
    try {
      for (const at of [0, 5, 300, 700]) {
        const source = () => single().map((m, i) => (i === at ? { ...m, start: 9, end: 3 } : m));
        const want = await sequential(source);
        const got = await pooled(pool, source);
        expect(want.rows.length).toBe(at);
        expect(got.rows).toEqual(want.rows);
        expect(got.error).toBeInstanceOf(UsageError);
        expect((got.error as Error).message).toBe((want.error as Error).message);
      }
      // The pool links the next stream whole.
      expect((await pooled(pool, () => single().slice(0, 40))).rows).toEqual(
        (await sequential(() => single().slice(0, 40))).rows,
      );
    } finally {
      await pool.close();
    }
  });

  it("counts labels in input order, and only of the rows given when the caller stops early", async () => {
    // A long document with one label first, then mentions alone with another: the document's
    // rows come back last of the first batches, but its label was met first.
    const ordered = () => [
      ...mentions.slice(0, 600).map((m, i) => ({ ...m, doc: "long", type: i === 0 ? "ZZA" : m.type })),
      ...single()
        .slice(0, 300)
        .map((m, i) => ({ ...m, id: `s${i}`, type: i === 0 ? "ZZB" : m.type })),
    ];
    for (const stopAfter of [Infinity, 5, 601]) {
      const want = await sequential(ordered, stopAfter);
      const pool = await LinkPool.start(kbFile, {}, 2);
      try {
        const got = await pooled(pool, ordered, stopAfter);
        expect(got.rows).toEqual(want.rows);
        expect(got.warnings).toEqual(want.warnings);
        await new Promise((resolve) => setTimeout(resolve, 200));
        expect(pool.labels.warnings()).toEqual(want.warnings); // nothing counted after the stop
      } finally {
        await pool.close();
      }
    }
    expect((await sequential(ordered)).warnings[0]).toMatch(/"ZZA"/);
  });

  it("takes its options as createLinker does: none, or an object", async () => {
    const pool = await LinkPool.start(kbFile);
    try {
      expect(pool.jobs).toBe(Math.min(availableParallelism(), 64));
      expect(await collect(pool.linkAll(mentions.slice(0, 20)))).toEqual(
        await collect(createLinker(kb).linkAll(mentions.slice(0, 20))),
      );
    } finally {
      await pool.close();
    }
    for (const bad of [null, [], "x"])
      await expect(LinkPool.start(kbFile, bad as never, 2)).rejects.toThrow(
        /^linker options must be an object/,
      );
  });
});

describe("link with jobs", () => {
  it("writes the file one thread writes, with the same summary", async () => {
    const a = await link({ kb: kbFile, mentions: mentionsFile, out: t.file("a.jsonl") });
    const b = await link({ kb: kbFile, mentions: mentionsFile, out: t.file("b.jsonl"), jobs: 2 });
    expect(readFileSync(t.file("b.jsonl"), "utf8")).toBe(readFileSync(t.file("a.jsonl"), "utf8"));
    expect({ ...b, seconds: 0, out: null }).toEqual({ ...a, seconds: 0, out: null });
    const c = await link({ kb: kbFile, mentions: mentionsFile, out: t.file("c.csv"), jobs: 3 });
    await link({ kb: kbFile, mentions: mentionsFile, out: t.file("d.csv") });
    expect(readFileSync(t.file("c.csv"), "utf8")).toBe(readFileSync(t.file("d.csv"), "utf8"));
    expect(c.mentions).toBe(mentions.length);
  });

  it("fails on a bad line with its location and writes no file; stdout gets the rows before it", async () => {
    const lines = readFileSync(mentionsFile, "utf8").trim().split("\n");
    const bad = t.file("bad.jsonl");
    writeFileSync(bad, `${[...lines.slice(0, 400), "{not json", ...lines.slice(400)].join("\n")}\n`);
    const out = t.file("bad-out.jsonl");
    await expect(link({ kb: kbFile, mentions: bad, out, jobs: 2 })).rejects.toThrow(/bad\.jsonl:401/);
    expect(() => readFileSync(out)).toThrow(/ENOENT/);
    const written: string[] = [];
    const sink = new Writable({
      write(chunk, _encoding, done) {
        written.push(String(chunk));
        done();
      },
    });
    await expect(link({ kb: kbFile, mentions: bad, stdout: sink, jobs: 2 })).rejects.toThrow(InputError);
    const rows = written.join("").trim().split("\n");
    expect(rows.length).toBe(400);
    expect(rows).toEqual(readFileSync(t.file("a.jsonl"), "utf8").trim().split("\n").slice(0, 400));
  });

  it("eval with jobs gives the report of one thread (candidate recall at k too)", async () => {
    const gold = join(SAMPLES_DIR, "gazette-gold.jsonl");
    for (const k of [undefined, 5]) {
      const one = await evaluate({ kb: kbFile, gold, ...(k ? { k } : {}) });
      const two = await evaluate({ kb: kbFile, gold, jobs: 2, ...(k ? { k } : {}) });
      expect(two).toEqual(one);
    }
    await expect(evaluate({ kb: kbFile, gold, jobs: 65 })).rejects.toThrow(
      "evaluate: jobs must be a whole number in [1, 64], got 65",
    );
  });

  it("refuses jobs out of range; the command line takes --jobs", async () => {
    await expect(link({ kb: kbFile, mentions: mentionsFile, jobs: 0 })).rejects.toThrow(
      "link: jobs must be a whole number in [1, 64], got 0",
    );
    const r = hawser(["link", "--kb", kbFile, mentionsFile, "--jobs", "2", "--out", "cli.jsonl"], t.dir);
    expect(r.status).toBe(0);
    expect(readFileSync(t.file("cli.jsonl"), "utf8")).toBe(readFileSync(t.file("a.jsonl"), "utf8"));
    for (const n of ["0", "65", "1.5"]) {
      const bad = hawser(["link", "--kb", kbFile, mentionsFile, "--jobs", n], t.dir);
      expect(bad.status).toBe(2);
      expect(bad.stderr).toMatch(/--jobs must be a whole number from 1 to 64/);
    }
    // A missing mentions file is named before the threads start, as with one thread.
    const one = hawser(["link", "--kb", kbFile, "nosuch.jsonl"], t.dir);
    const many = hawser(["link", "--kb", kbFile, "nosuch.jsonl", "--jobs", "8"], t.dir);
    expect(one.status).toBe(1);
    expect(many.status).toBe(1);
    expect(many.stderr).toBe(one.stderr);
    expect(many.stderr).toMatch(/nosuch\.jsonl: cannot read the file: no such file or directory \(ENOENT\)/);
  });
});
