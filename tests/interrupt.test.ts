/**
 * The registry of what an interruption must undo (src/util/interrupt.ts): the command line
 * handles signals only while it holds something, undoes displays before outputs, and counts the
 * outputs it removed.
 */
import { describe, expect, it } from "vitest";
import { eventLoopTurn, onInterrupt, undoAll, watchUndos } from "../src/util/interrupt.js";

describe("interrupt undos", () => {
  it("tells the watcher when there is something to undo, and undoes displays first", () => {
    const states: boolean[] = [];
    watchUndos((pending) => states.push(pending));
    const ran: string[] = [];
    const doneOutput = onInterrupt({ output: "links.jsonl", run: () => ran.push("output") });
    onInterrupt({ run: () => ran.push("display") });
    doneOutput();
    onInterrupt({ output: "people.kb", run: () => ran.push("output 2") });
    expect(undoAll()).toEqual(["people.kb"]);
    expect(ran).toEqual(["display", "output 2"]);
    // Nothing pending at first, something from the first undo on, nothing after undoAll.
    expect(states[0]).toBe(false);
    expect(states[1]).toBe(true);
    expect(states.at(-1)).toBe(false);
    // A finished undo is not run again, and finishing twice is harmless.
    const done = onInterrupt({ output: "x", run: () => ran.push("never") });
    done();
    done();
    expect(undoAll()).toEqual([]);
    expect(ran).not.toContain("never");
    watchUndos(() => {});
  });

  it("lets timers and I/O callbacks due run before it resolves", async () => {
    let fired = false;
    setTimeout(() => {
      fired = true;
    }, 0);
    await new Promise((r) => setTimeout(r, 5)); // the timer is due now
    fired = false;
    setImmediate(() => {
      fired = true;
    });
    await eventLoopTurn();
    expect(fired).toBe(true);
  });
});
