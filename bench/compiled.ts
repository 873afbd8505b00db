/**
 * The project compiled into a private folder under out/ (ignored by git), for benches that measure
 * worker threads as users run them: from compiled JavaScript, where each worker loads plain modules
 * (under tsx every worker would first transpile the TypeScript sources). Built once per process.
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { join, resolve } from "node:path";
import { pathToFileURL } from "node:url";

const REPO = resolve(import.meta.dirname, "..");
let built: string | null = null;

/** Imports `module` (e.g. "io/design.js") from the compiled copy. */
export async function importCompiled<T>(module: string): Promise<T> {
  if (built === null) {
    mkdirSync(join(REPO, "out"), { recursive: true });
    const dir = mkdtempSync(join(REPO, "out", "bench-dist-"));
    execFileSync("npm", ["run", "build", "--", "--outDir", dir], { cwd: REPO, stdio: "pipe" });
    process.on("exit", () => rmSync(dir, { recursive: true, force: true }));
    built = dir;
  }
  return (await import(pathToFileURL(join(built, module)).href)) as T;
}
