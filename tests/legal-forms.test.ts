/**
 * Firms as registers and filings of many countries write them: legal forms after the name in
 * several words or before it (the forms from memory; reading them is common practice of
 * company-name matching), and a firm's other name joined by "d/b/a", "t/a", "formerly"
 * (splitTradeName). The firms are invented: the gazette's trading partners abroad.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { normalizeName, splitTradeName } from "../src/normalize/name.js";
import { openTableKb, type TableKb } from "./helpers/table-kb.js";

const key = (s: string) => normalizeName(s, "organization").key;

describe("legal forms of other countries' registers", () => {
  it("are set aside from the key after the name, in one word or several", () => {
    for (const [text, k] of [
      ["Pellow Shipping Sp. z o.o.", "pellow shipping"],
      ["Wexcombe Timber spol. s r.o.", "wexcombe timber"],
      ["Naviera Stenmouth S.A. de C.V.", "naviera stenmouth"],
      ["Ambry Holdings Sdn. Bhd.", "ambry"],
      ["Stenmouth Lines Group Q.C.S.C.", "stenmouth lines"],
      ["Ekerby Air B.S.C.(c)", "ekerby air"],
      ["Wexcombe Timber A/S", "wexcombe timber"],
      ["Pellow Shipping, a.s.", "pellow shipping"],
      ["Harrow Marine PT", "harrow marine"],
      ["Harrow Marine Pte Ltd", "harrow marine"],
      ["Kell Rederi AB", "kell rederi"],
      ["Tolleby Trading GmbH & Co. KG", "tolleby trading"],
      ["Fennow Ltda.", "fennow"],
      ["Quarrie Transport Kft.", "quarrie transport"],
    ])
      expect(key(text!), text).toBe(k);
  });

  it("are set aside before the name only where registers put them there", () => {
    expect(key('OJSC "Ekerby Lines"')).toBe("ekerby lines");
    expect(key("Open Joint Stock Company Ekerby Lines")).toBe("ekerby lines");
    // A name that is a legal form alone keeps it; "Pt." before a name is a port, "Pte" a pointe.
    expect(key("JSC")).toBe("jsc");
    expect(key("Pt. Ambry Ice Company")).toBe("port ambry ice");
    expect(key("Harrowmouth Pte")).toBe("harrowmouth pointe");
    // "As" and "Pt" are legal forms only as the name's last words ("A/S", "a.s.", Indonesian PT).
    expect(key("Pell As Agents")).toBe("pell as agents");
    expect(key("PT Ambry Ice")).toBe("port ambry ice");
    expect(key("Harrow Marine A/S Ltd")).toBe("harrow marine");
    // "Holding(s)" is read only as written: one letter off it is a word of a firm's trade.
    expect(key("Harland Folding Chairs Ltd")).toBe("harland folding chairs");
    expect(key("Harland Moldings")).toBe("harland moldings");
    // Kept in the full form, so two forms still tell two firms apart.
    expect(normalizeName("Pellow Shipping Sp. z o.o.", "organization").full).toBe("pellow shipping spzoo");
  });
});

describe("a firm given with another of its names", () => {
  it("splits at the marker, and only with words on both sides", () => {
    expect(splitTradeName("Kell Brothers Ltd d/b/a Wend Valley Mills")).toEqual({
      name: "Kell Brothers Ltd",
      alsoNamed: "Wend Valley Mills",
    });
    expect(splitTradeName("Harrowmouth Ropery, Ltd., t/a The Ropewalk")?.name).toBe(
      "Harrowmouth Ropery, Ltd.",
    );
    expect(splitTradeName("Pellow & Co. formerly Pellow & Sons")?.alsoNamed).toBe("Pellow & Sons");
    expect(splitTradeName("d/b/a Wend Valley Mills")).toBeNull();
    // Filings also close the marker with a slash.
    expect(splitTradeName("Kell Brothers AG d/b/a/ Kell")?.alsoNamed).toBe("Kell");
    // "aka" alone is a word of names; only its spelled-out and dotted forms mark another name.
    expect(splitTradeName("Tanaka Aka Works")).toBeNull();
    expect(key("Kell Brothers Ltd d/b/a Wend Valley Mills")).toBe("kell");
  });

  let table: TableKb;
  beforeAll(async () => {
    table = await openTableKb(
      [
        "id,name,type",
        "F1,Kell Brothers Ltd d/b/a Wend Valley Mills,firm",
        "F2,Harrowmouth Ropery,firm",
        "F3,The Ropewalk Tavern,firm",
        "F4,Pellow Shipping,firm",
      ].join("\n"),
      "hawser-legal-",
    );
  });
  afterAll(() => table.close());

  it("is indexed under both names", () => {
    expect(table.linker.link({ id: "m1", text: "Wend Valley Mills", type: "ORG" }).entity).toBe("F1");
    expect(table.linker.link({ id: "m2", text: "Kell Bros.", type: "ORG" }).entity).toBe("F1");
  });

  it("is linked under the better of its names", () => {
    const r = table.linker.link({
      id: "m3",
      text: "Harrowmouth Ropery, Ltd., t/a The Ropewalk",
      type: "ORG",
    });
    expect(r.entity).toBe("F2");
    const other = table.linker.link({
      id: "m4",
      text: "Ambry Cordage Co. d/b/a Harrowmouth Ropery",
      type: "ORG",
    });
    expect(other.entity).toBe("F2");
  });

  it("links a firm with a legal form of another country to its plain name", () => {
    const r = table.linker.link({ id: "m5", text: "Pellow Shipping Sp. z o.o.", type: "ORG" });
    expect(r.entity).toBe("F4");
    expect(r.reasons.map((x) => x.code)).toContain("qualifier-differs");
  });
});
