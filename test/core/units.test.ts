// Units in core signatures (src/core/units.ts). The type-level checks run in `npm run typecheck` (tsc covers
// test/): a `@ts-expect-error` line that stopped being an error would fail it. Finiteness is ECMAScript's
// Number.isFinite (ECMA-262 §21.1.2.2).
import { describe, expect, expectTypeOf, it } from 'vitest';
import { hz, microvolts, millimetres, seconds, secondsWindow, type Hz, type Lenient, type Seconds } from '../../src/core/units.ts';
import { mainsHz, mainsFrequency, type MainsHz } from '../../src/core/formats/power-line.ts';

describe('unit constructors', () => {
  it('pass finite values through unchanged', () => {
    expect(hz(250)).toBe(250);
    expect(seconds(-0.2)).toBe(-0.2);
    expect(microvolts(0)).toBe(0);
    expect(millimetres(90)).toBe(90);
    expect(secondsWindow(-0.2, 0.8)).toEqual([-0.2, 0.8]);
  });

  it('refuse NaN and infinities, naming the unit', () => {
    expect(() => hz(NaN)).toThrow(/Hz: expected a finite number, got NaN/);
    expect(() => seconds(Infinity)).toThrow(RangeError);
    expect(() => millimetres(-Infinity)).toThrow(/Millimetres/);
  });

  it('keep units apart in the types', () => {
    const takesHz = (fs: Hz) => fs;
    const takesLenientHz = (fs: Lenient<Hz>) => fs;
    // @ts-expect-error a bare number is not a frequency
    takesHz(250);
    // @ts-expect-error a duration is not a frequency
    takesHz(seconds(2));
    // @ts-expect-error the lenient form still refuses another unit
    takesLenientHz(seconds(2));
    takesLenientHz(250);
    takesLenientHz(hz(250));
    // A branded value reads as a number; arithmetic gives a plain number.
    expectTypeOf(hz(250) / 2).toEqualTypeOf<number>();
    expectTypeOf<Seconds>().toMatchTypeOf<number>();
    expect(takesHz(hz(250))).toBe(250);
  });

  it('mains frequencies are Hz and 50 or 60 (BIDS PowerLineFrequency)', () => {
    expectTypeOf(mainsHz(60)).toEqualTypeOf<MainsHz>();
    expectTypeOf<MainsHz>().toMatchTypeOf<Hz>();
    expect(mainsFrequency(undefined).hz).toBe(50);
    expect(mainsFrequency({ hz: mainsHz(60), sidecar: 'x_eeg.json' }).hz).toBe(60);
  });
});
