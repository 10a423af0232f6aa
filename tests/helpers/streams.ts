/** Reading a whole async iterable in tests, and catching the error a reader throws part way. */

/** Every item of an async iterable, in order. */
export async function collect<T>(items: AsyncIterable<T>): Promise<T[]> {
  const out: T[] = [];
  for await (const item of items) out.push(item);
  return out;
}

/** Run a reader to the end and return the error it throws (fails the test if it throws none). */
export async function failure(items: AsyncIterable<unknown>): Promise<Error> {
  try {
    await collect(items);
  } catch (error) {
    return error as Error;
  }
  throw new Error("expected the reader to fail");
}
