/**
 * Whether a table tells entries apart by some words: whether it holds a name made of those words
 * and another entry's whole name ("Old English" beside "English", "Northern Khmer" beside
 * "Khmer", "Ukrainian Sign Language" beside "Ukrainian"). Where it does, a mention that lacks the
 * words ("Hungarian") is no short form of an entry that carries them ("Old Hungarian"): it more
 * likely names the plain entry, present or not. Where it does not ("Islands" in a list of
 * countries: nothing is called "Pitcairn" beside "Pitcairn Islands"), the words can be left out.
 * Measured on the table itself, per word sequence, on first need, and kept per open KB.
 */
import type { Kb } from "../kb/kb.js";
import { ftsWords } from "../kb/postings.js";

/**
 * Entries carrying the sequence's first word that are looked at, most popular first: enough to
 * find a pair where the words do separate entries (such words are carried by many names), and a
 * bound on the work for a word every name carries.
 */
export const SEPARATING_SCAN_LIMIT = 2000;

const answers = new WeakMap<Kb, Map<string, boolean>>();

/**
 * True when some entry's name is `words` followed (`atStart`) or preceded by a sequence that is
 * another entry's whole name key, in the same class.
 */
export function separatesEntries(kb: Kb, words: readonly string[], atStart: boolean): boolean {
  if (words.length === 0) return false;
  let known = answers.get(kb);
  if (known === undefined) {
    known = new Map();
    answers.set(kb, known);
  }
  const key = `${atStart ? "<" : ">"}${words.join(" ")}`;
  let answer = known.get(key);
  if (answer === undefined) {
    answer = scan(kb, words, atStart);
    known.set(key, answer);
  }
  return answer;
}

function scan(kb: Kb, words: readonly string[], atStart: boolean): boolean {
  const first = ftsWords(words[0]!)[0];
  if (first === undefined) return false;
  let found = false;
  kb.hot.postings.forEachCarrier(first, SEPARATING_SCAN_LIMIT, (eid) => {
    if (found) return;
    const cls = kb.hot.classOf(eid);
    for (const form of kb.nameForms(eid)) {
      const t = form.tokens;
      if (t.length <= words.length) continue;
      const off = atStart ? 0 : t.length - words.length;
      let same = true;
      for (let i = 0; i < words.length && same; i++) same = t[off + i] === words[i];
      if (!same) continue;
      const rest = (atStart ? t.slice(words.length) : t.slice(0, off)).join(" ");
      kb.forEachKeyHit(rest, (c, kind, other) => {
        if (kind === "exact" && c === cls && other !== eid) found = true;
      });
      if (found) return;
    }
  });
  return found;
}
