/**
 * Context text around a character span of a document: a number of characters on each side
 * (snapped so that no word is cut) or a number of sentences on each side.
 */

import { type SentenceRange, splitSentences } from "./sentences.js";

/** How much context to take around a span. */
export type ContextWindow =
  /** N characters each side, widened or narrowed to whole words. */
  | { chars: number }
  /** The span's sentence(s) plus N sentences each side. */
  | { sentences: number };

/** Default window: 200 characters each side, about two lines of newspaper column (common practice). */
export const DEFAULT_WINDOW: ContextWindow = { chars: 200 };

const WHITESPACE = /\s/u;
const isSpace = (ch: string | undefined): boolean => ch === undefined || WHITESPACE.test(ch);

/** Collapse runs of whitespace (line breaks of the source) into single spaces. */
function tidy(text: string): string {
  return text.replace(/\s+/gu, " ").trim();
}

/** Context of `chars` characters each side of [start, end), never cutting a word. */
export function charWindow(text: string, start: number, end: number, chars: number): string {
  let left = Math.max(0, start - chars);
  // Landed inside a word: move right to its end, so the partial word is dropped.
  while (left > 0 && left < start && !isSpace(text[left - 1]) && !isSpace(text[left])) left++;
  let right = Math.min(text.length, end + chars);
  while (right < text.length && right > end && !isSpace(text[right - 1]) && !isSpace(text[right])) right--;
  return tidy(text.slice(left, right));
}

/** Index of the sentence containing character `offset` (the last sentence starting at or before it). */
function sentenceAt(sentences: readonly SentenceRange[], offset: number): number {
  let low = 0;
  let high = sentences.length - 1;
  let found = 0;
  while (low <= high) {
    const mid = (low + high) >> 1;
    if (sentences[mid]!.start <= offset) {
      found = mid;
      low = mid + 1;
    } else {
      high = mid - 1;
    }
  }
  return found;
}

/** Context of the sentence(s) holding [start, end) plus `around` sentences each side. */
export function sentenceWindow(
  text: string,
  start: number,
  end: number,
  around: number,
  sentences: readonly SentenceRange[] = splitSentences(text),
): string {
  if (sentences.length === 0) return tidy(text.slice(start, end));
  const first = Math.max(0, sentenceAt(sentences, start) - around);
  const last = Math.min(sentences.length - 1, sentenceAt(sentences, end - 1) + around);
  return tidy(text.slice(sentences[first]!.start, sentences[last]!.end));
}
