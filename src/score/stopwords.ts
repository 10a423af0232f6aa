/**
 * English stopwords left out of context terms: function words and a few verbs and adverbs too
 * common to tell entries apart. The words of the English list of the `natural` package (MIT
 * licence, copyright 2011 Chris Umbel), kept word for word so that context terms, and with them
 * the KBs' IDF statistics, are the same as when hawser read the list from that package;
 * tests/terms.test.ts checks the two agree while `natural` stays a development dependency. Its
 * single letters and digits are left out: terms shorter than two characters are dropped anyway.
 */
export const ENGLISH_STOPWORDS: readonly string[] = [
  ...["about", "above", "after", "again", "all", "also", "am", "an", "and", "another", "any", "are"],
  ...["as", "at", "be", "because", "been", "before", "being", "below", "between", "both", "but"],
  ...["by", "came", "can", "cannot", "come", "could", "did", "do", "does", "doing", "during"],
  ...["each", "few", "for", "from", "further", "get", "got", "has", "had", "he", "have", "her"],
  ...["here", "him", "himself", "his", "how", "if", "in", "into", "is", "it", "its", "itself"],
  ...["like", "make", "many", "me", "might", "more", "most", "much", "must", "my", "myself"],
  ...["never", "now", "of", "on", "only", "or", "other", "our", "ours", "ourselves", "out", "over"],
  ...["own", "said", "same", "see", "she", "should", "since", "so", "some", "still", "such"],
  ...["take", "than", "that", "the", "their", "theirs", "them", "themselves", "then", "there"],
  ...["these", "they", "this", "those", "through", "to", "too", "under", "until", "up", "very"],
  ...["was", "way", "we", "well", "were", "what", "where", "when", "which", "while", "who", "whom"],
  ...["with", "would", "why", "you", "your", "yours", "yourself"],
];
