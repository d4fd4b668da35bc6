/** Text made safe for HTML element content and attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** A number as a reviewer reads it: up to ten significant digits, a dash when absent. */
export function formatNumber(value: number | null | undefined, digits = 10): string {
  if (value === null || value === undefined) return '—';
  if (!Number.isFinite(value)) return String(value);
  const rounded = Number(value.toPrecision(digits));
  return Math.abs(rounded) !== 0 && (Math.abs(rounded) < 1e-4 || Math.abs(rounded) >= 1e6) ? rounded.toExponential(digits - 1).replace(/\.?0+e/, 'e') : String(rounded);
}
