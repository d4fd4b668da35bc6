import katex from 'katex';
import { describe, expect, it } from 'vitest';
import { formatAt, formatNearOne, formatNumber, texNumber, typesetMessage, typesetUnit } from '../../src/render/html.ts';

// Writing numbers: the minus sign U+2212 and a power of ten as "×10ⁿ" are the typesetting rules of
// ISO 80000-1 (quantities and units, general; from memory) and of the SI brochure, 9th edition, section 5.4.
describe('the number formatter', () => {
  it('writes a true minus sign and ×10ⁿ exponents', () => {
    expect(formatNumber(-0.5)).toBe('\u22120.5');
    expect(formatNumber(1.5e-7)).toBe('1.5×10⁻⁷');
    expect(formatNumber(-2.25e9)).toBe('\u22122.25×10⁹');
    expect(formatNumber(1e-12)).toBe('10⁻¹²');
    expect(formatNumber(null)).toBe('—');
  });

  it('spells the same number for KaTeX, which typesets it', () => {
    expect(texNumber(-1.5e-7)).toBe('-1.5\\times 10^{-7}');
    expect(katex.renderToString(texNumber(-1.5e-7), { throwOnError: true })).toContain('10');
  });

  it('writes a value at the resolution that matters and noise as zero', () => {
    // 4.934802200544679 = pi^2/2, the box ground level (any quantum mechanics textbook); at 10^-4 it is 4.9348.
    expect(formatAt(Math.PI ** 2 / 2, 1e-4)).toBe('4.9348');
    expect(formatAt(-0.49999, 1e-3)).toBe('\u22120.500');
    expect(formatAt(3e-9, 1e-6)).toBe('0');
    expect(formatAt(2.634e-9, 1e-11)).toBe('2.63×10⁻⁹');
  });

  it('writes values just below 1 as 1 − d, and rounding noise about 1 as 1', () => {
    expect(formatNearOne(0.99999998)).toBe('1 \u2212 2×10⁻⁸');
    expect(formatNearOne(1 + 1e-14)).toBe('1');
    expect(formatNearOne(0.5)).toBe('0.5');
  });

  it('sets unit powers as superscripts and products with a centred dot (SI brochure, section 5.4.3)', () => {
    expect(typesetUnit('nm^-1')).toBe('nm⁻¹');
    expect(typesetUnit('J s')).toBe('J·s');
    expect(typesetUnit('F / m')).toBe('F / m');
  });

  it('sets the ASCII signs of check messages', () => {
    expect(typesetMessage('E - E0(grid) = -1.983e-12 (must be >= -2.7e-7); claimed 0.6 +/- 0.01')).toBe('E \u2212 E0(grid) = \u22121.983×10⁻¹² (must be ≥ \u22122.7×10⁻⁷); claimed 0.6 ± 0.01');
    // Hyphens in words stay hyphens.
    expect(typesetMessage('the half-line x >= 0')).toBe('the half-line x ≥ 0');
  });
});
