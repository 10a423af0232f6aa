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
import { GenerationCache } from "../util/generation-cache.js";

/**
 * Entries carrying the sequence's first word that are looked at, most popular first: words that
 * separate entries are carried by many names, and a pair turns up early when there is one (the
 * language and country checks answer the same with 30 as with 300; a list of languages has "old"
 * in 35 names, "sign" in 144). The bound keeps a word thousands of names carry from costing a
 * long scan: at a million entities each new sequence costs about 80 us, 4% of linking time.
 */
export const SEPARATING_SCAN_LIMIT = 30;

/** Answers kept per open KB (a bounded cache: a stream of millions of mentions asks anew). */
const ANSWERS_KEPT = 50_000;

const answers = new WeakMap<Kb, GenerationCache<string, boolean>>();

/**
 * True when some entry's name is `words` followed (`atStart`) or preceded by a sequence that is
 * another entry's whole name key, in the same class.
 */
export function separatesEntries(kb: Kb, words: readonly string[], atStart: boolean): boolean {
  if (words.length === 0) return false;
  let known = answers.get(kb);
  if (known === undefined) {
    known = new GenerationCache(ANSWERS_KEPT);
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
  return kb.hot.postings.someCarrier(first, SEPARATING_SCAN_LIMIT, (eid) => {
    const cls = kb.hot.classOf(eid);
    return kb.names.someNameAround(eid, words, atStart, (rest) => {
      let other = false;
      kb.forEachKeyHit(rest, (c, kind, e) => {
        if (kind === "exact" && c === cls && e !== eid) other = true;
      });
      return other;
    });
  });
}
