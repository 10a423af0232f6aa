/** Assertions on the InputError every reader raises for bad input (file, line and field named). */
import { expect } from "vitest";
import { InputError } from "../../src/util/errors.js";

/** What a bad-input error must name: the file, and the line and field when they are known. */
export interface Where {
  file: string;
  line?: number;
  field?: string;
}

/** Assert that `error` is an InputError naming `where`, both as properties and in its message. */
export function expectNames(error: unknown, where: Where): InputError {
  expect(error).toBeInstanceOf(InputError);
  const e = error as InputError;
  expect(e.file).toBe(where.file);
  expect(e.line).toBe(where.line);
  expect(e.field).toBe(where.field);
  const at = where.line === undefined ? where.file : `${where.file}:${where.line}`;
  expect(e.message.startsWith(at)).toBe(true);
  if (where.field !== undefined) expect(e.message).toContain(`"${where.field}"`);
  return e;
}

/** Await `p`, expect it to reject with an InputError naming `where`, and return the error. */
export async function rejectsNaming(p: Promise<unknown>, where: Where): Promise<InputError> {
  let caught: unknown = null;
  try {
    await p;
  } catch (e) {
    caught = e;
  }
  expect(caught, "expected the call to fail with an InputError").not.toBeNull();
  return expectNames(caught, where);
}

/** Call `f`, expect it to throw an InputError, and return it. */
export function throwsInput(f: () => unknown): InputError {
  let caught: unknown = null;
  try {
    f();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(InputError);
  return caught as InputError;
}
