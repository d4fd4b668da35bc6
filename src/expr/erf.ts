/**
 * The error function to ~1e-15: the everywhere-convergent positive series
 * erf(x) = 2/sqrt(pi) exp(-x^2) sum 2^n x^(2n+1) / (1*3*...*(2n+1)) (Abramowitz & Stegun 7.1.6)
 * for |x| < 3, and the continued fraction for erfc (A&S 7.1.14, evaluated by the modified Lentz
 * method, Press et al., Numerical Recipes, 3rd ed., 5.2) beyond, where the series would need many terms.
 */
export function erf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const ax = Math.abs(x);
  // erfc(6) ~ 2e-17 is below the spacing of doubles near 1.
  if (ax > 6) return Math.sign(x);
  const value = ax < 3 ? erfSeries(ax) : 1 - erfcContinuedFraction(ax);
  return x < 0 ? -value : value;
}

function erfSeries(x: number): number {
  const x2 = x * x;
  let term = x;
  let sum = x;
  for (let n = 1; n < 200; n++) {
    term *= (2 * x2) / (2 * n + 1);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return (2 / Math.sqrt(Math.PI)) * Math.exp(-x2) * sum;
}

/** erfc(x) = exp(-x^2)/sqrt(pi) * 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + ...)))) for x > 0. */
function erfcContinuedFraction(x: number): number {
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let n = 1; n < 300; n++) {
    const a = n / 2;
    d = x + a * d;
    d = d === 0 ? tiny : 1 / d;
    c = x + a / c;
    if (c === 0) c = tiny;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / Math.sqrt(Math.PI) / f;
}
