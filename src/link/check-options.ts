/**
 * Checks of what a library caller hands the linker: its options and each mention. The command
 * line and the file readers validate what they read, but an object built in code reaches the
 * linker as it is, and a wrong value would otherwise surface as a TypeError deep inside, or
 * worse, as a quietly wrong link (a weight that is not a number makes every score NaN).
 */
import { ALL_PATHS, type CandidateOptions } from "../candidates/generate.js";
import type { DocumentEvidenceOptions } from "../document/evidence.js";
import { MARGIN_CAP } from "../decide/decide.js";
import { FEATURE_NAMES, type Mention, type SearchPath, type Weights } from "../types.js";
import { CONFIG_FORMAT } from "../tune/config.js";
import { checkRange, checkWhole, shown, UsageError } from "../util/errors.js";

/** Most edits a fuzzy correction may take: the fuzzy index holds up to two deletions a token (see src/kb/deletions.ts). */
export const MAX_FUZZY_EDITS = 2;

export const isObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === "object" && v !== null && !Array.isArray(v);
/**
 * Score weights: a finite bias and a finite weight for every feature, no unknown name (a
 * misspelt feature would be dropped silently, its real weight left out).
 */
export function checkWeights(w: unknown): Weights {
  const remedy = "(DEFAULT_WEIGHTS has them all; a tuned config's weights come from readConfig)";
  if (!isObject(w) || !isObject(w.features))
    throw new UsageError(`weights must be { bias, features: { name: weight } } ${remedy}, got ${shown(w)}`);
  if (!(typeof w.bias === "number" && Number.isFinite(w.bias)))
    throw new UsageError(`weights.bias must be a finite number, got ${shown(w.bias)}`);
  const features = w.features;
  for (const name of Object.keys(features))
    if (!(FEATURE_NAMES as readonly string[]).includes(name))
      throw new UsageError(`weights.features.${name}: unknown feature; known: ${FEATURE_NAMES.join(", ")}`);
  for (const name of FEATURE_NAMES) {
    const v = features[name];
    if (!(typeof v === "number" && Number.isFinite(v)))
      throw new UsageError(`weights.features.${name} must be a finite number ${remedy}, got ${shown(v)}`);
  }
  return w as unknown as Weights;
}

/** The linker's candidate paths, each known. */
export function checkPaths(paths: unknown): readonly SearchPath[] {
  if (!Array.isArray(paths) && !(paths instanceof Set))
    throw new UsageError(
      `paths must be an array of path names (${ALL_PATHS.join(", ")}), got ${shown(paths)}`,
    );
  for (const p of paths)
    if (!(ALL_PATHS as readonly unknown[]).includes(p))
      throw new UsageError(`unknown candidate path ${shown(p)}; use ${ALL_PATHS.join(", ")}`);
  return [...paths] as SearchPath[];
}

/** Settings of CandidateOptions, each in its range; unknown names are refused. */
export function checkCandidateOptions(c: CandidateOptions): void {
  checkWhole("maxCandidates", c.maxCandidates, 1);
  checkWhole("maxSearchCandidates", c.maxSearchCandidates, 0);
  checkWhole("candidates.ftsLimit", c.ftsLimit, 0);
  checkWhole("candidates.ftsMaxDf", c.ftsMaxDf, 1);
  checkWhole("candidates.fuzzyMaxEdits", c.fuzzyMaxEdits, 0, MAX_FUZZY_EDITS);
  checkWhole("candidates.fuzzyMaxCorrections", c.fuzzyMaxCorrections, 0);
  for (const name of ["skipSearchOnKeyMatch", "respellSurnameOnKeyMatch", "subKeys"] as const)
    if (typeof c[name] !== "boolean")
      throw new UsageError(`candidates.${name} must be true or false, got ${shown(c[name])}`);
}

/** Names a caller may set in `candidates` (`paths` too, though the linker's own `paths` option wins). */
const CANDIDATE_SETTINGS: ReadonlySet<string> = new Set([
  "paths",
  "maxCandidates",
  "maxSearchCandidates",
  "ftsLimit",
  "ftsMaxDf",
  "fuzzyMaxEdits",
  "fuzzyMaxCorrections",
  "skipSearchOnKeyMatch",
  "respellSurnameOnKeyMatch",
  "subKeys",
]);

/** The `candidates` option as given: an object of known settings. */
export function checkCandidateSettings(given: unknown): Partial<CandidateOptions> {
  if (given === undefined) return {};
  if (!isObject(given)) throw new UsageError(`candidates must be an object of settings, got ${shown(given)}`);
  const settings: Record<string, unknown> = {};
  for (const [name, v] of Object.entries(given)) {
    if (!CANDIDATE_SETTINGS.has(name))
      throw new UsageError(
        `candidates.${name}: unknown setting; known: ${[...CANDIDATE_SETTINGS].join(", ")}`,
      );
    // An explicit undefined means the default, as for the linker's own options.
    if (v !== undefined) settings[name] = name === "paths" ? checkPaths(v) : v;
  }
  return settings as Partial<CandidateOptions>;
}

