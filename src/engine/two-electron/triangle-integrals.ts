// Closed-form integrals over the two-electron S-state domain: the triangle |r1 - r2| <= r12 <= r1 + r2.

/**
 * J(A, B, C) = integral over r1, r2 >= 0 and |r1 - r2| <= r12 <= r1 + r2 of r1^A r2^B r12^C exp(-alpha r1 - beta r2)
 * dr1 dr2 dr12, for integers A, B, C >= 0, in perimetric coordinates u = r1 + r2 - r12, v = r1 - r2 + r12,
 * w = -r1 + r2 + r12 (Pekeris, Phys. Rev. 112, 1649 (1958); Coolidge & James, Phys. Rev. 51, 855 (1937)), where the
 * triangle becomes the octant u, v, w >= 0, dr1 dr2 dr12 = du dv dw / 4 and the exponential factorises:
 * alpha r1 + beta r2 = (alpha + beta) u / 2 + alpha v / 2 + beta w / 2. With r1 = (u + v)/2, r2 = (u + w)/2,
 * r12 = (v + w)/2 and the binomial theorem, J is a finite sum of products of Gamma-function integrals
 * n! / x^(n+1), every term positive, so no cancellation spoils it. The six-dimensional integral over both
 * electrons of an S-state integrand f(r1, r2, r12) is 8 pi^2 J(A + 1, B + 1, C + 1).
 */
export class TriangleIntegrals {
  readonly alpha: number;
  readonly beta: number;
  /** g_x[n] = n! / (2^n x^(n+1)): the perimetric Gamma integral with the 1/2 of each coordinate map folded in. */
  private readonly gu: number[] = [];
  private readonly gv: number[] = [];
  private readonly gw: number[] = [];
  private readonly inner = new Map<number, number>();
  private readonly memo = new Map<number, number>();

  constructor(alpha: number, beta: number) {
    if (!(alpha > 0 && beta > 0)) throw new RangeError(`TriangleIntegrals: exponents must be positive, got ${alpha}, ${beta}`);
    this.alpha = alpha;
    this.beta = beta;
  }

  /** J(A, B, C); A, B, C non-negative integers (at most 255 each). */
  value(a: number, b: number, c: number): number {
    if (!(Number.isInteger(a) && Number.isInteger(b) && Number.isInteger(c) && a >= 0 && b >= 0 && c >= 0 && a < 256 && b < 256 && c < 256)) {
      throw new RangeError(`TriangleIntegrals: powers must be integers in [0, 255], got ${a}, ${b}, ${c}`);
    }
    const key = (a << 16) | (b << 8) | c;
    const known = this.memo.get(key);
    if (known !== undefined) return known;
    const gu = gammaTable(this.gu, (this.alpha + this.beta) / 2, a + b);
    let sum = 0;
    let binomA = 1;
    for (let i = 0; i <= a; i++) {
      let binomB = 1;
      for (let j = 0; j <= b; j++) {
        sum += binomA * binomB * gu[i + j] * this.vw(a - i, b - j, c);
        binomB = (binomB * (b - j)) / (j + 1);
      }
      binomA = (binomA * (a - i)) / (i + 1);
    }
    const result = sum / 4;
    this.memo.set(key, result);
    return result;
  }

  /** The v and w factors: sum over k of C(c, k) g_v[m + k] g_w[n + c - k], from (v + w)^c. */
  private vw(m: number, n: number, c: number): number {
    const key = (m << 16) | (n << 8) | c;
    const known = this.inner.get(key);
    if (known !== undefined) return known;
    const gv = gammaTable(this.gv, this.alpha / 2, m + c);
    const gw = gammaTable(this.gw, this.beta / 2, n + c);
    let sum = 0;
    let binom = 1;
    for (let k = 0; k <= c; k++) {
      sum += binom * gv[m + k] * gw[n + c - k];
      binom = (binom * (c - k)) / (k + 1);
    }
    this.inner.set(key, sum);
    return sum;
  }
}

/** Extends table with g[n] = n! / (2^n x^(n+1)) up to index top, by g[n] = g[n - 1] n / (2 x). */
function gammaTable(table: number[], x: number, top: number): number[] {
  if (table.length === 0) table.push(1 / x);
  for (let n = table.length; n <= top; n++) table.push((table[n - 1] * n) / (2 * x));
  return table;
}
