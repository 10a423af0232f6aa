/**
 * Invented, deterministic ScoredMention sets for the tuning tests: mentions from a fictional
 * river-port trade gazette (1890-1930), each with a gold candidate whose name features are high
 * and look-alike distractors whose features are lower. `noise` blurs the two apart.
 */
import { mulberry32 } from "../src/tune/folds.js";
import type { ScoredMention } from "../src/tune/types.js";
import type { Features } from "../src/types.js";

const TYPES = ["PER", "ORG", "LOC"] as const;
const NAMES = {
  PER: ["Capt. Orrin Valesby", "Widow Marra Tench", "Harbourmaster Dunmore", "J. H. Aldous", "Ezra Quillon"],
  ORG: ["Brannock & Sons Cordage", "Lower Vell Steam Packet Co.", "Sallow Quay Bank", "Tench Grain Exchange"],
  LOC: ["Port Ellery", "Vell Ford", "Calder Reach", "Saltmarsh Landing", "Upper Brannock"],
} as const;

function clamp(x: number): number {
  return Math.min(1, Math.max(0, x));
}

function features(random: () => number, base: number, noise: number, exact: boolean): Features {
  const jitter = () => (random() - 0.5) * 2 * noise;
  const name = clamp(base + jitter());
  return {
    jaroWinkler: clamp(name + 0.05 + jitter() / 2),
    levenshtein: clamp(name - 0.05 + jitter() / 2),
    tokenSet: clamp(name + jitter() / 2),
    abbreviation: random() < 0.1 ? 1 : 0,
    exactKey: exact ? 1 : 0,
    context: clamp(base * 0.6 + jitter()),
    typeMatch: random() < 0.9 ? 1 : 0.5,
    prior: clamp(random()),
    nearSpelling: 0,
    contextConflict: 0,
    prominence: 0,
  };
}

/**
 * `n` mentions; a share `nilShare` has a NIL gold (only distractors); `missShare` of the linked
 * ones lack their gold among the candidates (blocking misses).
 */
export function syntheticSet(
  n: number,
  opts: { seed?: number; noise?: number; nilShare?: number; missShare?: number } = {},
): ScoredMention[] {
  const random = mulberry32(opts.seed ?? 7);
  const noise = opts.noise ?? 0.1;
  const nilShare = opts.nilShare ?? 0.25;
  const missShare = opts.missShare ?? 0;
  const out: ScoredMention[] = [];
  for (let i = 0; i < n; i++) {
    const type = TYPES[i % TYPES.length]!;
    const names = NAMES[type];
    const text = names[i % names.length]!;
    const isNil = random() < nilShare;
    const gold = isNil ? null : `${type.toLowerCase()}-${i % 17}`;
    const candidates: ScoredMention["candidates"] = [];
    if (gold !== null && random() >= missShare)
      candidates.push({ entity: gold, name: text, features: features(random, 0.9, noise, random() < 0.5) });
    const distractors = 1 + Math.floor(random() * 3);
    for (let d = 0; d < distractors; d++)
      candidates.push({
        entity: `${type.toLowerCase()}-x${i}-${d}`,
        features: features(random, 0.55, noise, false),
      });
    // Shuffle so the gold candidate is not always first.
    for (let a = candidates.length - 1; a > 0; a--) {
      const b = Math.floor(random() * (a + 1));
      [candidates[a], candidates[b]] = [candidates[b]!, candidates[a]!];
    }
    out.push({ mention: { id: `m${i + 1}`, text, type, context: "gazette notice", gold }, candidates });
  }
  return out;
}
