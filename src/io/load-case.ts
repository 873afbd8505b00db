/**
 * Reads and validates a case file. Failures become one InputError naming the file, the field
 * path and what was expected (unit or range), or the line and column of a JSON syntax error.
 */
import { readFileSync, statSync } from "node:fs";
import { z } from "zod";
import { caseSchema, type Case } from "./case-schema.js";
import { InputError, formatPath } from "./errors.js";

/** Reads a text file that must exist, be a regular file and be valid UTF-8. */
export function readTextFile(file: string): string {
  let st;
  try {
    st = statSync(file);
  } catch {
    throw new InputError(file, "", "file not found or not readable");
  }
  if (st.isDirectory()) throw new InputError(file, "", "is a folder; expected a case file (JSON)");
  let buf: Buffer;
  try {
    buf = readFileSync(file);
  } catch {
    throw new InputError(file, "", "file not readable");
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(buf);
  } catch {
    throw new InputError(file, "", "is not valid UTF-8 text");
  }
}

/** Parses JSON, turning a syntax error into line and column. */
export function parseJson(file: string, text: string): unknown {
  if (text.trim() === "") throw new InputError(file, "", "file is empty; expected a JSON case");
  try {
    return JSON.parse(text);
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    const m = /position (\d+)/.exec(msg);
    let where = "";
    if (m) {
      const pos = Number(m[1]);
      const before = text.slice(0, pos);
      const line = before.split("\n").length;
      const column = pos - before.lastIndexOf("\n");
      where = ` at line ${line}, column ${column}`;
    }
    if (!m && /end of (JSON )?input|Unterminated/i.test(msg)) {
      const lines = text.split("\n");
      where = ` at line ${lines.length}, column ${lines[lines.length - 1].length + 1} (the text ends too early)`;
    }
    const reason = msg.replace(/\s*in JSON at position \d+.*$/s, "").replace(/^.*?JSON\.parse: /, "");
    throw new InputError(file, "", `malformed JSON${where}: ${reason}`);
  }
}

/** Turns the first zod issue into an InputError. */
/**
 * A union reports one issue per branch; the branch that got deepest into the input is the one the
 * author meant, so its first issue (with the union's path prefixed) is the one to show.
 */
function deepestIssue(issue: z.core.$ZodIssue): z.core.$ZodIssue {
  if (issue.code !== "invalid_union") return issue;
  const branches = (issue as { errors?: z.core.$ZodIssue[][] }).errors ?? [];
  let best: z.core.$ZodIssue | null = null;
  let bestDepth = -1;
  for (const branch of branches) {
    if (branch.length === 0) continue;
    const inner = deepestIssue(branch[0]);
    // An unknown key in a branch means the input was not of that branch's form: rank it last.
    const depth = inner.code === "unrecognized_keys" || inner.code === "invalid_type" && inner.path.length === 0 ? 0 : inner.path.length + 1;
    if (depth > bestDepth) {
      bestDepth = depth;
      best = inner;
    }
  }
  if (!best || bestDepth <= 1) return issue;
  return { ...best, path: [...issue.path, ...best.path] } as z.core.$ZodIssue;
}

/** The value at a path in the parsed input (undefined when absent). */
function valueAt(data: unknown, path: ReadonlyArray<PropertyKey>): unknown {
  let v: unknown = data;
  for (const p of path) {
    if (v === null || typeof v !== "object") return undefined;
    v = (v as Record<PropertyKey, unknown>)[p];
  }
  return v;
}

export function zodToInputError(file: string, error: z.ZodError, data?: unknown): InputError {
  const issue = deepestIssue(error.issues[0]);
  let path = issue.path;
  let message = issue.message;
  if (issue.code === "unrecognized_keys") {
    const keys = (issue as { keys: string[] }).keys;
    path = [...issue.path, keys[0]];
    message = message.startsWith("unknown element") ? message : `unknown key "${keys[0]}"; check the spelling against the case format`;
  } else if (issue.code === "invalid_type") {
    const got = data === undefined ? undefined : valueAt(data, issue.path);
    if (got === undefined) message = `missing; ${message.replace(/,?\s*received undefined/, "")}`;
    else message = `${message}, got ${JSON.stringify(got)?.slice(0, 40) ?? typeof got}`;
  }
  return new InputError(file, formatPath(path) || "(top level)", message);
}

export function validateCase(file: string, data: unknown): Case {
  const parsed = caseSchema.safeParse(data);
  if (!parsed.success) throw zodToInputError(file, parsed.error, data);
  return parsed.data;
}

export function loadCase(file: string): Case {
  return validateCase(file, parseJson(file, readTextFile(file)));
}
