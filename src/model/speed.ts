/**
 * Strip speed along the run-out table over time, and the distance the strip has travelled.
 *
 * t = 0 is when the head of the strip leaves the last finishing stand (enters the table at x = 0).
 * The whole strip moves together at the line speed v(t):
 *   threading:     v = v_thread until the head reaches the coiler (travelled = line length);
 *   acceleration:  then v rises at a_acc up to v_max;
 *   top speed:     v_max;
 *   tail:          v falls at a_dec so that it reaches v_tail just as the tail leaves the last
 *                  stand (travelled = coil length).
 * A constant speed is the special case v_thread = v_max with no acceleration.
 *
 * The travelled distance S(t) is piecewise quadratic and strictly increasing, so the time at which
 * a strip point at coil distance s (from the head) is at table position x is S⁻¹(s + x), found by
 * bisection to 1e-12 s.
 */
export interface SpeedSchedule {
  /** Threading speed [m/s] */
  readonly threading_m_s: number;
  /** Acceleration once the head is in the coiler [m/s²] (0 = constant speed) */
  readonly acceleration_m_s2: number;
  /** Top speed [m/s] */
  readonly max_m_s: number;
  /** Tail deceleration [m/s²] (0 = none) */
  readonly deceleration_m_s2: number;
  /** Speed when the tail leaves the last stand [m/s] */
  readonly tail_m_s: number;
}

export function constantSpeed(v_m_s: number): SpeedSchedule {
  return { threading_m_s: v_m_s, acceleration_m_s2: 0, max_m_s: v_m_s, deceleration_m_s2: 0, tail_m_s: v_m_s };
}

interface Piece {
  t0: number;
  s0: number;
  v0: number;
  a: number;
}

/** The schedule resolved for one coil: speed and travelled distance as functions of time. */
export class SpeedProfile {
  private readonly pieces: Piece[] = [];
  /** Non-fatal notes (e.g. the tail deceleration had to start during acceleration). */
  readonly notes: string[] = [];

  constructor(readonly schedule: SpeedSchedule, readonly lineLength_m: number, readonly coilLength_m: number) {
    const { threading_m_s: v0, acceleration_m_s2: acc, max_m_s: vmax, deceleration_m_s2: dec, tail_m_s: vtail } = schedule;
    const p = this.pieces;
    p.push({ t0: 0, s0: 0, v0, a: 0 });
    let t = lineLength_m / v0;
    let s = lineLength_m;
    let v = v0;
    if (acc > 0 && vmax > v0) {
      p.push({ t0: t, s0: s, v0: v, a: acc });
      const dt = (vmax - v0) / acc;
      s += v0 * dt + 0.5 * acc * dt * dt;
      t += dt;
      v = vmax;
      p.push({ t0: t, s0: s, v0: v, a: 0 });
    }
    if (dec > 0 && vtail < v && coilLength_m > 0) {
      const decelDistance = (v * v - vtail * vtail) / (2 * dec);
      const sStart = coilLength_m - decelDistance;
      if (sStart > s) {
        t += (sStart - s) / v;
        s = sStart;
        p.push({ t0: t, s0: s, v0: v, a: -dec });
        const dt = (v - vtail) / dec;
        s += v * dt - 0.5 * dec * dt * dt;
        t += dt;
        p.push({ t0: t, s0: s, v0: vtail, a: 0 });
      } else {
        this.notes.push("the coil is too short for the tail deceleration to start after the acceleration; the tail runs at the speed reached");
      }
    }
  }

  private pieceAt(t: number): Piece {
    const p = this.pieces;
    let k = p.length - 1;
    while (k > 0 && p[k].t0 > t) k--;
    return p[k];
  }

  /** Line speed at time t [m/s]. */
  speed(t: number): number {
    const q = this.pieceAt(t);
    return q.v0 + q.a * (t - q.t0);
  }

  /** Distance travelled by the strip since the head left the last stand [m]. */
  travelled(t: number): number {
    const q = this.pieceAt(t);
    const dt = t - q.t0;
    return q.s0 + q.v0 * dt + 0.5 * q.a * dt * dt;
  }

  /** Time at which the travelled distance equals S [s] (S ≥ 0). */
  timeAt(S: number): number {
    let lo = 0;
    let hi = 1;
    while (this.travelled(hi) < S) hi *= 2;
    for (let i = 0; i < 200 && hi - lo > 1e-12; i++) {
      const mid = 0.5 * (lo + hi);
      if (this.travelled(mid) < S) lo = mid;
      else hi = mid;
    }
    return 0.5 * (lo + hi);
  }
}
