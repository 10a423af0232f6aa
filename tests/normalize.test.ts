/**
 * Name normalization per class (persons, organizations, places), OCR folding, acronym and initials
 * keys, and the label map from NER labels to entity classes. Names are invented.
 */
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { foldLabel, LabelMap, readLabelMapFile } from "../src/labels/label-map.js";
import { joinLineBreaks, normalizeName, readAcronym } from "../src/normalize/name.js";
import { ocrFold } from "../src/normalize/ocr.js";
import { throwsInput } from "./helpers/errors.js";
import { tempDir, writeText } from "./helpers/gazette.js";

describe("normalizeName: persons", () => {
  it("drops honorifics and ranks before the name", () => {
    const n = normalizeName("Capt. J. H. Aldous", "person");
    expect(n.tokens).toEqual(["j", "h", "aldous"]);
    expect(n.key).toBe("j h aldous");
    expect(normalizeName("Mr. Tobias Pell", "person").key).toBe("tobias pell");
    expect(normalizeName("Rev. Dr. Ezra Marsh", "person").key).toBe("ezra marsh");
  });

  it("keeps a lone honorific-like word when nothing else is left", () => {
    // "Major" alone is a surname, not a rank followed by nothing.
    expect(normalizeName("Major", "person").tokens).toEqual(["major"]);
  });

  it('reorders "Last, First" into first-name order', () => {
    expect(normalizeName("Aldous, J. H.", "person").key).toBe("j h aldous");
    expect(normalizeName("Aldous, Josiah Hale", "person").key).toBe(
      normalizeName("Josiah Hale Aldous", "person").key,
    );
  });

  it('splits off a generational suffix, also after a comma ("Pell, Sr.")', () => {
    const jr = normalizeName("Josiah Pell Jr.", "person");
    expect(jr.key).toBe("josiah pell");
    expect(jr.suffix).toBe("jr");
    expect(jr.full).toBe("josiah pell jr");
    expect(normalizeName("Josiah Pell Junior", "person").suffix).toBe("jr");
    const sr = normalizeName("Pell, Sr.", "person");
    expect(sr.key).toBe("pell");
    expect(sr.suffix).toBe("sr");
    // The suffix keeps father and son apart in the full form, though the keys are equal.
    expect(normalizeName("Josiah Pell Sr.", "person").full).not.toBe(jr.full);
    expect(normalizeName("Josiah Pell", "person").suffix).toBeNull();
  });

  it("expands clerks' abbreviations of given names", () => {
    expect(normalizeName("Jno. Pell", "person").key).toBe("john pell");
    expect(normalizeName("Wm. Aldous", "person").key).toBe("william aldous");
    expect(normalizeName("Thos. Vole", "person").key).toBe("thomas vole");
  });

  it("folds diacritics and case", () => {
    const n = normalizeName("Bérénice Ñuñez", "person");
    expect(n.key).toBe("berenice nunez");
    expect(n.key).toBe(normalizeName("BERENICE NUNEZ", "person").key);
    expect(normalizeName("Ærnst Strøm", "person").key).toBe("aernst strom");
  });

  it("drops post-nominal letters written with their dots, or in capitals after a comma", () => {
    expect(normalizeName("Capt. W. Harland, R.N.", "person").key).toBe("w harland");
    expect(normalizeName("Thos. Pell, J.P., M.P.", "person").key).toBe("thomas pell");
    expect(normalizeName("Thos. Pell, Esq., J.P.", "person").key).toBe("thomas pell");
    expect(normalizeName("Sir J. Kell, Bart.", "person").key).toBe("j kell");
    expect(normalizeName("Harland, RN", "person").key).toBe("harland"); // not "Rn Harland"
    // A surname that spells post-nominal letters stays: no dots, no comma, or all in capitals.
    expect(normalizeName("John Ma", "person").key).toBe("john ma");
    expect(normalizeName("JOHN MA", "person").key).toBe("john ma");
    expect(normalizeName("R.N.", "person").key).toBe("r n"); // nothing name-like would be left
  });

  it("reads the words newspapers and lists put around a person's name", () => {
    expect(normalizeName("the late Mr. Aldous", "person").key).toBe("aldous");
    expect(normalizeName("Mr. J. H. Aldous, junr.", "person").key).toBe("j h aldous");
    expect(normalizeName("Mr. J. H. Aldous, junr.", "person").suffix).toBe("jr");
    // An appositive after a whole name is left out; a given name after a surname is reordered.
    expect(normalizeName("Jabez Aldous, harbour master", "person").key).toBe("jabez aldous");
    expect(normalizeName("J. Pell, of Stenmouth", "person").key).toBe("j pell");
    expect(normalizeName("Aldous, Jabez", "person").key).toBe("jabez aldous");
    expect(normalizeName("Van Pell, Jan", "person").key).toBe("jan van pell");
    // A surname with given names in brackets, as some lists print it; other brackets are asides.
    expect(normalizeName("Aldous (Jabez H.)", "person").key).toBe("jabez h aldous");
    expect(normalizeName("Aldous (harbour master)", "person").key).toBe("aldous");
  });

  it("puts initials after a surname first, as lists print names without the comma", () => {
    expect(normalizeName("Aldous J.H.", "person").key).toBe("j h aldous");
    expect(normalizeName("Aldous J. H.", "person").initialsKey).toBe("j aldous");
    expect(normalizeName("Walter H.", "person").key).toBe("walter h"); // a given name first stays
    expect(normalizeName("Aldous", "person").key).toBe("aldous");
  });

  it("builds an initials key from the first initial and the surname", () => {
    expect(normalizeName("Josiah Hale Aldous", "person").initialsKey).toBe("j aldous");
    expect(normalizeName("J. H. Aldous", "person").initialsKey).toBe("j aldous");
    expect(normalizeName("Aldous", "person").initialsKey).toBeNull();
    expect(normalizeName("Carrow Lime Works", "organization").initialsKey).toBeNull();
  });
});