/** The linker's options (LinkerOptions), by name: another name is a misspelling, refused. */
export const LINKER_OPTION_NAMES: ReadonlySet<string> = new Set([
  "weights",
  "threshold",
  "minMargin",
  "top",
  "maxCandidates",
  "paths",
  "candidates",
  "labels",
  "blockMinCompat",
  "document",
  "surfaceCache",
]);

/** The fields of a tuned config (readConfig) beside its weights, threshold and margin. */
const CONFIG_FIELDS: ReadonlySet<string> = new Set([
  "format",
  "version",
  "objective",
  "minPrecision",
  "figures",
  "kb",
  "created",
]);

/**
 * The options object itself: an object (not an array) of known names. A tuned config as
 * readConfig returns it is taken whole (its weights, threshold and margin are linker options),
 * and refused when it was tuned on another KB than `kbFingerprint`, as `link --config` refuses it.
 */
export function checkOptionNames(options: unknown, kbFingerprint: string): void {
  if (!isObject(options)) throw new UsageError(`linker options must be an object, got ${shown(options)}`);
  const config = options.format === CONFIG_FORMAT;
  for (const name of Object.keys(options))
    if (!LINKER_OPTION_NAMES.has(name) && !(config && CONFIG_FIELDS.has(name)))
      throw new UsageError(`unknown linker option "${name}"; known: ${[...LINKER_OPTION_NAMES].join(", ")}`);
  const tunedOn = (options.kb as { fingerprint?: unknown } | undefined)?.fingerprint;
  if (config && tunedOn !== kbFingerprint)
    throw new UsageError(
      `this config was tuned on another KB (fingerprint ${shown(tunedOn)}, this KB's ${kbFingerprint}): ` +
        "tune again on this KB, or pass its weights, threshold and minMargin yourself to use it anyway",
    );
}

/** The `document` option: false, or an object of the three steps, each true or false. */
export function checkDocumentOptions(given: unknown): Partial<DocumentEvidenceOptions> | false {
  if (given === undefined) return {};
  if (given === false) return false;
  const steps = ["sameText", "shortForm", "acronyms"];
  if (!isObject(given))
    throw new UsageError(`document must be false or an object of ${steps.join(", ")}, got ${shown(given)}`);
  for (const [name, v] of Object.entries(given)) {
    if (!steps.includes(name))
      throw new UsageError(`document.${name}: unknown step; known: ${steps.join(", ")}`);
    if (v !== undefined && typeof v !== "boolean")
      throw new UsageError(`document.${name} must be true or false, got ${shown(v)}`);
  }
  return given as Partial<DocumentEvidenceOptions>;
}

/** The decision settings: threshold in [0, 1], minimum margin in [0, MARGIN_CAP] log-odds. */
export function checkDecision(threshold: unknown, minMargin: unknown): void {
  checkRange("threshold", threshold, 0, 1);
  if (!(typeof minMargin === "number" && minMargin >= 0 && minMargin <= MARGIN_CAP))
    throw new UsageError(
      `minMargin must be a number of log-odds in [0, ${MARGIN_CAP}], got ${shown(minMargin)}`,
    );
}

/**
 * A mention as the linker needs it: an object with a non-empty string id and a string text;
 * type, context and doc strings when given; start and end whole numbers in order when given.
 */
export function checkMention(m: Mention): void {
  if (!isObject(m)) throw new UsageError(`a mention must be an object, got ${shown(m)}`);
  if (typeof m.id !== "string" || m.id === "")
    throw new UsageError(
      `a mention's id must be a non-empty string, got ${shown(m.id)} (text ${shown(m.text)})`,
    );
  const what = `mention "${m.id}"`;
  // A blank text is allowed here (a NIL row, as for any text without a candidate); the readers
  // refuse it in files, where it is a sign of a broken row.
  if (typeof m.text !== "string")
    throw new UsageError(`${what}: text must be a string, got ${shown(m.text)}`);
  for (const field of ["type", "context", "doc"] as const) {
    const v = m[field];
    if (v !== undefined && v !== null && typeof v !== "string")
      throw new UsageError(`${what}: ${field} must be a string when given, got ${shown(v)}`);
  }
  const given = (v: unknown) => v !== undefined && v !== null;
  for (const field of ["start", "end"] as const) {
    const v = m[field];
    if (given(v) && !(typeof v === "number" && Number.isSafeInteger(v) && v >= 0))
      throw new UsageError(`${what}: ${field} must be a whole number >= 0 when given, got ${shown(v)}`);
  }
  if (given(m.start) !== given(m.end))
    throw new UsageError(`${what}: start and end are given together or not at all`);
  if (given(m.start) && (m.start as number) >= (m.end as number))
    throw new UsageError(`${what}: end must be greater than start (start ${m.start}, end ${m.end})`);
}
