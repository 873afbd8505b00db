/**
 * Closed-form conduction solutions used as outside references by the tests.
 * Sources are named at each function; nothing here calls project code.
 */

/**
 * erf(x) by its Maclaurin series for |x| < 3 and the asymptotic continued fraction beyond
 * (Abramowitz & Stegun, Handbook of Mathematical Functions (1964), 7.1.5 and 7.1.14); relative
 * accuracy better than 1e-13 on the range used.
 */
export function erf(x: number): number {
  const ax = Math.abs(x);
  if (ax < 3) {
    // erf x = 2/√π Σ (−1)^n x^(2n+1) / (n! (2n+1))
    let term = ax;
    let sum = ax;
    for (let n = 1; n < 200; n++) {
      term *= (-ax * ax) / n;
      const add = term / (2 * n + 1);
      sum += add;
      if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
    }
    return Math.sign(x) * (2 / Math.sqrt(Math.PI)) * sum;
  }
  return Math.sign(x) * (1 - erfcLarge(ax));
}

/** erfc(x) for x ≥ 3 by the continued fraction (A&S 7.1.14), evaluated bottom-up. */
function erfcLarge(x: number): number {
  return Math.exp(-x * x) * erfcScaledLarge(x);
}

/** exp(x²)·erfc(x) for x ≥ 3 by the same continued fraction; finite where exp(x²) overflows. */
function erfcScaledLarge(x: number): number {
  let f = 0;
  for (let n = 60; n >= 1; n--) f = (n / 2) / (x + f);
  return 1 / Math.sqrt(Math.PI) / (x + f);
}

export function erfc(x: number): number {
  return x >= 3 ? erfcLarge(x) : 1 - erf(x);
}

/**
 * Eigenvalues ζ_n of ζ tan ζ = Bi, n = 1 … count, each bracketed in ((n−1)π, (n−1)π + π/2) and
 * found by bisection on ζ sin ζ − Bi cos ζ (Carslaw & Jaeger 1959 §3.11; Incropera eq. 5.39).
 */
export function slabEigenvalues(Bi: number, count: number): number[] {
  const out: number[] = [];
  for (let n = 1; n <= count; n++) {
    let lo = (n - 1) * Math.PI + 1e-14;
    let hi = (n - 1) * Math.PI + Math.PI / 2 - 1e-14;
    const g = (z: number) => z * Math.sin(z) - Bi * Math.cos(z);
    for (let it = 0; it < 200; it++) {
      const mid = 0.5 * (lo + hi);
      if (g(lo) * g(mid) <= 0) hi = mid;
      else lo = mid;
    }
    out.push(0.5 * (lo + hi));
  }
  return out;
}

/**
 * Dimensionless temperature θ* = (T − T∞)/(T_i − T∞) of an infinite slab of half-thickness L,
 * both faces convecting to T∞ with h, at x* = x/L from the mid-plane and Fo = αt/L²
 * (Carslaw & Jaeger 1959 §3.11; Incropera & DeWitt eq. 5.39a):
 *   θ* = Σ C_n exp(−ζ_n² Fo) cos(ζ_n x*),  C_n = 4 sin ζ_n / (2ζ_n + sin 2ζ_n).
 */
export function slabTheta(Bi: number, Fo: number, xStar: number, terms = 200): number {
  const zetas = slabEigenvalues(Bi, terms);
  let s = 0;
  for (const z of zetas) {
    const Cn = (4 * Math.sin(z)) / (2 * z + Math.sin(2 * z));
    s += Cn * Math.exp(-z * z * Fo) * Math.cos(z * xStar);
  }
  return s;
}

/**
 * Semi-infinite solid, initially T_i, surface convecting to T∞ with h from t = 0
 * (Incropera & DeWitt eq. 5.60):
 *   (T − T_i)/(T∞ − T_i) = erfc(η) − exp(hx/k + h²αt/k²) erfc(η + h√(αt)/k),  η = x/(2√(αt)).
 */
export function semiInfiniteConvection(x: number, t: number, h: number, k: number, alpha: number): number {
  const eta = x / (2 * Math.sqrt(alpha * t));
  const b = (h * Math.sqrt(alpha * t)) / k;
  // exp(A) and erfc(B) can overflow/underflow separately; for B ≥ 3 use exp(A − B²)·[exp(B²)erfc(B)]
  // (A − B² = −η² exactly, so nothing overflows however large h is).
  const A = (h * x) / k + (h * h * alpha * t) / (k * k);
  const B = eta + b;
  const second = B < 3 ? Math.exp(A) * erfc(B) : Math.exp(A - B * B) * erfcScaledLarge(B);
  return erfc(eta) - second;
}