describe("normalizeName: organizations and places", () => {
  it("removes legal forms from the key and spells them one way in the full form", () => {
    const a = normalizeName("Pell & Sons Ltd.", "organization");
    const b = normalizeName("Pell and Sons Limited", "organization");
    expect(a.key).toBe("pell");
    expect(b.key).toBe("pell");
    expect(a.full).toBe(b.full);
    expect(a.full).toContain("ltd");
    expect(normalizeName("Stenmouth Packet Company", "organization").key).toBe(
      normalizeName("Stenmouth Packet Co.", "organization").key,
    );
  });

  it("does not strip a legal-form word that heads the name", () => {
    expect(normalizeName("Company of Watermen", "organization").tokens[0]).toBe("company");
  });

  it("expands place-name abbreviations", () => {
    expect(normalizeName("St. Wenna", "location").key).toBe("saint wenna");
    expect(normalizeName("Ft. Carrow", "location").key).toBe("fort carrow");
    expect(normalizeName("Pt. Ellery", "location").key).toBe("port ellery");
    expect(normalizeName("Mt. Sorrel", "location").key).toBe("mount sorrel");
    // Organizations named after a place get the same expansion.
    expect(normalizeName("St. Wenna Mills", "organization").key).toBe("saint wenna mills");
  });

  it("sets a leading place designator aside from the key and keeps it in the full form", () => {
    const official = normalizeName("Republic of Korea", "location");
    expect(official.key).toBe("korea");
    expect(official.full).toBe("korea republic");
    expect(normalizeName("Kingdom of the Netherlands", "location").key).toBe("netherlands");
    expect(normalizeName("Grand Duchy of Luxembourg", "location").key).toBe("luxembourg");
    expect(normalizeName("Federated States of Micronesia", "location").key).toBe("micronesia");
    // Nested designators, one after the other.
    expect(normalizeName("Republic of the Union of Myanmar", "location").key).toBe("myanmar");
    // A catalogue inversion is read first: "Korea, Democratic People's Republic of".
    const dprk = normalizeName("Korea, Democratic People's Republic of", "location");
    expect(dprk.key).toBe("korea");
    expect(dprk.full).toBe("korea democratic peoples republic");
    // Abbreviated designators, read as such inside the phrase only.
    expect(normalizeName("Rep. of Korea", "location").full).toBe(official.full);
    expect(normalizeName("Fed. Rep. of Carrow", "location").key).toBe("carrow");
    expect(normalizeName("Dist. Marsh", "location").key).toBe("dist marsh");
    // The gazette's own forms.
    expect(normalizeName("City of Thornford", "location").key).toBe("thornford");
    expect(normalizeName("Borough of St. Wenna", "location").key).toBe("saint wenna");
  });

  it("reads a bracketed catalogue inversion, and drops other asides", () => {
    const kr = normalizeName("Korea (the Republic of)", "location");
    expect(kr.key).toBe("korea");
    expect(kr.full).toBe("korea republic");
    expect(normalizeName("Congo (the Democratic Republic of the)", "location").full).toBe(
      normalizeName("Democratic Republic of the Congo", "location").full,
    );
    expect(normalizeName("Wexcombe Dock Company (The)", "organization").key).toBe("wexcombe dock");
    expect(normalizeName("Virgin Isles (British)", "location").key).toBe("virgin isles");
    // Persons keep their asides out of the key, never inverted.
    expect(normalizeName("Josiah Pell (master of)", "person").key).toBe("josiah pell");
    // The acronym spells the designator: "DRC".
    expect(normalizeName("Congo (the Democratic Republic of the)", "location").acronymKey).toBe("drc");
  });

  it("drops asides, nested ones too, and keeps the text of unclosed brackets", () => {
    expect(normalizeName("Falkland Isles (Malvinas)", "location").key).toBe("falkland isles");
    expect(normalizeName("Falkland Isles (Malvinas (old))", "location").key).toBe("falkland isles");
    expect(normalizeName("Pell [dec.] & Co.", "organization").key).toBe("pell");
    expect(normalizeName("((( Wenna", "location").key).toBe("wenna");
    expect(normalizeName("(Wenna)", "location").key).toBe("wenna");
  });

  it("sets a trailing republic or federation aside, with its modifiers", () => {
    const ru = normalizeName("Russian Federation", "location");
    expect(ru.key).toBe("russian");
    expect(ru.full).toBe("russian federation");
    expect(normalizeName("Lao People's Democratic Republic", "location").key).toBe("lao");
    expect(normalizeName("Syrian Arab Republic", "location").key).toBe("syrian");
    expect(normalizeName("Dominican Republic", "location").key).toBe("dominican");
    // One token is always left, and other trailing heads are the name itself.
    expect(normalizeName("Democratic Republic", "location").key).toBe("democratic");
    expect(normalizeName("United Kingdom", "location").key).toBe("united kingdom");
    expect(normalizeName("Wenna Federation", "organization").key).toBe("wenna federation");
  });

  it("leaves designator words alone where they are the name", () => {
    // After "united", "states" and "kingdom" are the name people use ("United Republic of" is not).
    expect(normalizeName("United States of America", "location").key).toBe("united states of america");
    expect(normalizeName("United Kingdom of Carrow and Wenna", "location").key).toBe(
      "united kingdom of carrow and wenna",
    );
    expect(normalizeName("United Republic of Carrow", "location").key).toBe("carrow");
    // Nothing after it, or not followed by "of".
    expect(normalizeName("Republic of", "location").key).toBe("republic of");
    expect(normalizeName("Republic", "location").key).toBe("republic");
    expect(normalizeName("Kingdom Landing", "location").key).toBe("kingdom landing");
    // Only places: a firm or a person keeps the words.
    expect(normalizeName("City of Thornford Gas Company", "organization").tokens[0]).toBe("city");
    // The acronym still spells the designator: "USA", "UAE", "ROK".
    expect(normalizeName("Republic of South Wenna", "location").acronymKey).toBe("rsw");
  });

  it("leaves place abbreviations alone for persons", () => {
    // "St." in a person's name is not a place ("Josiah St. Aldous" keeps "st").
    expect(normalizeName("Josiah St. Aldous", "person").tokens).toContain("st");
  });
});

