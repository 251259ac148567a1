/**
 * Units in the types of public core signatures (issue 13): a sample rate is `Hz`, an onset or a window
 * edge is `Seconds`, an amplitude is `Microvolts`, a head radius is `Millimetres`. A brand costs nothing at
 * run time; it stops a duration from being passed where a frequency is expected, and a bare number from
 * being passed where a unit is. Branded values read as plain numbers (`fs / 2` is a `number`), so arithmetic
 * results need the constructor again when they cross a module boundary.
 *
 * The constructors check finiteness (NaN and ±Infinity are refused with a RangeError naming the unit):
 * they are for values a caller states or a parser has already validated, not for parsing user input.
 */
declare const unit: unique symbol;
type Unit<U extends string> = number & { readonly [unit]: U };

/** Frequency in hertz (cycles per second): sample rates, cut-offs, mains, band edges. */
export type Hz = Unit<'Hz'>;
/** Duration, or time since the first stored sample, in seconds. */
export type Seconds = Unit<'Seconds'>;
/** Electric potential in microvolts. */
export type Microvolts = Unit<'Microvolts'>;
/** Length in millimetres (head coordinates). */
export type Millimetres = Unit<'Millimetres'>;

function finite<U extends string>(v: number, name: U): Unit<U> {
  if (!Number.isFinite(v)) throw new RangeError(`${name}: expected a finite number, got ${v}`);
  return v as Unit<U>;
}

/** `hz(250)`: a finite frequency in Hz. */
export const hz = (v: number): Hz => finite(v, 'Hz');
/** `seconds(0.2)`: a finite time or duration in seconds. */
export const seconds = (v: number): Seconds => finite(v, 'Seconds');
/** `microvolts(100)`: a finite potential in µV. */
export const microvolts = (v: number): Microvolts => finite(v, 'Microvolts');
/** `millimetres(90)`: a finite length in mm. */
export const millimetres = (v: number): Millimetres => finite(v, 'Millimetres');

/**
 * Transitional: `Lenient<Hz>` accepts a bare number or an `Hz`, and refuses any other unit (a `Seconds`
 * passed as a sample rate is a type error). Only on public signatures whose callers in files still being
 * edited by their owners pass bare numbers; it becomes the strict brand once those callers pass units.
 */
export type Lenient<T extends Hz | Seconds | Microvolts | Millimetres> = number & { readonly [unit]?: T[typeof unit] };

/** A [start, end] window in seconds, e.g. an epoch window [−0.2, 0.8] s around each event. */
export type SecondsWindow = readonly [Seconds, Seconds];
/** `secondsWindow(-0.2, 0.8)`. */
export const secondsWindow = (a: number, b: number): SecondsWindow => [seconds(a), seconds(b)];
