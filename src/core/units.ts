/**
 * Branded numbers for the quantities Winnow passes between modules. A brand costs nothing at run time;
 * it stops a frequency from being passed where a duration is expected.
 */
declare const brand: unique symbol;
type Brand<T, B extends string> = T & { readonly [brand]: B };

/** Frequency in hertz (cycles per second). */
export type Hz = Brand<number, 'Hz'>;
/** Duration or time since the first stored sample, in seconds. */
export type Seconds = Brand<number, 'Seconds'>;
/** Electric potential in microvolts. */
export type Microvolts = Brand<number, 'Microvolts'>;
/** Zero-based index of a sample within one channel. */
export type SampleIndex = Brand<number, 'SampleIndex'>;
/** Length in millimetres (head coordinates, RAS). */
export type Millimetres = Brand<number, 'Millimetres'>;

export const hz = (v: number): Hz => v as Hz;
export const seconds = (v: number): Seconds => v as Seconds;
export const microvolts = (v: number): Microvolts => v as Microvolts;
export const millimetres = (v: number): Millimetres => v as Millimetres;
