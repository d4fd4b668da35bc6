import { describe, expect, it } from 'vitest';
import { DEFAULTS, gaussKronrodRule, integrateVector, type VectorIntegrand } from '../../src/engine/quadrature.ts';

const scalar = (g: (x: number) => number): VectorIntegrand => (x, out) => { out[0] = g(x); };
const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);
const SQRT_PI = Math.sqrt(Math.PI);

// Sums the rule on [a, b] directly, to test the rule apart from the adaptive driver.
function ruleSum(weights: Float64Array, nodes: Float64Array, g: (x: number) => number, a: number, b: number): number {
  let sum = 0;
  for (let i = 0; i < nodes.length; i++) sum += weights[i] * g(0.5 * (a + b) + 0.5 * (b - a) * nodes[i]);
  return 0.5 * (b - a) * sum;
}

describe('Gauss–Kronrod rule built at load', () => {
  const rule = gaussKronrodRule(DEFAULTS.gaussPoints);

  it('has the 10-point Gauss–Legendre nodes and weights', () => {
    // Abramowitz & Stegun Table 25.4, n = 10 (from memory)
    const nodes = [0.148874338981631, 0.433395394129247, 0.679409568299024, 0.865063366688985, 0.973906528517172];
    const weights = [0.295524224714753, 0.269266719309996, 0.219086362515982, 0.149451349150581, 0.066671344308688];
    const positive = Array.from(rule.nodes.keys()).filter((i) => rule.nodes[i] > 0 && rule.gaussWeights[i] > 0);
    expect(positive.length).toBe(5);
    positive.forEach((index, k) => {
      expect(rule.nodes[index]).toBeCloseTo(nodes[k], 14);
      expect(rule.gaussWeights[index]).toBeCloseTo(weights[k], 14);
    });
  });

  it('matches the 21-point Kronrod nodes and weights', () => {
    // QUADPACK dqk21 tables, xgk and wgk (Piessens et al., QUADPACK, Springer 1983; from memory)
    const xgk = [0.995657163025808080735527280689003, 0.973906528517171720077964012084452,
      0.930157491355708226001207180059508, 0.865063366688984510732096688423493,
      0.780817726586416897063717578345042, 0.679409568299024406234327365114874,
      0.562757134668604683339000099272694, 0.433395394129247190799265943165784,
      0.294392862701460198131126603103866, 0.148874338981631210884826001129720, 0];
    const wgk = [0.011694638867371874278064396062192, 0.032558162307964727478818972459390,
      0.054755896574351996031381300244580, 0.075039674810919952767043140916190,
      0.093125454583697605535065465083366, 0.109387158802297641899210590325805,
      0.123491976262065851077208814708793, 0.134709217311473325928054001771707,
      0.142775938577060080797094273138717, 0.147739104901338491374841515972068,
      0.149445554002916905664936468389821];
    expect(rule.nodes.length).toBe(21);
    xgk.forEach((x, k) => {
      expect(Math.abs(rule.nodes[20 - k] - x)).toBeLessThan(1e-15);
      expect(Math.abs(rule.nodes[k] + x)).toBeLessThan(1e-15);
      expect(Math.abs(rule.kronrodWeights[20 - k] - wgk[k])).toBeLessThan(1e-15);
    });
  });

  it('builds the 7–15 pair too, matching its published table', () => {
    // QUADPACK dqk15 tables, xgk, wgk and wg (Piessens et al., QUADPACK, Springer 1983; from memory)
    const xgk = [0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
      0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
      0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
      0.207784955007898467600689403773245, 0];
    const wgk = [0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
      0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
      0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
      0.204432940075298892414161999234649, 0.209482141084727828012999174891714];
    const wg = [0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
      0.381830050505118944950369775488975, 0.417959183673469387755102040816327];
    const rule15 = gaussKronrodRule(7);
    expect(rule15.nodes.length).toBe(15);
    xgk.forEach((x, k) => {
      expect(Math.abs(rule15.nodes[14 - k] - x)).toBeLessThan(1e-15);
      expect(Math.abs(rule15.kronrodWeights[14 - k] - wgk[k])).toBeLessThan(1e-15);
    });
    wg.forEach((w, k) => expect(Math.abs(rule15.gaussWeights[14 - (2 * k + 1)] - w)).toBeLessThan(1e-15));
  });

  it('is exact to degree 3n+1 = 31 (Kronrod) and 2n-1 = 19 (Gauss), and no further', () => {
    // Kronrod extension degree 3n+1 for even n, Gauss degree 2n-1 (Kronrod 1965; Davis & Rabinowitz 1984, common practice)
    // Exact values: the integral of x^d over [0, 1] is 1/(d+1) (power rule)
    for (let d = 0; d <= 31; d++) {
      expect(relativeError(ruleSum(rule.kronrodWeights, rule.nodes, (x) => x ** d, 0, 1), 1 / (d + 1))).toBeLessThan(4e-15);
    }
    for (let d = 0; d <= 19; d++) {
      expect(relativeError(ruleSum(rule.gaussWeights, rule.nodes, (x) => x ** d, 0, 1), 1 / (d + 1))).toBeLessThan(4e-15);
    }
    // Over [-1, 1], x^d integrates to 2/(d+1) for even d (power rule); the next even degree must fail
    expect(relativeError(ruleSum(rule.kronrodWeights, rule.nodes, (x) => x ** 32, -1, 1), 2 / 33)).toBeGreaterThan(1e-11);
    expect(relativeError(ruleSum(rule.gaussWeights, rule.nodes, (x) => x ** 20, -1, 1), 2 / 21)).toBeGreaterThan(1e-6);
  });
});

