/**
 * Writes the table's rows into the KB as they stream in: the entity row (with its packed name
 * forms), its details (description and blocking keys), while gathering what the later phases need (token
 * vocabulary, the hot store with the context terms and the in-memory key index, full-text rows).
 * Inserts are buffered (see batch-insert.ts): call `flush` before each commit.
 */
import type Database from "better-sqlite3";
import type { LabelMap } from "../labels/label-map.js";
import { normalizeName, splitTradeName } from "../normalize/name.js";
import { contextTerms } from "../score/terms.js";
import type { EntityRecord } from "../types.js";
import { BatchInsert } from "./batch-insert.js";
import { FtsRows } from "./fts-load.js";
import { HotStoreBuilder } from "./hot.js";
import { KindColumnsBuilder } from "./kind-columns.js";
import { type StoredName, storedName } from "./names.js";
import { type KeyKind, type PackedForm, packForms } from "./schema.js";

export class RowWriter {
  /** Internal id of the last entity written (ids count from 1 in table order). */
  eid = 0;
  /** Names written (canonical names and aliases with a non-empty key). */
  aliases = 0;
  /** Blocking keys written (rows of the keys view). */
  keys = 0;
  maxPrior = 0;
  /** Whether any row gave aliases, a prior above 0, a description (see columnWarnings in build.ts). */
  readonly given = { aliases: false, prior: false, description: false };
  readonly byClass: Record<string, number> = {};
  /** Table types the label map does not know, with counts. */
  readonly unknownTypes: Record<string, number> = {};
  /**
   * Alias token -> number of entities with it in a name and its id (ids count from 0 in order of
   * first appearance, which is also the map's order), in a mutable box, so that counting a known
   * token is one map lookup instead of a get and a set.
   */
  readonly vocab = new Map<string, { df: number; id: number }>();
  /** Class, prior, context terms and name-token signature of every entity (see hot.ts). */
  readonly hot = new HotStoreBuilder();
  readonly fts = new FtsRows();
  /** Statistics of the attribute columns, for the table's kind columns (see kind-columns.ts). */
  readonly kinds = new KindColumnsBuilder();

  private readonly insEntity: BatchInsert;
  private readonly insDetails: BatchInsert;
  /** Keys of the current entity already written, one set per kind (cleared per entity). */
  private readonly seen: Record<KeyKind, Set<string>> = {
    exact: new Set(),
    ocr: new Set(),
    acronym: new Set(),
    initials: new Set(),
  };
  /** The sets of `seen`, to clear them without enumerating the object's keys. */
  private readonly seenSets = Object.values(this.seen);
  /** Distinct name tokens of the current entity (cleared per entity). */
  private readonly tokens = new Set<string>();

  constructor(
    db: Database.Database,
    private readonly labels: LabelMap,
  ) {
    this.insEntity = new BatchInsert(
      db,
      "INSERT INTO entities (eid, id, name, type, class, prior, forms, attributes)",
      8,
    );
    this.insDetails = new BatchInsert(db, "INSERT INTO entity_details (eid, description, keys)", 3);
  }

  write(r: EntityRecord): void {
    const eid = ++this.eid;
    const cls = this.labels.classOfTableType(r.type);
    if (!this.labels.knowsTableType(r.type)) this.unknownTypes[r.type] = (this.unknownTypes[r.type] ?? 0) + 1;
    this.byClass[cls] = (this.byClass[cls] ?? 0) + 1;
    if (r.prior > this.maxPrior) this.maxPrior = r.prior;
    if (r.prior > 0) this.given.prior = true;
    if (r.aliases.length > 0) this.given.aliases = true;
    if (r.description !== "") this.given.description = true;
    this.kinds.observe(r.attributes);
    const attrValues = Object.values(r.attributes);
    const attrText = attrValues.join(" ");
    const terms = contextTerms(`${r.description} ${attrText}`);
    for (const set of this.seenSets) set.clear();
    this.tokens.clear();
    const packed: PackedForm[] = [];
    const nameKeys: string[] = [];
    const names: StoredName[] = [];
    // The entity's keys as [kind, key] pairs, for entity_details.keys (see schema.ts).
    const keyPairs: Array<[KeyKind, string]> = [];
    const add = (key: string | null, kind: KeyKind) => {
      if (key === null || key === "") return;
      const seen = this.seen[kind];
      if (seen.has(key)) return;
      seen.add(key);
      keyPairs.push([kind, key]);
      this.hot.addKey(key, cls, kind, eid);
      this.keys++;
    };
    // A name given with another ("X d/b/a Y") adds the other as an alias (see splitTradeName).
    const texts = [r.name, ...r.aliases];
    for (let i = 0, n = texts.length; i < n; i++) {
      const other = splitTradeName(texts[i]!)?.alsoNamed;
      if (other !== undefined) texts.push(other);
    }
    for (let i = 0; i < texts.length; i++) {
      const text = texts[i]!;
      const n = normalizeName(text, cls);
      if (n.key === "") continue;
      this.aliases++;
      nameKeys.push(n.key);
      packed.push({ text, key: n.key, full: n.full, ocr: n.ocrKey, canonical: i === 0 });
      names.push(storedName(n.key, n.full, i === 0, (t) => this.tokenId(t)));
      for (const t of n.tokens) this.tokens.add(t);
      add(n.key, "exact");
      add(n.ocrKey, "ocr");
      add(n.acronymKey, "acronym");
      if (n.acronym !== null) add(n.acronym, "acronym");
      add(n.initialsKey, "initials");
    }
    this.fts.add(r.prior, nameKeys);
    this.hot.add({
      cls,
      prior: r.prior,
      terms,
      nameTokens: this.tokens,
      names,
      id: r.id,
      name: r.name,
      hasAttributes: attrValues.length > 0,
    });
    this.insEntity.add(
      eid,
      r.id,
      r.name,
      r.type,
      cls,
      r.prior,
      packForms(packed),
      JSON.stringify(r.attributes),
    );
    this.insDetails.add(eid, r.description, JSON.stringify(keyPairs));
    for (const t of this.tokens) this.vocab.get(t)!.df++;
  }

  /** The vocabulary id of an alias token, added (with no entities counted yet) if new. */
  private tokenId(t: string): number {
    let box = this.vocab.get(t);
    if (box === undefined) {
      box = { df: 0, id: this.vocab.size };
      this.vocab.set(t, box);
    }
    return box.id;
  }

  /** Writes the buffered rows; call before the enclosing transaction commits. */
  flush(): void {
    this.insEntity.flush();
    this.insDetails.flush();
  }
}
