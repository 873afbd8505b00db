/**
 * `recalesce merge`: joins the result folders of a sweep's shards into one folder whose sweep.csv
 * and summary.json are byte-identical to those of the whole sweep run at once. The shards must come
 * from the same sweep (same case, grid and columns) and together hold every point exactly once.
 */
import { join } from "node:path";
import { InputError } from "./errors.js";
import { parseJson, readTextFile } from "./load-case.js";
import { writeJsonFolder } from "./write-folder.js";

interface ShardFolder {
  readonly dir: string;
  readonly summary: Record<string, unknown>;
  readonly header: string;
  readonly rows: Array<{ point: number; text: string }>;
}

/** The fields that identify a sweep (everything but the shard and its point count). */
function identity(summary: Record<string, unknown>): string {
  const { shard: _shard, points_in_file: _count, ...rest } = summary;
  return JSON.stringify(rest);
}

function readShard(dir: string): ShardFolder {
  const summaryFile = join(dir, "summary.json");
  const csvFile = join(dir, "sweep.csv");
  const summary = parseJson(summaryFile, readTextFile(summaryFile)) as Record<string, unknown>;
  if (typeof summary !== "object" || summary === null || typeof summary.points !== "number" || !Array.isArray(summary.columns)) {
    throw new InputError(summaryFile, "points", "not a sweep summary (expected points and columns); give folders written by recalesce sweep");
  }
  const lines = readTextFile(csvFile).split("\n");
  if (lines[lines.length - 1] === "") lines.pop();
  const header = lines[0] ?? "";
  if (header !== (summary.columns as string[]).join(",")) throw new InputError(csvFile, "row 1", "header does not match summary.json columns");
  const rows = lines.slice(1).map((text, i) => {
    const point = Number(text.slice(0, text.indexOf(",")));
    if (!Number.isInteger(point) || point < 0 || point >= (summary.points as number)) {
      throw new InputError(csvFile, `row ${i + 2}`, `point index must be a whole number 0–${(summary.points as number) - 1}`);
    }
    return { point, text };
  });
  return { dir, summary, header, rows };
}

export interface MergeOutcome {
  readonly summary: Record<string, unknown>;
  readonly points: number;
  readonly folders: number;
  /** Result cells (after the point index and the varied values) of every point, in order. */
  readonly rows: string[][];
}

export function mergeSweeps(dirs: readonly string[], outDir: string): MergeOutcome {
  if (dirs.length === 0) throw new InputError("merge", "folders", "give at least one sweep result folder");
  const shards = dirs.map(readShard);
  const first = shards[0];
  const total = first.summary.points as number;
  const byPoint = new Array<string | undefined>(total);
  const from = new Array<string>(total);
  for (const s of shards) {
    if (identity(s.summary) !== identity(first.summary)) {
      throw new InputError(join(s.dir, "summary.json"), "vary", `comes from a different sweep than ${first.dir} (case, grid or columns differ)`);
    }
    s.rows.forEach((r, i) => {
      if (byPoint[r.point] !== undefined) throw new InputError(join(s.dir, "sweep.csv"), `row ${i + 2}`, `point ${r.point} is also in ${from[r.point]}; give each shard once`);
      byPoint[r.point] = r.text;
      from[r.point] = s.dir;
    });
  }
  const missing: number[] = [];
  for (let i = 0; i < total; i++) if (byPoint[i] === undefined) missing.push(i);
  if (missing.length > 0) {
    const count = (first.summary.shard as { count?: number } | null)?.count;
    const given = new Set(shards.map((s) => (s.summary.shard as { index?: number } | null)?.index));
    const lacking = count ? Array.from({ length: count }, (_, k) => k + 1).filter((k) => !given.has(k)) : [];
    const which = lacking.length ? `shard(s) ${lacking.map((k) => `${k}/${count}`).join(", ")} not given` : `points ${missing.slice(0, 10).join(", ")}${missing.length > 10 ? ", …" : ""}`;
    throw new InputError(dirs.join(" "), "points", `${missing.length} of ${total} points missing (${which}); merge needs the whole sweep`);
  }
  const summary = { ...first.summary, shard: null, points_in_file: total };
  writeJsonFolder(outDir, { "summary.json": summary }, { "sweep.csv": first.header + "\n" + byPoint.join("\n") + "\n" });
  const skip = 1 + (first.summary.vary as unknown[]).length;
  return { summary, points: total, folders: dirs.length, rows: byPoint.map((t) => t!.split(",").slice(skip)) };
}
