#!/usr/bin/env node
/**
 * recalesce command line. Every command validates its inputs at the edge; the user's mistakes
 * become one line on stderr and exit code 2, write failures exit 1 with the path named, and no
 * command leaves a half-written result folder behind (also on SIGINT/SIGTERM).
 *
 * Exit codes: 0 ok, 1 internal failure or write failure, 2 bad input, 3 target unreachable
 * (design), and `check` uses 1 for a regression.
 */
import { readFileSync } from "node:fs";
import { Command, CommanderError } from "commander";
import { abortAllResultFolders, WriteError } from "../io/result-folder.js";
import { InputError } from "../io/errors.js";
import { registerCommands } from "./commands.js";
import { stopActiveRun } from "./run-in-worker.js";

/** The version in package.json (read at start; the CLI ships with it). */
function packageVersion(): string {
  try {
    const pkg = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { version?: string };
    return pkg.version ?? "unknown";
  } catch {
    return "unknown";
  }
}

export class ExitError extends Error {
  constructor(readonly code: number, message: string) {
    super(message);
  }
}

function onSignal(signal: NodeJS.Signals): void {
  abortAllResultFolders();
  void stopActiveRun().finally(() => {
    process.stderr.write(`recalesce: interrupted by ${signal}; no partial results were kept\n`);
    process.exit(signal === "SIGINT" ? 130 : 143);
  });
}

export async function main(argv: string[]): Promise<number> {
  const program = new Command();
  program
    .name("recalesce")
    .description("Through-thickness cooling of transforming hot-rolled steel: conduction, kinetics, latent heat, run-out table.")
    .version(packageVersion(), "-V, --version", "print the version")
    .exitOverride()
    .configureOutput({ writeErr: (s) => process.stderr.write(s), writeOut: (s) => process.stdout.write(s) })
    .showHelpAfterError(false);
  registerCommands(program);
  try {
    await program.parseAsync(argv);
    return (process.exitCode as number | undefined) ?? 0;
  } catch (e) {
    return handleError(e);
  }
}

export function handleError(e: unknown): number {
  if (e instanceof CommanderError) {
    if (e.code === "commander.helpDisplayed" || e.code === "commander.version" || e.code === "commander.help") return 0;
    return 2; // commander already printed its one-line message
  }
  abortAllResultFolders();
  if (e instanceof InputError) {
    process.stderr.write(`recalesce: ${e.message}\n`);
    return 2;
  }
  if (e instanceof WriteError) {
    process.stderr.write(`recalesce: ${e.message}\n`);
    return 1;
  }
  if (e instanceof ExitError) {
    process.stderr.write(`recalesce: ${e.message}\n`);
    return e.code;
  }
  const msg = e instanceof Error ? e.message : String(e);
  process.stderr.write(`recalesce: internal error: ${msg}\n`);
  if (process.env.RECALESCE_DEBUG && e instanceof Error) process.stderr.write(`${e.stack}\n`);
  return 1;
}

process.on("SIGINT", onSignal);
process.on("SIGTERM", onSignal);
main(process.argv).then(
  (code) => process.exit(code),
  (e) => process.exit(handleError(e)),
);
