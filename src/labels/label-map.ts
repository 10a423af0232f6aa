/**
 * The label map in use: built-in sets, optionally overridden by a user mapping file, with counts
 * of unknown and non-linkable labels so they are reported rather than silently ignored.
 */
import { readFileSync } from "node:fs";
import { ENTITY_CLASSES, type EntityClass } from "../types.js";
import { InputError } from "../util/errors.js";
import { fileError } from "../read/lines.js";
import { BUILTIN_LABELS, type CompatRow, type LabelInfo, UNLABELED_COMPAT } from "./builtin.js";

/** Folds a label for lookup: trims, drops a BIO prefix, lowercases, `-` and spaces become `_`. */
export function foldLabel(label: string): string {
  return label
    .trim()
    .replace(/^[BIESLU]-/, "")
    .toLowerCase()
    .replace(/[\s-]+/g, "_");
}

/** An English plural's singular, by the regular endings ("companies", "towns", "churches"). */
function singular(word: string): string {
  if (word.length > 4 && word.endsWith("ies")) return `${word.slice(0, -3)}y`;
  if (word.length > 4 && /(?:ches|shes|sses|xes)$/.test(word)) return word.slice(0, -2);
  if (word.length > 3 && word.endsWith("s") && !word.endsWith("ss")) return word.slice(0, -1);
  return word;
}

/** Every class compatible with an unknown label at the neutral weight. */
const UNKNOWN_INFO: LabelInfo = {
  cls: "other",
  linkable: true,
  compat: {
    person: UNLABELED_COMPAT,
    organization: UNLABELED_COMPAT,
    location: UNLABELED_COMPAT,
    other: UNLABELED_COMPAT,
  },
};

export class LabelMap {
  private readonly labels: Map<string, LabelInfo>;
  /** Unknown label (as written) -> how many mentions carried it. */
  readonly unknown = new Map<string, number>();
  /** Non-linkable label -> how many mentions carried it. */
  readonly skipped = new Map<string, number>();

  /** The user's own labels, as given (see overrides). */
  private readonly own: ReadonlyArray<readonly [string, LabelInfo]>;

  constructor(overrides?: ReadonlyMap<string, LabelInfo>) {
    this.labels = new Map(BUILTIN_LABELS);
    this.own = overrides ? [...overrides] : [];
    for (const [k, v] of this.own) this.labels.set(foldLabel(k), v);
  }

  /**
   * The labels given to the constructor over the built-in sets: `new LabelMap(new
   * Map(map.overrides()))` is the same map with fresh counts (what a linking thread is given,
   * src/link/parallel.ts).
   */
  overrides(): Array<[string, LabelInfo]> {
    return this.own.map(([k, v]) => [k, v]);
  }

  /** The info for a label, or null when the label is unknown (also counted). */
  lookup(label: string | undefined | null): LabelInfo | null {
    if (label === undefined || label === null || label.trim() === "") return null;
    const info = this.labels.get(foldLabel(label));
    if (info === undefined) {
      this.unknown.set(label, (this.unknown.get(label) ?? 0) + 1);
      return null;
    }
    if (!info.linkable) this.skipped.set(label, (this.skipped.get(label) ?? 0) + 1);
    return info;
  }

  /** Info used for a mention: its label's, or the neutral row for no label or an unknown one. */
  forMention(label: string | undefined | null): LabelInfo {
    return this.lookup(label) ?? UNKNOWN_INFO;
  }

  /** Whether a label is in the map (does not count it). */
  knows(label: string | undefined | null): boolean {
    return label !== undefined && label !== null && this.labels.has(foldLabel(label));
  }

  /** Class of a table type; unknown table types are "other". */
  classOfTableType(type: string): EntityClass {
    return this.tableTypeInfo(type)?.cls ?? "other";
  }

  /** Whether a table type is known to the map, as written or through its words (tableTypeInfo). */
  knowsTableType(type: string): boolean {
    return this.tableTypeInfo(type) !== undefined;
  }

