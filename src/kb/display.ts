/**
 * What a mention's output shows of an entity besides scores: its table id and name, in memory,
 * and whether its row has attributes (other table columns). A linked row names its best
 * candidate, the runner-up and the top three; holding these two strings for every entity (UTF-8
 * in one buffer) spares the SQLite row reads that cost about 11 us each at a million entities,
 * and the flag spares the read of a linked entity's attributes when it has none. Memory: the
 * bytes of the ids and names plus 9 per entity (about 35 MB for the 1,000,000-entity benchmark
 * table).
 */
import { U32List } from "./u32-list.js";

/** The arrays of a built display store, as written into the KB's hot table. */
export interface DisplayArrays {
  /** UTF-8 of every entity's id then name, entity after entity (entity 0: none). */
  text: Uint8Array;
  /**
   * Entity e's id is text[start[2e] .. start[2e + 1]), its name text[start[2e + 1] .. start[2e + 2]);
   * length 2 * (entities + 1) + 1.
   */
  start: Uint32Array;
  /** 1 where entity e's row has at least one attribute, else 0; length entities + 1. */
  attributed: Uint8Array;
}

export class DisplayBuilder {
  private text = Buffer.alloc(1 << 20);
  private length = 0;
  private readonly start = new U32List();
  private readonly attributed = new U32List();

  constructor() {
    // Entity 0 is a placeholder with an empty id and name.
    this.start.push(0);
    this.start.push(0);
    this.attributed.push(0);
  }

  /** The next entity's table id and name, and whether it has attributes (entities 1, 2, 3, ... in order). */
  add(id: string, name: string, hasAttributes: boolean): void {
    this.append(id);
    this.append(name);
    this.attributed.push(hasAttributes ? 1 : 0);
  }

  private append(s: string): void {
    this.start.push(this.length);
    const need = this.length + Buffer.byteLength(s);
    if (need > this.text.length) {
      const next = Buffer.alloc(Math.max(need, this.text.length * 2));
      this.text.copy(next, 0, 0, this.length);
      this.text = next;
    }
    this.length += this.text.write(s, this.length);
  }

  build(): DisplayArrays {
    const start = this.start.toArray();
    const withEnd = new Uint32Array(start.length + 1);
    withEnd.set(start);
    withEnd[start.length] = this.length;
    return {
      text: Uint8Array.from(this.text.subarray(0, this.length)),
      start: withEnd,
      attributed: Uint8Array.from(this.attributed.toArray()),
    };
  }
}

/** A loaded display store. */
export class Display {
  private readonly text: Buffer;
  private readonly start: Uint32Array;
  private readonly attributed: Uint8Array;

  constructor(a: DisplayArrays) {
    if (a.start.length % 2 !== 1 || a.start[a.start.length - 1] !== a.text.length)
      throw new Error("display store: bounds do not match the text");
    if (a.attributed.length !== (a.start.length - 1) / 2)
      throw new Error("display store: attribute flags do not match the entities");
    this.text = Buffer.from(a.text.buffer, a.text.byteOffset, a.text.byteLength);
    this.start = a.start;
    this.attributed = a.attributed;
  }

  /** Entities held (entity 0, the placeholder, not counted). */
  get entities(): number {
    return (this.start.length - 1) / 2 - 1;
  }

  id(eid: number): string {
    return this.text.toString("utf8", this.start[2 * eid]!, this.start[2 * eid + 1]!);
  }

  name(eid: number): string {
    return this.text.toString("utf8", this.start[2 * eid + 1]!, this.start[2 * eid + 2]!);
  }

  /** Whether the entity's row has attributes (false: they are `{}`, with no need to read the row). */
  hasAttributes(eid: number): boolean {
    return this.attributed[eid] === 1;
  }
}
