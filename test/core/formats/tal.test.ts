import { describe, expect, it } from 'vitest';
import { encodeTal, formatTalSeconds, parseTals } from '../../../src/core/formats/tal.ts';

const bytes = (s: string) => new TextEncoder().encode(s);

describe('parseTals', () => {
  it('parses the EDF+ specification example "+1800.2" 0x15 "25.5" 0x14 "Apnea" 0x14 0x00 (EDF+ §2.2.2)', () => {
    const r = parseTals(bytes('+1800.2\x1525.5\x14Apnea\x14\x00'), 0);
    expect(r.ok && r.value).toEqual([{ onset: 1800.2, duration: 25.5, annotations: ['Apnea'] }]);
  });

  it('parses the record-0 annotation bytes of checks/edf_layout.json (docs/methods.md §11)', () => {
    const hex = '2b301414002b302e3515302e3214426c696e6b1400000000000000000000000000000000000000000000000000000000000000000000000000000000';
    const raw = new Uint8Array(hex.match(/../g)!.map((h) => parseInt(h, 16)));
    const r = parseTals(raw, 0);
    expect(r.ok && r.value).toEqual([
      { onset: 0, duration: null, annotations: [''] },
      { onset: 0.5, duration: 0.2, annotations: ['Blink'] },
    ]);
  });

  it('reads several annotations sharing one time stamp, a negative onset and UTF-8 text', () => {
    // EDF+ §2.2.2: one TAL may carry several annotations; onsets may be negative
    const r = parseTals(bytes('+0\x14\x14\x00-0.5\x14Lights off\x14Ölçüm 眼\x14\x00\x00\x00'), 3);
    expect(r.ok && r.value).toEqual([
      { onset: 0, duration: null, annotations: [''] },
      { onset: -0.5, duration: null, annotations: ['Lights off', 'Ölçüm 眼'] },
    ]);
  });

  it('accepts a TAL with no annotation at all ("+3" 0x14 0x00, zero repetitions in the grammar)', () => {
    const r = parseTals(bytes('+3\x14\x00'), 0);
    expect(r.ok && r.value).toEqual([{ onset: 3, duration: null, annotations: [] }]);
  });

  it.each([
    ['1.5\x14x\x14\x00', 0, 'onset must start with "+" or "-"'],
    ['+\x14x\x14\x00', 1, 'onset needs digits'],
    ['+1.\x14x\x14\x00', 1, 'onset needs digits'],
    ['+1\x15-2\x14x\x14\x00', 3, 'duration needs digits'],
    ['+1 x\x14\x00', 2, 'expected 0x14 after the time stamp'],
    ['+1\x14Apnea', 3, 'annotation text runs past the end of the record'],
    ['+1\x14Apnea\x00', 8, 'annotation text must end with 0x14'],
    ['+1\x14Apnea\x14', 9, 'the TAL is not closed by 0x00'],
  ])('rejects %j at the offending byte with a typed bad-tal error', (text, at, what) => {
    const r = parseTals(bytes(text), 7, 'night.edf', 1000);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('bad-tal');
      expect(r.error.byteOffset).toBe(1000 + at);
      expect(r.error.message).toContain(`night.edf: malformed annotation (TAL) in data record 7 at byte ${1000 + at}: ${what}`);
    }
  });

  it('round-trips encodeTal output, replacing the grammar bytes 0x14/0x00 inside a text by spaces', () => {
    const b = encodeTal(12.25, 0.5, ['a\x14b\x00c', 'd\te']);
    const r = parseTals(b, 0);
    expect(r.ok && r.value).toEqual([{ onset: 12.25, duration: 0.5, annotations: ['a b c', 'd\te'] }]);
    expect(formatTalSeconds(0.1 + 0.2, true)).toBe('+0.3');
    expect(formatTalSeconds(-2, true)).toBe('-2');
    expect(formatTalSeconds(1e-12, true)).toBe('+0');
  });
});
