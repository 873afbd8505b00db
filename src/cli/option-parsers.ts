/**
 * Parsers for command-line option values. A bad value raises commander's InvalidArgumentError,
 * which commander prints as one line naming the option, and the CLI exits with code 2.
 */
import { InvalidArgumentError } from "commander";

/** A finite number satisfying `ok`; the message states the unit or range. */
export function numberOption(expected: string, ok: (v: number) => boolean = () => true): (text: string) => number {
  return (text) => {
    const v = text.trim() === "" ? NaN : Number(text);
    if (!Number.isFinite(v) || !ok(v)) throw new InvalidArgumentError(`expected ${expected}`);
    return v;
  };
}

/** A whole number in [min, max]. */
export function wholeOption(min: number, max: number, what: string): (text: string) => number {
  return numberOption(`a whole number of ${what}, ${min}–${max}`, (v) => Number.isInteger(v) && v >= min && v <= max);
}

/** `LO:HI` with LO < HI (and both satisfying `ok`). */
export function rangeOption(unit: string, ok: (v: number) => boolean = () => true): (text: string) => [number, number] {
  return (text) => {
    const parts = text.split(":");
    const [lo, hi] = parts.map((p) => (p.trim() === "" ? NaN : Number(p)));
    if (parts.length !== 2 || !Number.isFinite(lo) || !Number.isFinite(hi) || !ok(lo) || !ok(hi)) throw new InvalidArgumentError(`expected LO:HI, two numbers [${unit}], e.g. 650:720`);
    if (!(lo < hi)) throw new InvalidArgumentError(`expected LO:HI with LO below HI [${unit}]`);
    return [lo, hi];
  };
}

/** Adapts a parser that throws Error into one that throws InvalidArgumentError. */
export function checked<T>(parse: (text: string) => T): (text: string) => T {
  return (text) => {
    try {
      return parse(text);
    } catch (e) {
      throw new InvalidArgumentError((e as Error).message);
    }
  };
}

/** Worker threads, 1–64. */
export const workersOption = wholeOption(1, 64, "workers");
