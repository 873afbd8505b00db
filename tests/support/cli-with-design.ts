/**
 * Test-only command line with the design, calibrate, sweep and merge commands, until they are
 * registered in src/cli/commands.ts. Run with `npx tsx tests/support/cli-with-design.ts <args>`.
 * Exit codes follow src/cli/main.ts: 2 bad input (one line), 1 write failure, 3 design target
 * not reached.
 */
import { Command, CommanderError } from "commander";
import { InputError } from "../../src/io/errors.js";
import { WriteError, abortAllResultFolders } from "../../src/io/result-folder.js";
import { registerDesignCommand } from "../../src/cli/design-command.js";
import { registerCalibrateCommand } from "../../src/cli/calibrate-command.js";
import { registerSweepCommand } from "../../src/cli/sweep-command.js";
import { registerMergeCommand } from "../../src/cli/merge-command.js";

const program = new Command().name("recalesce").exitOverride().configureOutput({ writeErr: (s) => process.stderr.write(s) });
registerDesignCommand(program);
registerCalibrateCommand(program);
registerSweepCommand(program);
registerMergeCommand(program);

program.parseAsync(process.argv).then(
  () => process.exit((process.exitCode as number | undefined) ?? 0),
  (e: unknown) => {
    abortAllResultFolders();
    if (e instanceof CommanderError) process.exit(2);
    if (e instanceof InputError || e instanceof WriteError) {
      process.stderr.write(`recalesce: ${e.message}\n`);
      process.exit(e instanceof InputError ? 2 : 1);
    }
    process.stderr.write(`recalesce: internal error: ${(e as Error).message}\n`);
    process.exit(1);
  },
);
