/** Text made safe for HTML element content and attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

// The one number formatter of pages, check lists and plots: a true minus sign (U+2212), powers of ten written
// ×10ⁿ with superscript digits (plain text, so the same string serves HTML, SVG text and aria-labels), and a
// TeX spelling of the same parts for numbers that stand inside typeset math.

export const MINUS = '\u2212';
const SUPERSCRIPT: Record<string, string> = { '-': '\u207b', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** A number split into sign, mantissa and power of ten, as the formatter writes it. */
interface NumberParts {
  negative: boolean;
  mantissa: string;
  exponent: number | null;
}

function parts(value: number, digits: number): NumberParts {
  const rounded = Number(value.toPrecision(digits));
  const size = Math.abs(rounded);
  if (size !== 0 && (size < 1e-4 || size >= 1e6)) {
    const [mantissa, exponent] = size.toExponential(digits - 1).split('e');
    return { negative: rounded < 0, mantissa: mantissa.replace(/\.?0+$/, ''), exponent: Number(exponent) };
  }
  return { negative: rounded < 0, mantissa: String(size), exponent: null };
}

const superscript = (n: number) => [...String(n)].map((c) => SUPERSCRIPT[c]).join('');

function write({ negative, mantissa, exponent }: NumberParts): string {
  const power = exponent === null ? '' : mantissa === '1' ? `10${superscript(exponent)}` : `×10${superscript(exponent)}`;
  return `${negative ? MINUS : ''}${exponent !== null && mantissa === '1' ? '' : mantissa}${power}`;
}

/** A number as a reviewer reads it: up to `digits` significant digits, a dash when absent. */
export function formatNumber(value: number | null | undefined, digits = 10): string {
  if (value === null || value === undefined) return '—';
  if (!Number.isFinite(value)) return Number.isNaN(value) ? 'NaN' : `${value < 0 ? MINUS : ''}∞`;
  return write(parts(value, digits));
}

/** The same number spelled for KaTeX: `-1.5\times 10^{-5}`. */
export function texNumber(value: number, digits = 10): string {
  if (!Number.isFinite(value)) return Number.isNaN(value) ? '\\mathrm{NaN}' : `${value < 0 ? '-' : ''}\\infty`;
  const { negative, mantissa, exponent } = parts(value, digits);
  const power = exponent === null ? '' : `${mantissa === '1' ? '' : '\\times '}10^{${exponent}}`;
  return `${negative ? '-' : ''}${exponent !== null && mantissa === '1' ? '' : mantissa}${power}`;
}

/**
 * A number to the resolution that matters: as many decimals as `resolution` needs (its leading digit), so a
 * value is never written finer than what it is compared with or known to. A value within the resolution of
 * zero is written as zero.
 */
export function formatAt(value: number | null | undefined, resolution: number): string {
  if (value === null || value === undefined) return '—';
  if (!Number.isFinite(value) || !(resolution > 0) || !Number.isFinite(resolution)) return formatNumber(value);
  const decimals = Math.ceil(-Math.log10(resolution) - 1e-9);
  if (Math.abs(value) < resolution / 2) return '0';
  if (decimals < 0 || Math.abs(value) >= 1e6 || Math.abs(value) < 1e-4 || decimals > 12) {
    // Too coarse or too fine for fixed decimals: significant digits down to the resolution instead.
    const significant = Math.max(1, Math.min(15, Math.floor(Math.log10(Math.abs(value))) - Math.floor(Math.log10(resolution)) + 1));
    return formatNumber(value, significant);
  }
  const text = Math.abs(value).toFixed(Math.max(0, decimals));
  return `${value < 0 ? MINUS : ''}${text}`;
}

/** A value known to lie just below 1 (an overlap, a ratio near unity) written as 1 − d, so the digits that differ show. */
export function formatNearOne(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return formatNumber(value);
  const d = 1 - value;
  // Within a few rounding errors of 1 is 1: the digits beyond are noise of the arithmetic.
  if (Math.abs(d) < 1e-12) return '1';
  if (Math.abs(d) >= 1e-3) return formatNumber(value, Math.max(digits, 6));
  return `1 ${d > 0 ? MINUS : '+'} ${formatNumber(Math.abs(d), digits)}`;
}

/**
 * A message written by the checks with ASCII signs, set as the formatter writes numbers: true minus signs,
 * ×10ⁿ for e-notation, ± and ≥ for +/- and >=.
 */
export function typesetMessage(text: string): string {
  return text
    .replace(/(\d(?:\.\d+)?)e([+-]?\d+)/g, (_, m: string, e: string) => `${m === '1' ? '' : `${m}×`}10${superscript(Number(e))}`)
    .replace(/\+\/-/g, '±')
    .replace(/>=/g, '≥')
    .replace(/<=/g, '≤')
    .replace(/ - /g, ` ${MINUS} `)
    .replace(/(^|[\s(=[,;:])-(?=[\d.∞]|10)/g, `$1${MINUS}`);
}

/** A unit as mathjs writes it (nm^-1, J s) set with superscript powers and a centred dot: nm⁻¹, J·s. */
export function typesetUnit(unit: string): string {
  return unit.replace(/\^\(?(-?\d+)\)?/g, (_, n: string) => superscript(Number(n))).replace(/ \* /g, '·').replace(/(\w) (?=\w)/g, '$1·');
}
