/**
 * Generates the demo-mill case files in cases/ (run: npx tsx scripts/demo-mill.ts).
 *
 * The demo mill is invented: a 100 m run-out table from the last finishing stand to the coiler,
 * ten water banks "B1"…"B10" from 12 m to 92 m, each of four curtain headers on top (2 m pitch,
 * 54 m³/h each: 0.6 m³/min per metre of a 1.5 m wide strip, physics.md §9 common practice) with
 * bottom sprays under the same stretch (40 m³/h each), pyrometers after the last stand (0 m), in
 * the middle (52 m) and before the coiler (100 m). Water 30 °C, air 30 °C. All grades are
 * invented and described by composition only.
 */
import { writeFileSync } from "node:fs";

const BANKS = 10;
const HEADERS_PER_BANK = 4;
const FIRST_M = 12;
const PITCH_M = 2;

interface Options {
  file: string;
  title: string;
  thickness_mm: number;
  entry_C: number;
  composition: Record<string, number>;
  grain_um: number;
  speed: Record<string, number> | number;
  banksOn: number[];
  coil?: { length_m: number; segments: number; entry_C: number };
  cells: number;
  dt: number;
  depths: number[];
  extra?: Record<string, unknown>;
}

function zones() {
  const out = [];
  for (let b = 0; b < BANKS; b++) {
    for (let h = 0; h < HEADERS_PER_BANK; h++) {
      const start = FIRST_M + (b * HEADERS_PER_BANK + h) * PITCH_M;
      out.push({
        start_m: start,
        end_m: start + PITCH_M,
        bank: `B${b + 1}`,
        top: { water: { header: "curtain", flow_m3_h: 54 } },
        bottom: { water: { header: "spray", flow_m3_h: 40 } },
      });
    }
  }
  return out;
}

function write(o: Options): void {
  const line: Record<string, unknown> = {
    length_m: 100,
    ...(typeof o.speed === "number" ? { speed_m_s: o.speed } : { speed: o.speed }),
    water_C: 30,
    air_C: 30,
    strip_width_mm: 1500,
    banks: Array.from({ length: BANKS }, (_, i) => ({ name: `B${i + 1}`, on: o.banksOn.includes(i + 1) })),
    zones: zones(),
    pyrometers_m: [0, 52, 100],
  };
  const kase = {
    title: o.title,
    product: { thickness_mm: o.thickness_mm, initial_C: o.entry_C, width_mm: 1500 },
    material: { composition_wt_pct: o.composition, austenite_grain_um: o.grain_um, ...(o.extra ?? {}) },
    cooling: { line, ...(o.coil ? { coil: o.coil } : {}) },
    numerics: { scheme: "crank-nicolson", cells: o.cells, time_step_s: o.dt },
    output: { depths_mm: o.depths, interval_s: 0.5 },
  };
  writeFileSync(o.file, JSON.stringify(kase, null, 2) + "\n");
}

write({
  file: "cases/demo-thin-cmn.json",
  title: "Demo mill: 3 mm C-Mn strip, early cooling, banks B1-B3",
  thickness_mm: 3,
  entry_C: 870,
  composition: { C: 0.08, Mn: 0.45, Si: 0.02, P: 0.012, Al: 0.03, N: 0.004 },
  grain_um: 20,
  speed: 9,
  banksOn: [1, 2, 3],
  cells: 20,
  dt: 0.005,
  depths: [0, 0.75, 1.5],
});
write({
  file: "cases/demo-thick-hsla.json",
  title: "Demo mill: 12 mm HSLA-type strip (Nb microalloyed), banks B1-B4",
  thickness_mm: 12,
  entry_C: 860,
  composition: { C: 0.07, Mn: 1.4, Si: 0.25, Nb: 0.04, V: 0.03, Ti: 0.015, Al: 0.03, N: 0.005 },
  grain_um: 15,
  speed: 3,
  banksOn: [1, 2, 3, 4],
  cells: 40,
  dt: 0.01,
  depths: [0, 3, 6, 12],
});
write({
  file: "cases/demo-split-dual-phase.json",
  title: "Demo mill: 3 mm dual-phase-type strip, split cooling (B1, air hold, B9-B10)",
  thickness_mm: 3,
  entry_C: 850,
  composition: { C: 0.07, Mn: 1.5, Si: 0.3, Cr: 0.5, Al: 0.03 },
  grain_um: 15,
  speed: 6,
  banksOn: [1, 9, 10],
  cells: 20,
  dt: 0.005,
  depths: [0, 1.5],
});
write({
  file: "cases/coil-6mm-acceleration.json",
  title: "Demo mill: 6 mm C-Mn coil, 30 segments, threading 5 m/s accelerating to 8 m/s",
  thickness_mm: 6,
  entry_C: 870,
  composition: { C: 0.12, Mn: 0.6, Si: 0.1, Al: 0.03, N: 0.004 },
  grain_um: 25,
  speed: { threading_m_s: 5, acceleration_m_s2: 0.05, max_m_s: 8, deceleration_m_s2: 0.2, tail_m_s: 6 },
  banksOn: [1, 2, 3],
  coil: { length_m: 900, segments: 30, entry_C: 870 },
  cells: 40,
  dt: 0.01,
  depths: [0, 3],
});