describe("words that are names of a plain object's members", () => {
  it("are plain words to every word list", () => {
    // A word list kept in a plain object once read "constructor" as a legal form and a place
    // abbreviation: "Pell Constructor" came out as "pell function Object() { [native code] }".
    for (const cls of ["person", "organization", "location", "other"] as const) {
      const n = normalizeName("Pell Constructor", cls);
      expect(n.full, cls).not.toMatch(/function|native/);
      expect(n.tokens, cls).toContain("constructor");
    }
    expect(normalizeName("Valueof Tostring Hasownproperty", "organization").key).toBe(
      "valueof tostring hasownproperty",
    );
  });
});

describe("words broken at a line end", () => {
  it("are joined again when a hyphen and white space part a word that goes on in lower case", () => {
    expect(joinLineBreaks("Walter Har- land")).toBe("Walter Harland");
    expect(joinLineBreaks("Sten-\nning Grain Exchange")).toBe("Stenning Grain Exchange");
    expect(normalizeName("Harrow-  mouth", "location").key).toBe("harrowmouth");
    // Hyphens between words stay separators; a compound broken at its own hyphen goes on in capitals.
    expect(joinLineBreaks("Stenby-on-Wend")).toBe("Stenby-on-Wend");
    expect(joinLineBreaks("Stenby-on- Wend")).toBe("Stenby-on- Wend");
    expect(normalizeName("Stenby-on- Wend", "location").key).toBe("stenby on wend");
  });
});

