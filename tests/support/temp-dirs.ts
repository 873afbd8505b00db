/** Temporary folders for a test file, all removed after its last test. */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll } from "vitest";

/** Returns a maker of fresh folders under the system's temporary folder. */
export function tempDirs(prefix: string): { make: () => string; track: (dir: string) => void; all: () => readonly string[] } {
  const dirs: string[] = [];
  afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));
  return {
    make: () => {
      const d = mkdtempSync(join(tmpdir(), prefix));
      dirs.push(d);
      return d;
    },
    track: (dir) => void dirs.push(dir),
    all: () => dirs,
  };
}
