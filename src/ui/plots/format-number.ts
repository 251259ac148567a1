/**
 * One way to print numbers on screen: fixed decimals, a true minus sign (U+2212, as the axes print it),
 * and never a negative zero — a value that rounds to zero prints as "0" / "0.0", whatever its sign
 * ("−0.0" and "−0, −58, 15" read as if a sign carried meaning).
 */

const MINUS = '\u2212';

/** `v` with `digits` decimals; "n/a" when not finite; no negative zero. */
export function formatNumber(v: number | null | undefined, digits = 0, minus = MINUS): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return 'n/a';
  const s = v.toFixed(digits);
  if (Number(s) === 0) return s.replace('-', '');
  return s.startsWith('-') ? minus + s.slice(1) : s;
}

/** Removes the sign from a formatted zero ("−0", "-0.00", "−0e+0" → unsigned); other text unchanged. */
export function unsignedZero(text: string): string {
  return /^[-\u2212]0(\.0*)?(e[+-]?\d+)?$/i.test(text.trim()) ? text.trim().slice(1) : text;
}

/** Wraps a number formatter (e.g. d3's) so that it never prints a negative zero. */
export function withoutNegativeZero(fmt: (v: number) => string): (v: number) => string {
  return (v) => unsignedZero(fmt(v));
}

/** A share (0…1) as a percentage with a non-breaking space before "%", never negative (clamped at 0). */
export function formatShare(x: number | null | undefined, digits = 0): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return 'n/a';
  return `${formatNumber(Math.max(0, 100 * x), digits)}\u00a0%`;
}
