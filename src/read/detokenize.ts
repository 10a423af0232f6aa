/**
 * Rebuild text from tokens: single spaces between tokens, except none before closing punctuation
 * and clitics (".", ",", ")", "'s", "n't"...) and none after opening brackets. This is the usual
 * English detokenization rule (common practice); quotes are left spaced because their direction
 * is ambiguous.
 */

/** Tokens that attach to the token before them. */
const ATTACH_LEFT: ReadonlySet<string> = new Set([
  ".",
  ",",
  ";",
  ":",
  "!",
  "?",
  ")",
  "]",
  "}",
  "%",
  "...",
  "'s",
  "'S",
  "’s",
  "'",
  "n't",
  "'re",
  "'ve",
  "'ll",
  "'d",
  "'m",
]);

/** Tokens that attach to the token after them. */
const ATTACH_RIGHT: ReadonlySet<string> = new Set(["(", "[", "{"]);

/** Join tokens into readable text. */
export function joinTokens(tokens: readonly string[]): string {
  let text = "";
  let previous: string | undefined;
  for (const token of tokens) {
    if (previous !== undefined && !ATTACH_LEFT.has(token) && !ATTACH_RIGHT.has(previous)) text += " ";
    text += token;
    previous = token;
  }
  return text;
}
