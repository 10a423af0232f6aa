/**
 * What an interruption (Ctrl-C, a kill, a closed terminal) must undo: the temporary files of
 * outputs under way, and terminal state a progress bar changed (a hidden cursor). An interrupted
 * process runs no `finally` block, so the command line undoes these in its signal handler.
 *
 * The command line handles the signals only while there is something to undo (see
 * watchUndos): otherwise the default applies and the process ends at once, even in the middle of
 * a long computation that never returns to the event loop (a signal handler in JavaScript runs
 * only when it does). The library itself never touches signals.
 */

export interface Undo {
  /** The output it keeps from landing (a file the message names as not written), if any. */
  output?: string | undefined;
  run(): void;
}

const undos = new Set<Undo>();
let watcher: ((pending: boolean) => void) | undefined;

/** Records something to undo if interrupted; call the returned function once it is done with. */
export function onInterrupt(undo: Undo): () => void {
  undos.add(undo);
  if (undos.size === 1) watcher?.(true);
  return () => {
    if (undos.delete(undo) && undos.size === 0) watcher?.(false);
  };
}

/** Runs every pending undo (display first, then outputs) and returns the outputs it kept from landing. */
export function undoAll(): string[] {
  const all = [...undos].sort((a, b) => Number(a.output !== undefined) - Number(b.output !== undefined));
  undos.clear();
  const outputs: string[] = [];
  for (const u of all) {
    if (u.output !== undefined) outputs.push(u.output);
    u.run();
  }
  watcher?.(false);
  return outputs;
}

/** Tells `fn` whether there is anything to undo, now and whenever that changes (the command line's signal handlers). */
export function watchUndos(fn: (pending: boolean) => void): void {
  watcher = fn;
  fn(undos.size > 0);
}

/**
 * Resolves after the event loop has gone round at least once, through its poll phase, where
 * signals are delivered: awaited before an output is renamed into place, so that an interruption
 * that came during synchronous work is handled before the output lands, not after.
 */
export async function eventLoopTurn(): Promise<void> {
  // Two check phases have a poll phase between them, whichever phase this was called in.
  await new Promise((resolve) => setImmediate(resolve));
  await new Promise((resolve) => setImmediate(resolve));
}
