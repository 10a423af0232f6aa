import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { DEFAULT_WEIGHTS } from "../src/score/combine.js";
import { configFromTune, readConfig, validateConfig, writeConfig } from "../src/tune/config.js";
import { tune } from "../src/tune/tune.js";
import { syntheticSet } from "./tune-fixtures.js";

const dir = mkdtempSync(join(tmpdir(), "hawser-config-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const result = tune(syntheticSet(40, { seed: 2 }), { folds: 2 });
const kb = { fingerprint: "sha256:1111aaaa", entities: 120 };
const config = configFromTune(result, kb, new Date("1911-04-02T10:00:00Z"));

describe("tuned config files", () => {
  it("round-trips through writeConfig and readConfig, leaving no temporary file", () => {
    const file = join(dir, "tuned.json");
    writeConfig(file, config);
    expect(readdirSync(dir)).toEqual(["tuned.json"]);
    const back = readConfig(file, { kbFingerprint: kb.fingerprint });
    expect(back).toEqual(config);
    expect(back.format).toBe("hawser-config");
    expect(back.version).toBe(1);
    expect(back.created).toBe("1911-04-02T10:00:00.000Z");
    expect(back.figures.heldOut.linkF1).toBe(result.figures.heldOut.linkF1);
    // overwriting replaces the file atomically
    writeConfig(file, { ...config, threshold: 0.42 });
    expect(readConfig(file).threshold).toBe(0.42);
    expect(readdirSync(dir)).toEqual(["tuned.json"]);
  });

  it("refuses a config tuned on another KB unless forced", () => {
    const file = join(dir, "other.json");
    writeConfig(file, config);
    expect(() => readConfig(file, { kbFingerprint: "sha256:2222bbbb" })).toThrow(
      /other\.json: field "kb\.fingerprint": this config was tuned on another KB \(fingerprint sha256:1111aaaa/,
    );
    expect(readConfig(file, { kbFingerprint: "sha256:2222bbbb", force: true }).kb.fingerprint).toBe(
      "sha256:1111aaaa",
    );
  });

  it("names the file and field of a bad value", () => {
    const bad = (edit: (c: Record<string, unknown>) => void) => {
      const c = JSON.parse(JSON.stringify(config)) as Record<string, unknown>;
      edit(c);
      return () => validateConfig(c, "conf.json");
    };
    expect(bad((c) => (c.format = "other"))).toThrow(/conf\.json: field "format": expected "hawser-config"/);
    expect(bad((c) => (c.version = 2))).toThrow(/field "version": expected 1, got number 2/);
    expect(bad((c) => (c.threshold = 1.5))).toThrow(
      /field "threshold": expected a number in \[0, 1\], got 1\.5/,
    );
    expect(bad((c) => delete (c.weights as { features: Record<string, number> }).features.context)).toThrow(
      /field "weights\.features\.context": expected a finite number, got nothing \(missing\)/,
    );
    expect(bad((c) => ((c.weights as { features: Record<string, number> }).features.colour = 1))).toThrow(
      /field "weights\.features\.colour": unknown feature/,
    );
    expect(bad((c) => (c.objective = "accuracy"))).toThrow(
      /field "objective": expected one of f1, recall-at-precision/,
    );
    expect(bad((c) => ((c.kb as { fingerprint: string }).fingerprint = ""))).toThrow(
      /field "kb\.fingerprint"/,
    );
    expect(bad((c) => (c.objective = "recall-at-precision"))).toThrow(/field "minPrecision": required/);
  });

  it("loads a config written before the nearSpelling feature, with that feature's default weight", () => {
    const old = JSON.parse(JSON.stringify(config)) as { weights: { features: Record<string, number> } };
    delete old.weights.features.nearSpelling;
    const loaded = validateConfig(old, "old.json");
    expect(loaded.weights.features.nearSpelling).toBe(DEFAULT_WEIGHTS.features.nearSpelling);
    expect(loaded.weights.features.context).toBe(config.weights.features.context);
  });

  it("names the line of a JSON syntax error and a missing file", () => {
    const file = join(dir, "broken.json");
    writeFileSync(file, '{\n  "format": "hawser-config",\n  "version": 1,\n  oops\n}\n');
    expect(() => readConfig(file)).toThrow(/broken\.json:4: not valid JSON/);
    expect(() => readConfig(join(dir, "absent.json"))).toThrow(
      /absent\.json: cannot read the file: no such file or directory \(ENOENT\)/,
    );
    expect(readFileSync(join(dir, "other.json"), "utf8").endsWith("}\n")).toBe(true);
  });
});