describe("OCR folding", () => {
  const ocr = (s: string, cls: "person" | "location" = "location") => normalizeName(s, cls).ocrKey;

  it("folds the usual letterpress misreadings together (rn/m, cl/d, 1/l, 0/o, 5/s, vv/w)", () => {
    expect(ocr("Stenrnouth")).toBe(ocr("Stenmouth")); // rn -> m
    expect(ocr("Clunmere")).toBe(ocr("Dunmere")); // cl -> d
    expect(ocr("Ha1e", "person")).toBe(ocr("Hale", "person")); // 1 -> l
    expect(ocr("P0rt Ellery")).toBe(ocr("Port Ellery")); // 0 -> o
    expect(ocr("5tenmoor")).toBe(ocr("Stenmoor")); // 5 -> s
    expect(ocr("Vvenna")).toBe(ocr("Wenna")); // vv -> w
    expect(ocr("Stenmouth")).toBe("stenmouth");
  });

  it("ignores spaces (OCR splits and joins words)", () => {
    expect(ocr("Sten mouth")).toBe(ocr("Stenmouth"));
  });

  it("keeps different names apart", () => {
    expect(ocr("Stenmouth")).not.toBe(ocr("Stenmoor"));
    expect(ocr("Fort Carrow")).not.toBe(ocr("Port Carrow"));
    // "rri" read as "m" is not one of the folded confusions: these two stay apart.
    expect(ocrFold("harrington")).not.toBe(ocrFold("hamngton"));
  });
});

describe("acronyms", () => {
  it('reads "S.G.E.", "S. G. E." and "SGE" as the same acronym', () => {
    expect(normalizeName("S.G.E.", "organization").acronym).toBe("sge");
    expect(normalizeName("S. G. E.", "organization").acronym).toBe("sge");
    expect(normalizeName("SGE", "organization").acronym).toBe("sge");
  });

  it("does not read an ordinary word, a single initial or a long capital run as an acronym", () => {
    expect(normalizeName("Grain", "organization").acronym).toBeNull();
    expect(readAcronym("A.")).toBeNull();
    expect(readAcronym("STENMOUTH")).toBeNull(); // 9 capitals: a headline, not an acronym
  });

  it("forms the acronym key of a multi-word organization or place, skipping joiner words", () => {
    expect(normalizeName("Stenmouth Grain Exchange", "organization").acronymKey).toBe("sge");
    expect(normalizeName("Bank of the Sten", "organization").acronymKey).toBe("bs");
    expect(normalizeName("Stenmouth", "location").acronymKey).toBeNull();
    expect(normalizeName("Josiah Hale Aldous", "person").acronymKey).toBeNull();
  });
});

