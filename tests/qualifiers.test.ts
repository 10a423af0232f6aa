/**
 * Qualifiers, the words a name carries beside its core (a firm's legal form, a place's leading
 * designator such as "Republic of" or "City of"): the key sets them aside, so short and official
 * forms meet, and the exactKey feature gives less credit when they differ, so two entries that
 * only a qualifier tells apart are told apart. Names are invented (the gazette scenario).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildKb } from "../src/kb/build.js";
import { type AliasRow, type Kb, openKb } from "../src/kb/kb.js";
import { createLinker, type Linker } from "../src/link/linker.js";
import { normalizeName } from "../src/normalize/name.js";
import {
  CONFLICTING_QUALIFIER_CREDIT,
  keyCredit,
  ONE_SIDED_QUALIFIER_CREDIT,
} from "../src/score/features.js";
import type { LinkRow } from "../src/types.js";
import { tempDir, writeText } from "./helpers/gazette.js";

const TABLE = [
  "id,name,type,aliases,description,prior",
  "F1,Pell & Co.,firm,,rope makers of Stenmouth,5",
  "F2,Pell Ltd.,firm,,grain brokers of Stenmouth,5",
  "F3,Hobbard Bros.,firm,,tug owners,3",
  "L1,Kingdom of Carrow,place,,island realm at the river mouth,40",
  "L2,Wexcombe,town,,market town on the Tolley,20",
  "L3,City of Wexcombe,place,,the chartered old borough within Wexcombe,20",
  "",
].join("\n");

let t: ReturnType<typeof tempDir>;
let kb: Kb;
let linker: Linker;

beforeAll(async () => {
  t = tempDir("hawser-qualifiers-");
  const table = writeText(t.file("table.csv"), TABLE);
  await buildKb({ table, out: t.file("q.kb") });
  kb = openKb(t.file("q.kb"));
  linker = createLinker(kb);
});
afterAll(() => {
  kb.close();
  t.cleanup();
});

const link = (text: string, type: string): LinkRow => linker.link({ id: text, text, type });
const codes = (r: LinkRow) => r.reasons.map((x) => x.code);
const credit = (mention: string, alias: string, cls: "organization" | "location" | "person") => {
  const a = normalizeName(alias, cls);
  const row: AliasRow = {
    aid: 0,
    text: alias,
    key: a.key,
    full: a.full,
    ocr: a.ocrKey,
    canonical: true,
    tokens: a.tokens,
  };
  return keyCredit(normalizeName(mention, cls), row, cls === "person");
};

describe("keyCredit", () => {
  it("gives full credit to equal full forms, less to one-sided and conflicting qualifiers", () => {
    expect(credit("Pell and Company", "Pell & Co.", "organization")).toBe(1);
    expect(credit("Pell", "Pell & Co.", "organization")).toBe(ONE_SIDED_QUALIFIER_CREDIT);
    expect(credit("Pell & Co.", "Pell", "organization")).toBe(ONE_SIDED_QUALIFIER_CREDIT);
    expect(credit("Pell & Co.", "Pell Ltd.", "organization")).toBe(CONFLICTING_QUALIFIER_CREDIT);
    expect(credit("Carrow", "Kingdom of Carrow", "location")).toBe(ONE_SIDED_QUALIFIER_CREDIT);
    expect(credit("Republic of Carrow", "Kingdom of Carrow", "location")).toBe(CONFLICTING_QUALIFIER_CREDIT);
    // Persons' generational suffixes are weighed by nameMatch, not here.
    expect(credit("Josiah Pell Jr.", "Josiah Pell", "person")).toBe(1);
    expect(CONFLICTING_QUALIFIER_CREDIT).toBeLessThan(ONE_SIDED_QUALIFIER_CREDIT);
  });
});

describe("linking with qualifiers", () => {
  it("tells two firms apart by their legal forms", () => {
    const ltd = link("Pell Limited", "ORG");
    expect(ltd.entity).toBe("F2");
    const co = link("Pell and Company", "ORG");
    expect(co.entity).toBe("F1");
    // The other firm is still a candidate, with the conflict cited and less key credit.
    const other = co.candidates.find((c) => c.entity === "F2");
    expect(other?.features.exactKey).toBe(CONFLICTING_QUALIFIER_CREDIT);
    expect(other?.score ?? 1).toBeLessThan(co.score);
  });

  it("leaves a bare name shared by two firms ambiguous", () => {
    const r = link("Pell", "ORG");
    expect(r.entity).toBeNull();
    expect(codes(r)[0]).toBe("ambiguous");
  });

  it("links a short form to a name with a legal form or designator, citing the difference", () => {
    const firm = link("Hobbard", "ORG");
    expect(firm.entity).toBe("F3");
    expect(codes(firm)).toContain("name-exact");
    expect(codes(firm)).toContain("qualifier-differs");
    const place = link("Carrow", "GPE");
    expect(place.entity).toBe("L1");
    expect(codes(place)).toContain("qualifier-differs");
    expect(place.candidates[0]?.features.exactKey).toBe(ONE_SIDED_QUALIFIER_CREDIT);
  });

  it("does not link a name whose only difference is a conflicting designator", () => {
    // The table holds the Kingdom of Carrow but no Republic of Carrow: the shared key "carrow" is
    // not evidence once the designators conflict, so the republic is NIL, not the kingdom.
    const r = link("Republic of Carrow", "GPE");
    expect(r.entity).toBeNull();
    const kingdom = r.candidates.find((c) => c.entity === "L1");
    expect(kingdom?.features.exactKey).toBe(0);
  });

  it("prefers the entry spelled alike when a table holds both the short and the designated form", () => {
    expect(link("City of Wexcombe", "GPE").entity).toBe("L3");
    expect(link("Wexcombe", "GPE").entity).toBe("L2");
    // An exact spelling is not flagged.
    expect(codes(link("Wexcombe", "GPE"))).not.toContain("qualifier-differs");
  });
});
