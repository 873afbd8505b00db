/**
 * Writes a result folder atomically: everything goes into a hidden sibling folder that is renamed
 * into place only when the run succeeded. An interrupted or failed run removes its partial folder,
 * and a previous result in the target folder survives intact until the new one replaces it.
 */
import { closeSync, existsSync, mkdirSync, openSync, renameSync, rmSync, writeSync } from "node:fs";
import { basename, dirname, join, resolve } from "node:path";

const open = new Set<ResultFolder>();

/** Removes every partial folder still open (used by the signal handlers). */
export function abortAllResultFolders(): void {
  for (const f of open) f.abort();
}

/** The hidden folder a run of this process writes into before renaming it to `target`. */
export function partialFolderFor(target: string): string {
  const t = resolve(target);
  return join(dirname(t), `.${basename(t)}.partial-${process.pid}`);
}

export class WriteError extends Error {
  constructor(readonly path: string, readonly reason: string) {
    super(`cannot write ${path}: ${reason}`);
    this.name = "WriteError";
  }
}

export function reasonOf(e: unknown): string {
  const code = (e as { code?: string }).code;
  if (code === "EACCES" || code === "EPERM" || code === "EROFS") return "permission denied (read-only folder?)";
  if (code === "ENOSPC") return "disk full";
  if (code === "ENOENT") return "parent folder does not exist";
  if (code === "ENOTDIR") return "a path component is not a folder";
  return code ?? (e instanceof Error ? e.message : String(e));
}

export class ResultFolder {
  readonly target: string;
  readonly partial: string;
  private done = false;

  constructor(target: string) {
    this.target = resolve(target);
    this.partial = partialFolderFor(this.target);
    try {
      rmSync(this.partial, { recursive: true, force: true });
      mkdirSync(this.partial, { recursive: true });
    } catch (e) {
      throw new WriteError(this.target, reasonOf(e));
    }
    open.add(this);
  }

  path(name: string): string {
    return join(this.partial, name);
  }

  writeFile(name: string, text: string): void {
    const p = this.path(name);
    try {
      const fd = openSync(p, "w");
      try {
        writeSync(fd, text);
      } finally {
        closeSync(fd);
      }
    } catch (e) {
      throw new WriteError(join(this.target, name), reasonOf(e));
    }
  }

  /** Streams rows to a file in the partial folder with a 64 kB buffer. */
  stream(name: string): TextStream {
    return new TextStream(this.path(name), join(this.target, name));
  }

  /** Moves the finished folder into place, replacing any previous result. */
  commit(): void {
    const old = join(dirname(this.target), `.${basename(this.target)}.old-${process.pid}`);
    try {
      rmSync(old, { recursive: true, force: true });
      const had = existsSync(this.target);
      if (had) renameSync(this.target, old);
      renameSync(this.partial, this.target);
      if (had) rmSync(old, { recursive: true, force: true });
    } catch (e) {
      this.abort();
      throw new WriteError(this.target, reasonOf(e));
    }
    this.done = true;
    open.delete(this);
  }

  abort(): void {
    if (this.done) return;
    this.done = true;
    open.delete(this);
    try {
      rmSync(this.partial, { recursive: true, force: true });
    } catch {
      // nothing more can be done; the partial folder is hidden and named for this process
    }
  }
}

/** Buffered, synchronous text output to one file. */
export class TextStream {
  private fd: number;
  private buffer = "";
  constructor(private readonly file: string, private readonly shownAs: string) {
    try {
      this.fd = openSync(file, "w");
    } catch (e) {
      throw new WriteError(shownAs, reasonOf(e));
    }
  }
  write(text: string): void {
    this.buffer += text;
    if (this.buffer.length > 65536) this.flush();
  }
  flush(): void {
    if (!this.buffer) return;
    try {
      writeSync(this.fd, this.buffer);
    } catch (e) {
      throw new WriteError(this.shownAs, reasonOf(e));
    }
    this.buffer = "";
  }
  close(): void {
    this.flush();
    closeSync(this.fd);
  }
}
