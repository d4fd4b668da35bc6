import katex from 'katex';
import { parse } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { symbolTex, texOptions } from '../../src/expr/symbol-tex.ts';

const tex = (source: string, declared: string[]) => parse(source).toTex(texOptions(new Set(declared)) as never).replace(/\s+/g, '');

describe('symbolTex', () => {
  it('writes physical constants by their CODATA symbols and Greek names as letters', () => {
    // Symbols as the CODATA recommended values list them (NIST CODATA 2018, "Fundamental Physical Constants").
    expect(['reducedPlanckConstant', 'electronMass', 'elementaryCharge', 'electricConstant'].map(symbolTex)).toEqual(['\\hbar', 'm_e', 'e', '\\varepsilon_0']);
    // Subscripted and Greek parameter names: common practice.
    expect(['alpha', 'Delta', 'x0', 'V0', 'epsr', 'omega2'].map(symbolTex)).toEqual(['\\alpha', '\\Delta', 'x_{0}', 'V_{0}', '\\varepsilon_{\\mathrm{r}}', '\\omega_{2}']);
    expect(symbolTex('width')).toBe('\\mathit{width}');
  });

  it('sets declared names italic even when they are unit names, and leaves undeclared units upright', () => {
    // s, b and F are also mathjs units (second, barn, farad); declared, they are parameters.
    expect(tex('exp(-b*x) + F*x + s', ['x', 'b', 'F', 's'])).toBe('\\exp\\left(-b\\cdotx\\right)+F\\cdotx+s');
    expect(tex('5 nm', ['x'])).toContain('\\mathrm{nm}');
    // KaTeX renders a declared s as a math italic letter, not upright text.
    expect(katex.renderToString(parse('s*x').toTex(texOptions(new Set(['s', 'x'])) as never))).toContain('mathnormal">s');
  });

  it('folds signs: no "+ (-1)/r", no fraction with a negative numerator, no "- (-3)"', () => {
    expect(tex('x + (-1)/r', ['x', 'r'])).toBe('x-\\frac{1}{r}');
    expect(tex('-1/r', ['r'])).toBe('-\\frac{1}{r}');
    expect(tex('x - (-3)', ['x'])).toBe('x+3');
    expect(tex('x + -2*x', ['x'])).toBe('x-2\\cdotx');
    expect(tex('x + (-(x + 1))', ['x'])).toBe('x-\\left(x+1\\right)');
  });
});
