/**
 * Certainty factors (Shortliffe and Buchanan, MYCIN, 1975): each evidence rule carries a weight
 * in [−1, 1]; weights for one cause combine so that agreeing evidence approaches ±1 without
 * passing it and conflicting evidence cancels. 0 means no evidence either way.
 */
export function combine(a: number, b: number): number {
  if (a >= 0 && b >= 0) return a + b * (1 - a);
  if (a <= 0 && b <= 0) return a + b * (1 + a);
  const denominator = 1 - Math.min(Math.abs(a), Math.abs(b));
  return denominator === 0 ? 0 : (a + b) / denominator;
}

export function combineAll(weights: number[]): number {
  return weights.reduce(combine, 0);
}