describe('integrateVector', () => {
  it('integrates a degree-19 polynomial exactly with one panel of 21 evaluations', () => {
    // Both rules are exact at degree 19 (see above), so |K - G| is rounding and the first panel converges.
    // Exact value by the power rule: sum_k (k+1) x^k over [-1, 2] is sum_k (2^(k+1) - (-1)^(k+1)).
    let calls = 0;
    const poly = (x: number) => {
      calls++;
      let sum = 0;
      for (let k = 19; k >= 0; k--) sum = sum * x + (k + 1);
      return sum;
    };
    let exact = 0;
    for (let k = 0; k <= 19; k++) exact += 2 ** (k + 1) - (-1) ** (k + 1);
    const result = integrateVector(scalar(poly), 1, { breakpoints: [-1, 2] });
    expect(result.status).toBe('converged');
    expect(result.evaluations).toBe(21);
    expect(calls).toBe(21);
    expect(result.intervals).toBe(1);
    expect(relativeError(result.values[0], exact)).toBeLessThan(1e-14);
  });

  it('integrates exp(-x^2) over the whole line to sqrt(pi)', () => {
    // DLMF 5.9.1 with mu = 2, nu = 1 gives Gamma(1/2)/2 per half-line; DLMF 5.4.6 Gamma(1/2) = sqrt(pi) (from memory)
    const result = integrateVector(scalar((x) => Math.exp(-x * x)), 1, { breakpoints: [-Infinity, Infinity] });
    expect(result.converged).toBe(true);
    expect(relativeError(result.values[0], SQRT_PI)).toBeLessThan(1e-14);
    expect(result.errorEstimates[0]).toBeLessThanOrEqual(DEFAULTS.relTol * result.absValues[0]);
    expect(result.evaluations).toBeLessThan(400);
  });

  it('integrates x^n e^-x over [0, inf) to n!', () => {
    // DLMF 5.2.1 (Euler's integral) with DLMF 5.4.1 Gamma(n+1) = n!
    let factorial = 1;
    for (let n = 0; n <= 10; n++) {
      if (n > 0) factorial *= n;
      const result = integrateVector(scalar((x) => x ** n * Math.exp(-x)), 1, { breakpoints: [0, Infinity] });
      expect(result.converged).toBe(true);
      const actual = Math.abs(result.values[0] - factorial);
      expect(actual / factorial).toBeLessThan(1e-13);
      // The error estimate must not understate the true error (beyond rounding in the sum).
      expect(actual).toBeLessThanOrEqual(result.errorEstimates[0] + 4 * Number.EPSILON * factorial);
      expect(result.evaluations).toBeLessThan(400);
    }
  });

  it('handles the endpoint singularity of ln x on (0, 1] without evaluating at 0', () => {
    // Antiderivative x ln x - x gives -1 (power rule and product rule; checked by differentiation)
    let smallest = Infinity;
    const result = integrateVector(scalar((x) => { smallest = Math.min(smallest, x); return Math.log(x); }), 1, { breakpoints: [0, 1] });
    expect(result.converged).toBe(true);
    expect(smallest).toBeGreaterThan(0);
    expect(Math.abs(result.values[0] + 1)).toBeLessThan(1e-12);
    expect(Math.abs(result.values[0] + 1)).toBeLessThanOrEqual(result.errorEstimates[0]);
    expect(result.evaluations).toBeLessThan(3000);
  });

  it('integrates a kink exactly when split at a breakpoint, and more cheaply than without', () => {
    // |x-1| e^{-(x-1)^2} over the line: DLMF 5.9.1 with mu = 2, nu = 2 gives Gamma(1)/2 = 1/2 per side
    const kink = scalar((x) => Math.abs(x - 1) * Math.exp(-((x - 1) ** 2)));
    const split = integrateVector(kink, 1, { breakpoints: [-Infinity, 1, Infinity] });
    const unsplit = integrateVector(kink, 1, { breakpoints: [-Infinity, Infinity] });
    expect(split.converged).toBe(true);
    expect(Math.abs(split.values[0] - 1)).toBeLessThan(1e-14);
    expect(unsplit.converged).toBe(true);
    expect(Math.abs(unsplit.values[0] - 1)).toBeLessThan(1e-12);
    expect(split.evaluations).toBeLessThan(unsplit.evaluations);
  });

  it('integrates a step exactly at a breakpoint; without it, converges honestly at much higher cost', () => {
    // Step H(x - 1/3) over [0, 1]: area 2/3 (elementary)
    const step = scalar((x) => (x < 1 / 3 ? 0 : 1));
    const withBreak = integrateVector(step, 1, { breakpoints: [0, 1 / 3, 1] });
    expect(withBreak.converged).toBe(true);
    expect(withBreak.evaluations).toBe(42);
    expect(withBreak.intervals).toBe(2);
    expect(relativeError(withBreak.values[0], 2 / 3)).toBeLessThan(1e-15);
    // Even where K = G exactly, no panel claims more than 50 machine epsilons (QUADPACK's rounding floor).
    expect(withBreak.errorEstimates[0]).toBeGreaterThanOrEqual(50 * Number.EPSILON * withBreak.absValues[0] * (1 - 1e-12));

    const without = integrateVector(step, 1, { breakpoints: [0, 1] });
    expect(without.converged).toBe(true);
    expect(Math.abs(without.values[0] - 2 / 3)).toBeLessThanOrEqual(without.errorEstimates[0]);
    expect(without.evaluations).toBeGreaterThan(10 * withBreak.evaluations);
  });

  it('reports interval-limit when maxIntervals is reached', () => {
    const result = integrateVector(scalar((x) => (x < 1 / 3 ? 0 : 1)), 1, { breakpoints: [0, 1], maxIntervals: 3 });
    expect(result.converged).toBe(false);
    expect(result.status).toBe('interval-limit');
    expect(result.intervals).toBe(3);
    expect(result.message).toMatch(/after 3 intervals/);
  });

  it('integrates three components on the same points in one pass', () => {
    // x^{2m} e^{-x^2} over the line = Gamma(m + 1/2): DLMF 5.9.1 (mu = 2, nu = 2m+1) and 5.5.1 from Gamma(1/2) = sqrt(pi)
    const exact = [SQRT_PI, SQRT_PI / 2, (3 * SQRT_PI) / 4];
    let calls = 0;
    const result = integrateVector((x, out) => {
      calls++;
      const g = Math.exp(-x * x);
      out[0] = g;
      out[1] = x * x * g;
      out[2] = x ** 4 * g;
    }, 3, { breakpoints: [-Infinity, Infinity] });
    expect(result.converged).toBe(true);
    expect(result.evaluations).toBe(calls);
    exact.forEach((value, k) => {
      expect(relativeError(result.values[k], value)).toBeLessThan(1e-13);
      expect(result.errorEstimates[k]).toBeLessThanOrEqual(DEFAULTS.relTol * result.absValues[k]);
    });
    // One pass costs no more than the hardest component alone would, plus the panels the others add.
    const hardest = integrateVector(scalar((x) => x ** 4 * Math.exp(-x * x)), 1, { breakpoints: [-Infinity, Infinity] });
    expect(result.evaluations).toBeLessThan(2 * hardest.evaluations);
  });

  it('measures the tolerance against the integral of |f|, so cancelling integrands converge', () => {
    // sin over one period: integral 0, integral of |sin| = 4 (elementary)
    const result = integrateVector(scalar(Math.sin), 1, { breakpoints: [0, 2 * Math.PI] });
    expect(result.converged).toBe(true);
    expect(Math.abs(result.values[0])).toBeLessThan(1e-14);
    expect(relativeError(result.absValues[0], 4)).toBeLessThan(1e-2);
  });

  it('reports 1/x on (0, 1] as not converged instead of hanging or throwing', () => {
    // The integral of 1/x diverges logarithmically at 0 (elementary)
    const result = integrateVector(scalar((x) => 1 / x), 1, { breakpoints: [0, 1] });
    expect(result.converged).toBe(false);
    expect(result.status).toBe('interval-limit');
    expect(result.intervals).toBe(DEFAULTS.maxIntervals);
    expect(result.message).toMatch(/may diverge/);
  });

  it('reports 1/x on [1, inf) as not converged', () => {
    // Diverges logarithmically at infinity (elementary)
    const result = integrateVector(scalar((x) => 1 / x), 1, { breakpoints: [1, Infinity] });
    expect(result.converged).toBe(false);
    expect(['roundoff', 'interval-limit']).toContain(result.status);
    expect(result.message).not.toBeNull();
  });

  it('reports exp(+x^2) on [0, inf) as non-finite once it overflows', () => {
    const result = integrateVector(scalar((x) => Math.exp(x * x)), 1, { breakpoints: [0, Infinity] });
    expect(result.converged).toBe(false);
    expect(result.status).toBe('non-finite');
    expect(result.message).toMatch(/returned Infinity at x = /);
  });

  it('reports a NaN-producing integrand as non-finite with the offending x', () => {
    let calls = 0;
    const result = integrateVector(scalar((x) => { calls++; return Math.sqrt(x); }), 1, { breakpoints: [-1, 1] });
    expect(result.status).toBe('non-finite');
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/returned NaN at x = -0\.99/);
    expect(Number.isNaN(result.values[0])).toBe(true);
    expect(result.evaluations).toBe(calls);
  });

  it('rejects malformed breakpoints', () => {
    const f = scalar((x) => x);
    expect(() => integrateVector(f, 1, { breakpoints: [1] })).toThrow(RangeError);
    expect(() => integrateVector(f, 1, { breakpoints: [1, 0] })).toThrow(RangeError);
    expect(() => integrateVector(f, 1, { breakpoints: [0, Infinity, 1] })).toThrow(RangeError);
    expect(() => integrateVector(f, 1, { breakpoints: [-Infinity, -Infinity, 0] })).toThrow(RangeError);
    expect(() => integrateVector(f, 1, { breakpoints: [0, 1], relTol: 0, absTol: 0 })).toThrow(RangeError);
  });

  describe('started from the partition of an earlier run', () => {
    // exp(-a x^2) over the line is sqrt(pi/a): twice DLMF 7.4.1 (from memory)
    const gaussian = (a: number): VectorIntegrand => (x, out) => { out[0] = Math.exp(-a * x * x); };
    const line = { breakpoints: [-Infinity, 0, Infinity], scale: 2 };

    it('reports the panels it ended with, covering every segment once', () => {
      const result = integrateVector(gaussian(1), 1, line);
      const { segments, panels } = result.partition;
      expect(segments).toBe(2);
      expect(panels.length / 3).toBe(result.intervals);
      for (let segment = 0; segment < segments; segment++) {
        const pieces: Array<[number, number]> = [];
        for (let p = 0; p < panels.length; p += 3) if (panels[p] === segment) pieces.push([panels[p + 1], panels[p + 2]]);
        pieces.sort((u, v) => u[0] - v[0]);
        expect(pieces[0][0]).toBe(0);
        expect(pieces[pieces.length - 1][1]).toBe(1);
        pieces.slice(1).forEach((piece, i) => expect(piece[0]).toBe(pieces[i][1]));
      }
    });

    it('meets the same tolerance at a nearby integrand as a fresh run, evaluating only the leaves', () => {
      const start = integrateVector(gaussian(1), 1, line).partition;
      for (const a of [0.8, 1.1, 1.5]) {
        const fresh = integrateVector(gaussian(a), 1, line);
        const warm = integrateVector(gaussian(a), 1, { ...line, start });
        expect(warm.converged).toBe(true);
        expect(relativeError(warm.values[0], Math.sqrt(Math.PI / a))).toBeLessThan(1e-14);
        expect(warm.errorEstimates[0]).toBeLessThanOrEqual(DEFAULTS.relTol * warm.absValues[0]);
        expect(Math.abs(warm.values[0] - fresh.values[0])).toBeLessThanOrEqual(warm.errorEstimates[0] + fresh.errorEstimates[0]);
        expect(warm.evaluations).toBeLessThan(fresh.evaluations);
      }
    });

    it('bisects further where the earlier panels no longer suffice', () => {
      // Panels fitted to a Gaussian a hundred times wider, then one a hundred times narrower.
      const start = integrateVector(gaussian(1e-4), 1, line).partition;
      const result = integrateVector(gaussian(1), 1, { ...line, start });
      expect(result.converged).toBe(true);
      expect(relativeError(result.values[0], SQRT_PI)).toBeLessThan(1e-14);
      expect(result.intervals).toBeGreaterThan(start.panels.length / 3);
    });

    it('ignores a partition made for a different number of segments', () => {
      const start = integrateVector(gaussian(1), 1, { breakpoints: [-Infinity, -1, 1, Infinity], scale: 2 }).partition;
      const fresh = integrateVector(gaussian(1.2), 1, line);
      const given = integrateVector(gaussian(1.2), 1, { ...line, start });
      expect(given.evaluations).toBe(fresh.evaluations);
      expect(given.values[0]).toBe(fresh.values[0]);
    });
  });
});