  /**
   * The info of a table type: the type's own, or its singular's ("towns", "companies"), or that
   * of its last word that the map knows, English putting the head of a compound last ("shipping
   * company", "river port", "county_town"); undefined when no word of it is known.
   */
  private tableTypeInfo(type: string): LabelInfo | undefined {
    const folded = foldLabel(type);
    const known = (word: string) => this.labels.get(word) ?? this.labels.get(singular(word));
    const whole = known(folded);
    if (whole !== undefined) return whole;
    const words = folded.split("_").filter((w) => w.length > 0);
    for (let i = words.length - 1; i >= 0; i--) {
      const info = known(words[i]!);
      if (info !== undefined) return info;
    }
    return undefined;
  }

  /** Warnings for the run's unknown and skipped labels, one sentence each. */
  warnings(): string[] {
    const out: string[] = [];
    for (const [label, n] of this.unknown) {
      out.push(
        `unknown label "${label}" on ${n} mention(s): compared with every type at neutral weight ${UNLABELED_COMPAT}`,
      );
    }
    for (const [label, n] of this.skipped)
      out.push(`label "${label}" is not linkable: ${n} mention(s) left NIL`);
    return out;
  }
}

/**
 * Read a user mapping file: JSON object `{ "LABEL": { "class": "person", "linkable": true,
 * "compat": { "organization": 0.4 } } }` or the short form `{ "LABEL": "person" }`. Missing
 * compat entries come from the built-in row of the class.
 */
export function readLabelMapFile(file: string): LabelMap {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    throw fileError(file, e);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    throw new InputError({ file }, `not a JSON label map: ${(e as Error).message}`);
  }
  if (typeof data !== "object" || data === null || Array.isArray(data)) {
    throw new InputError({ file }, "a label map is a JSON object from label to class");
  }
  const overrides = new Map<string, LabelInfo>();
  for (const [label, v] of Object.entries(data as Record<string, unknown>)) {
    const spec = typeof v === "string" ? { class: v } : v;
    if (typeof spec !== "object" || spec === null) {
      throw new InputError({ file, field: label }, 'expected a class name or an object with "class"');
    }
    const s = spec as { class?: unknown; linkable?: unknown; compat?: unknown };
    if (typeof s.class !== "string" || !(ENTITY_CLASSES as readonly string[]).includes(s.class)) {
      throw new InputError(
        { file, field: `${label}.class` },
        `class must be one of ${ENTITY_CLASSES.join(", ")}`,
      );
    }
    const cls = s.class as EntityClass;
    const base = BUILTIN_LABELS.get(
      cls === "organization" ? "org" : cls === "location" ? "loc" : cls === "person" ? "per" : "misc",
    )!;
    const compat: CompatRow = { ...base.compat };
    if (s.compat !== undefined) {
      if (typeof s.compat !== "object" || s.compat === null) {
        throw new InputError({ file, field: `${label}.compat` }, "expected an object of class -> weight");
      }
      for (const [c, w] of Object.entries(s.compat as Record<string, unknown>)) {
        if (!(ENTITY_CLASSES as readonly string[]).includes(c)) {
          throw new InputError(
            { file, field: `${label}.compat.${c}` },
            `unknown class; use ${ENTITY_CLASSES.join(", ")}`,
          );
        }
        if (typeof w !== "number" || w < 0 || w > 1) {
          throw new InputError({ file, field: `${label}.compat.${c}` }, "weight must be a number in [0, 1]");
        }
        compat[c as EntityClass] = w;
      }
    }
    if (s.linkable !== undefined && typeof s.linkable !== "boolean") {
      throw new InputError({ file, field: `${label}.linkable` }, "linkable must be true or false");
    }
    const linkable = s.linkable !== false;
    overrides.set(label, { cls, linkable, compat });
  }
  return new LabelMap(overrides);
}
