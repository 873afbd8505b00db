/**
 * `recalesce limits`: the thermodynamic floor of the ferrite mean linear intercept,
 * L̄_min = 2σV_m/|ΔG_m| (src/physics/grain-floor.ts), for a given driving force, or for a steel's
 * carbon content over a range of temperatures using the SGTE iron description with carbon.
 */
import { InvalidArgumentError, type Command } from "commander";
import { FERRITE_MOLAR_VOLUME_m3_mol, DEFAULT_BOUNDARY_ENERGY_J_m2, grainFloor_nm } from "../physics/grain-floor.js";
import { ferriteDrivingForce_Jmol } from "../physics/sgte-iron.js";
import { InputError } from "../io/errors.js";
import { SAFETY_NOTICE } from "../io/safety.js";

function number(name: string, unit: string) {
  return (v: string): number => {
    const n = Number(v);
    if (v.trim() === "" || !Number.isFinite(n)) throw new InvalidArgumentError(`${name}: expected a number [${unit}]`);
    return n;
  };
}

interface LimitsOptions {
  drivingForce?: number;
  interfaceEnergy: number;
  carbon?: number;
  fromC: number;
  toC: number;
  stepK: number;
  json?: boolean;
}

export interface FloorRow {
  T_C: number | null;
  driving_force_J_mol: number;
  grain_floor_nm: number | null;
}

/** The floor rows the command prints (pure, for tests). */
export function limitsRows(o: LimitsOptions): FloorRow[] {
  if (!(o.interfaceEnergy > 0)) throw new InputError("--interface-energy", "", `must be > 0 J/m², got ${o.interfaceEnergy}`);
  if (o.drivingForce !== undefined) {
    if (!(o.drivingForce < 0)) {
      throw new InputError("--driving-force", "", `must be negative (ferrite can form) J/mol, got ${o.drivingForce}; pass e.g. --driving-force=-700`);
    }
    return [{ T_C: null, driving_force_J_mol: o.drivingForce, grain_floor_nm: grainFloor_nm(o.drivingForce, o.interfaceEnergy) }];
  }
  if (o.carbon === undefined) throw new InputError("recalesce limits", "", "give --driving-force <J/mol> or --carbon <wt%> with a temperature range");
  if (!(o.carbon >= 0 && o.carbon <= 2)) throw new InputError("--carbon", "", `must lie in 0–2 wt%, got ${o.carbon}`);
  if (!(o.stepK > 0)) throw new InputError("--step-K", "", "must be > 0 K");
  if (!(o.toC >= o.fromC)) throw new InputError("--to-C", "", "must not be below --from-C (°C)");
  if ((o.toC - o.fromC) / o.stepK > 10000) throw new InputError("--step-K", "", "more than 10000 rows; use a larger step (K)");
  const rows: FloorRow[] = [];
  for (let k = 0; o.fromC + k * o.stepK <= o.toC + 1e-9; k++) {
    const T_C = o.fromC + k * o.stepK;
    const dG = ferriteDrivingForce_Jmol(T_C + 273.15, o.carbon);
    rows.push({ T_C, driving_force_J_mol: Number(dG.toFixed(1)), grain_floor_nm: dG < 0 ? Number(grainFloor_nm(dG, o.interfaceEnergy).toFixed(3)) : null });
  }
  return rows;
}

export function registerLimitsCommand(program: Command): void {
  program
    .command("limits")
    .description("thermodynamic floor of the ferrite grain size, 2σV_m/|ΔG|, for a driving force or a carbon content over temperature")
    .option("--driving-force <J/mol>", "driving force ΔG_m of austenite → ferrite (negative) [J/mol]", number("--driving-force", "J/mol"))
    .option("--interface-energy <J/m2>", "grain-boundary energy σ [J/m²]", number("--interface-energy", "J/m²"), DEFAULT_BOUNDARY_ENERGY_J_m2)
    .option("--carbon <wt%>", "carbon content for the SGTE + carbon driving force [wt%]", number("--carbon", "wt%"))
    .option("--from-C <T>", "first temperature [°C]", number("--from-C", "°C"), 500)
    .option("--to-C <T>", "last temperature [°C]", number("--to-C", "°C"), 850)
    .option("--step-K <K>", "temperature step [K]", number("--step-K", "K"), 25)
    .option("--json", "print JSON (field grain_floor_nm)")
    .action((o: LimitsOptions) => {
      const rows = limitsRows(o);
      if (o.json) {
        const out = {
          interface_energy_J_m2: o.interfaceEnergy,
          molar_volume_m3_mol: FERRITE_MOLAR_VOLUME_m3_mol,
          ...(rows.length === 1 && rows[0].T_C === null ? { driving_force_J_mol: rows[0].driving_force_J_mol, grain_floor_nm: rows[0].grain_floor_nm } : { carbon_wt: o.carbon, rows }),
          caution: SAFETY_NOTICE,
        };
        process.stdout.write(JSON.stringify(out, null, 2) + "\n");
        return;
      }
      const lines = [`grain-size floor L_min = 2σV_m/|ΔG|, σ = ${o.interfaceEnergy} J/m², V_m = ${FERRITE_MOLAR_VOLUME_m3_mol} m³/mol`];
      if (rows.length === 1 && rows[0].T_C === null) lines.push(`  ΔG = ${rows[0].driving_force_J_mol} J/mol → ${rows[0].grain_floor_nm!.toFixed(2)} nm`);
      else {
        lines.push(`  carbon ${o.carbon} wt% (SGTE iron with dilute carbon)`, "     T_C    ΔG_J/mol   floor_nm");
        for (const r of rows) lines.push(`  ${r.T_C!.toFixed(1).padStart(6)}  ${r.driving_force_J_mol.toFixed(1).padStart(10)}  ${r.grain_floor_nm === null ? "  (no driving force)" : r.grain_floor_nm.toFixed(2).padStart(9)}`);
      }
      lines.push("  production ferrite in conventionally cooled strip stays above about 1 µm: the floor is a bound, not a prediction");
      lines.push(`  caution: ${SAFETY_NOTICE}`);
      process.stdout.write(lines.join("\n") + "\n");
    });
}
