/**
 * hawser: link named-entity mentions to your own entity table, or to NIL, with scores and reasons.
 *
 * The commands of the `hawser` binary are library calls with the same names and options
 * (`index`, `link`, `evaluate` for `eval`, `tune`, `agree`, `demo`); the pipeline stages are
 * exported too for use inside your own code.
 */
export { agree, type AgreeOptions } from "./commands/agree.js";
export { demo, type DemoOptions, type DemoResult, SAMPLES_DIR } from "./commands/demo.js";
export { type EvalOptions, type EvalResult, evaluate, readLabeled } from "./commands/evaluate.js";
export { index, type IndexOptions } from "./commands/index-table.js";
export { link, type LinkOptions, type LinkSummary } from "./commands/link.js";
export { scoredMentionsFor, type TuneCommandOptions, type TuneCommandResult, tune } from "./commands/tune.js";

export { type BuildKbOptions, type BuildSummary, buildKb } from "./kb/build.js";
export { Kb, type KbInfo, openKb, readKbInfo } from "./kb/kb.js";
export { readTable } from "./kb/read-table.js";
export { createLinker, Linker, type LinkerOptions, type ScoredCandidate } from "./link/linker.js";
export { LinkPool, MAX_JOBS } from "./link/parallel.js";
export { type CandidateOptions, DEFAULT_CANDIDATE_OPTIONS } from "./candidates/generate.js";
export { csvRow, jsonlRow } from "./link/write.js";
export { type ReadMentionsOptions, readMentions } from "./read/index.js";
export { LabelMap, readLabelMapFile } from "./labels/label-map.js";
export { normalizeName, NORMALIZER_VERSION, type NormalizedName, splitTradeName } from "./normalize/name.js";
export { foldText } from "./normalize/fold.js";
export { combine, DEFAULT_WEIGHTS } from "./score/combine.js";
export { DEFAULT_MIN_MARGIN, DEFAULT_THRESHOLD, decide } from "./decide/decide.js";
export { evaluate as evaluateRows, type EvalReport } from "./evaluate/metrics.js";
export { formatEvalTable } from "./evaluate/format.js";
export { agreement } from "./evaluate/agree.js";
export { readConfig, type TunedConfig, writeConfig } from "./tune/config.js";
export { PROCEDURE_WORDS, TUNE_PROCEDURES, type TuneProcedure, type TuneResult } from "./tune/tune.js";
export { InputError, OutputError, UsageError } from "./util/errors.js";
export * from "./types.js";
