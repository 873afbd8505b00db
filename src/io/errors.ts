/**
 * Typed input errors. Everything that is the user's fault becomes an InputError carrying the file,
 * the field path and what was expected; the CLI prints it as one line and exits 2.
 */
export class InputError extends Error {
  constructor(
    readonly file: string,
    readonly field: string,
    readonly expected: string,
  ) {
    super(`${file}: ${field ? `${field}: ` : ""}${expected}`);
    this.name = "InputError";
  }
}

/** Formats a zod-style path ["a", 0, "b"] as a.b[0]... → "a[0].b". */
export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let s = "";
  for (const p of path) {
    if (typeof p === "number") s += `[${p}]`;
    else s += s ? `.${String(p)}` : String(p);
  }
  return s;
}
