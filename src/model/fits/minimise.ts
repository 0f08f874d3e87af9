/**
 * A one-parameter minimum over a range: a grid finds the basin of the lowest value (a misfit may
 * have more than one), then Brent's method closes in on it — parabolic steps through the three
 * best points where they help, golden-section steps where they do not. It reaches the precision a
 * minimum allows (about √ε relative: f is flat there to first order) in about twenty evaluations,
 * where golden section alone takes about fifty.
 *
 * Source: R. P. Brent, Algorithms for Minimization without Derivatives (1973), ch. 5, procedure
 * localmin; written after the bounded form in SciPy (optimize.fminbound).
 */

/** Grid steps across the range. */
const GRID = 64;
/** Golden-section share, (3 − √5) / 2. */
const GOLDEN = 0.5 * (3 - Math.sqrt(5));
const SQRT_EPSILON = Math.sqrt(Number.EPSILON);

export function minimise(f: (x: number) => number, lo: number, hi: number): number {
  let bestK = 0;
  let bestF = Number.POSITIVE_INFINITY;
  for (let k = 0; k <= GRID; k++) {
    const fx = f(lo + ((hi - lo) * k) / GRID);
    if (fx < bestF) {
      bestF = fx;
      bestK = k;
    }
  }
  const a = lo + ((hi - lo) * Math.max(0, bestK - 1)) / GRID;
  const b = lo + ((hi - lo) * Math.min(GRID, bestK + 1)) / GRID;
  return brent(f, a, b, 1e-10 * (Math.abs(a) + Math.abs(b)) + 1e-12);
}

/** Brent's localmin on [a, b] to within xtol (and √ε relative). */
export function brent(f: (x: number) => number, a: number, b: number, xtol: number): number {
  // x: the best point so far; w: the second best; v: the one before w.
  let x = a + GOLDEN * (b - a);
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let step = 0;
  let stepBefore = 0;
  for (let iteration = 0; iteration < 100; iteration++) {
    const middle = 0.5 * (a + b);
    const tol1 = SQRT_EPSILON * Math.abs(x) + xtol / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - middle) <= tol2 - 0.5 * (b - a)) break;
    let golden = true;
    if (Math.abs(stepBefore) > tol1) {
      // A parabola through x, w and v: its vertex, if it falls inside and the step shrinks fast enough.
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      q = Math.abs(q);
      r = stepBefore;
      stepBefore = step;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        step = p / q;
        const u = x + step;
        if (u - a < tol2 || b - u < tol2) step = middle >= x ? tol1 : -tol1;
        golden = false;
      }
    }
    if (golden) {
      stepBefore = x >= middle ? a - x : b - x;
      step = GOLDEN * stepBefore;
    }
    // Never a step smaller than the tolerance: f could not tell the two points apart.
    const u = x + (step >= 0 ? 1 : -1) * Math.max(Math.abs(step), tol1);
    const fu = f(u);
    if (fu <= fx) {
      if (u >= x) a = x;
      else b = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return x;
}