describe("LabelMap", () => {
  it("maps CoNLL-2003 labels (PER, ORG, LOC, MISC) to classes, BIO prefixes ignored", () => {
    // CoNLL-2003 label set (from memory).
    const m = new LabelMap();
    expect(m.forMention("PER").cls).toBe("person");
    expect(m.forMention("ORG").cls).toBe("organization");
    expect(m.forMention("LOC").cls).toBe("location");
    expect(m.forMention("MISC").cls).toBe("other");
    expect(m.forMention("B-PER").cls).toBe("person");
    expect(m.forMention("I-ORG").cls).toBe("organization");
    expect(foldLabel(" B-Work of Art ")).toBe("work_of_art");
  });

  it("maps OntoNotes labels (PERSON, GPE, FAC, NORP...) to classes", () => {
    // OntoNotes 5 label set (from memory).
    const m = new LabelMap();
    expect(m.forMention("PERSON").cls).toBe("person");
    expect(m.forMention("GPE").cls).toBe("location");
    expect(m.forMention("FAC").cls).toBe("location");
    expect(m.forMention("WORK_OF_ART").cls).toBe("other");
    expect(m.forMention("GPE").compat.organization).toBeGreaterThan(0);
    expect(m.forMention("PER").compat.person).toBe(1);
  });

  it("marks DATE, MONEY and the other value labels as not linkable, and counts them", () => {
    const m = new LabelMap();
    for (const label of ["DATE", "MONEY", "TIME", "PERCENT", "QUANTITY", "ORDINAL", "CARDINAL"]) {
      expect(m.forMention(label).linkable, label).toBe(false);
    }
    expect(m.forMention("PER").linkable).toBe(true);
    m.forMention("DATE");
    expect(m.skipped.get("DATE")).toBe(2);
    expect(m.warnings().some((w) => w.includes('"DATE"') && w.includes("not linkable"))).toBe(true);
  });

  it("counts and warns about unknown labels, treating them as neutral", () => {
    const m = new LabelMap();
    const info = m.forMention("SHIPNAME");
    expect(info.linkable).toBe(true);
    expect(new Set(Object.values(info.compat)).size).toBe(1); // the same weight for every class
    m.forMention("SHIPNAME");
    m.forMention("TUGBOAT");
    expect(m.unknown.get("SHIPNAME")).toBe(2);
    expect(m.unknown.get("TUGBOAT")).toBe(1);
    const w = m.warnings();
    expect(w.some((s) => s.includes('"SHIPNAME"') && s.includes("2 mention"))).toBe(true);
    // No label at all is not an unknown label.
    m.forMention(undefined);
    m.forMention("");
    expect(m.unknown.size).toBe(2);
  });

  it("knows the common table type spellings", () => {
    const m = new LabelMap();
    expect(m.classOfTableType("firm")).toBe("organization");
    expect(m.classOfTableType("Town")).toBe("location");
    expect(m.classOfTableType("vessel")).toBe("other");
    expect(m.knowsTableType("sluice")).toBe(false);
    expect(m.classOfTableType("sluice")).toBe("other");
  });

  it("reads a table type through its plural and its head word", () => {
    const m = new LabelMap();
    expect(m.classOfTableType("Towns")).toBe("location");
    expect(m.classOfTableType("companies")).toBe("organization");
    expect(m.classOfTableType("Shipping Company")).toBe("organization");
    expect(m.classOfTableType("river_port")).toBe("location");
    expect(m.knowsTableType("Barge Owners")).toBe(false);
    expect(m.knowsTableType("lock keeper")).toBe(false);
  });
});

describe("readLabelMapFile", () => {
  let t: ReturnType<typeof tempDir>;
  beforeEach(() => {
    t = tempDir("hawser-labels-");
  });
  afterEach(() => t.cleanup());

  it("adds and overrides labels, short and long form, with compat overrides", () => {
    const file = writeText(
      t.file("labels.json"),
      JSON.stringify({
        SHIP: "other",
        PER: { class: "organization" },
        HARBOUR: { class: "location", compat: { organization: 0.9 } },
        TONNAGE: { class: "other", linkable: false },
      }),
    );
    const m = readLabelMapFile(file);
    expect(m.forMention("SHIP").cls).toBe("other");
    expect(m.forMention("PER").cls).toBe("organization");
    expect(m.forMention("HARBOUR").compat.organization).toBe(0.9);
    expect(m.forMention("HARBOUR").compat.location).toBe(1); // the rest from the class's built-in row
    expect(m.forMention("TONNAGE").linkable).toBe(false);
    // Built-in labels not overridden are still there.
    expect(m.forMention("GPE").cls).toBe("location");
    expect(m.unknown.size).toBe(0);
  });

  it("rejects bad files, naming the file and the field", () => {
    const bad = (name: string, text: string) => writeText(t.file(name), text);
    const notJson = bad("a.json", "{ SHIP: other }");
    const e1 = throwsInput(() => readLabelMapFile(notJson));
    expect(e1.file).toBe(notJson);
    expect(e1.message).toContain(notJson);

    const arr = bad("b.json", '["PER"]');
    expect(throwsInput(() => readLabelMapFile(arr)).file).toBe(arr);

    const cases: Array<[string, string]> = [
      ['{"SHIP": {"class": "boat"}}', "SHIP.class"],
      ['{"SHIP": 3}', "SHIP"],
      ['{"SHIP": {"class": "other", "compat": {"person": 2}}}', "SHIP.compat.person"],
      ['{"SHIP": {"class": "other", "compat": {"barge": 0.5}}}', "SHIP.compat.barge"],
      ['{"SHIP": {"class": "other", "compat": 0.5}}', "SHIP.compat"],
    ];
    for (const [text, field] of cases) {
      const file = bad("c.json", text);
      const e = throwsInput(() => readLabelMapFile(file));
      expect(e.file, text).toBe(file);
      expect(e.field, text).toBe(field);
      expect(e.message).toContain(`"${field}"`);
    }
  });
});
