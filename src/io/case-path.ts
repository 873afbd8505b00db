/**
 * Dotted paths into a case with array indices: `cooling.line.banks[2].multiplier` names
 * case.cooling.line.banks[2].multiplier. Used by sweeps to vary any numeric field.
 */

export type PathKey = string | number;

const PATH = /^[A-Za-z_$][\w$]*(\[\d+\])*(\.[A-Za-z_$][\w$]*(\[\d+\])*)*$/;

/** Splits a path into keys, or returns null when it is not of the form a.b[2].c. */
export function parseCasePath(path: string): PathKey[] | null {
  if (!PATH.test(path)) return null;
  const keys: PathKey[] = [];
  for (const part of path.split(".")) {
    const name = /^[^[]+/.exec(part)![0];
    keys.push(name);
    for (const m of part.matchAll(/\[(\d+)\]/g)) keys.push(Number(m[1]));
  }
  return keys;
}

/** The value at a path, or undefined when the path does not exist. */
export function valueAt(root: unknown, keys: readonly PathKey[]): unknown {
  let v: unknown = root;
  for (const k of keys) {
    if (v === null || typeof v !== "object") return undefined;
    if (typeof k === "number") {
      if (!Array.isArray(v) || k >= v.length) return undefined;
      v = v[k];
    } else {
      if (Array.isArray(v) || !Object.prototype.hasOwnProperty.call(v, k)) return undefined;
      v = (v as Record<string, unknown>)[k];
    }
  }
  return v;
}

/** Sets the value at an existing path (the caller owns `root`). */
export function setValueAt(root: unknown, keys: readonly PathKey[], value: unknown): void {
  const parent = valueAt(root, keys.slice(0, -1)) as Record<PathKey, unknown>;
  parent[keys[keys.length - 1]] = value;
}
