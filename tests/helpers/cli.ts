/** Running the built `hawser` binary (dist/cli/main.js) in a child process. */
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";

/** The built command line; `npm run build` (run by `npm ci` through `prepare`) writes it. */
export const CLI = fileURLToPath(new URL("../../dist/cli/main.js", import.meta.url));

/** Longest a single CLI run may take before the test fails (the runs here take well under a second). */
const CLI_TIMEOUT_MS = 20_000;

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Throws a clear message when the CLI has not been built. */
export function requireBuiltCli(): void {
  if (!existsSync(CLI)) {
    throw new Error(`${CLI} does not exist: run \`npm run build\` before the CLI tests`);
  }
}

/**
 * Run `hawser ARGS...` in `cwd` and collect its exit status and output. Standard input is closed,
 * or carries `input` when given.
 */
export function hawser(args: readonly string[], cwd: string, input?: string): CliResult {
  const r = spawnSync(process.execPath, [CLI, ...args], {
    cwd,
    encoding: "utf8",
    timeout: CLI_TIMEOUT_MS,
    ...(input === undefined ? { stdio: ["ignore", "pipe", "pipe"] as const } : { input }),
  });
  if (r.error) throw r.error;
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
