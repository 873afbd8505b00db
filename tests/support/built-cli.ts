/**
 * The compiled command line for end-to-end tests. Each test file builds its own copy with
 * `npm run build -- --outDir out/test-dist-…` (the project's build, only a private output folder):
 * test files run in parallel, and two compilers writing the shared dist/ at once could let one
 * file's CLI read a half-written module of the other's build. The copy lives under the repository
 * (out/ is ignored by git) so that Node finds node_modules and the package's "type": "module".
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { join, resolve } from "node:path";
import { afterAll, beforeAll } from "vitest";

export const REPO = resolve(import.meta.dirname, "../..");

export interface BuiltCli {
  /** Output folder of the build (holds cli/main.js, io/coil-worker.js, …). */
  readonly dir: string;
  /** The compiled entry point. */
  readonly main: string;
}

/**
 * Compiles src/ into a fresh private folder; slow (about a second), so call it once per file.
 * A failed build throws with the compiler's messages and leaves no folder behind.
 */
export function buildCli(): BuiltCli {
  mkdirSync(join(REPO, "out"), { recursive: true });
  const dir = mkdtempSync(join(REPO, "out", "test-dist-"));
  try {
    execFileSync("npm", ["run", "build", "--", "--outDir", dir], { cwd: REPO, stdio: "pipe", encoding: "utf8" });
  } catch (e) {
    rmSync(dir, { recursive: true, force: true });
    const output = (e as { stdout?: string }).stdout ?? "";
    throw new Error(`npm run build failed:\n${output.trim()}`);
  }
  return { dir, main: join(dir, "cli", "main.js") };
}

export function removeBuild(cli: BuiltCli | undefined): void {
  if (cli) rmSync(cli.dir, { recursive: true, force: true });
}

/**
 * For one test file: builds the CLI before its tests and makes a scratch folder
 * out/<prefix>-XXXXXX, both removed after them. Call at the top level of the file; the getters
 * are valid inside the tests.
 */
export function cliForThisFile(scratchPrefix: string): { readonly cli: () => BuiltCli; readonly scratch: () => string } {
  let cli: BuiltCli | undefined;
  let scratch: string | undefined;
  beforeAll(() => {
    cli = buildCli();
    scratch = mkdtempSync(join(REPO, "out", `${scratchPrefix}-`));
  });
  afterAll(() => {
    removeBuild(cli);
    if (scratch) rmSync(scratch, { recursive: true, force: true });
  });
  return { cli: () => cli!, scratch: () => scratch! };
}

export interface CliRun {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Runs the compiled CLI with `args` from the repository root and waits for it. */
export function runCli(cli: BuiltCli, args: readonly string[]): CliRun {
  const r = spawnSync(process.execPath, [cli.main, ...args], { cwd: REPO, encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
