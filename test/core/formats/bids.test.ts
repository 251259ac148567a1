import { describe, expect, it } from 'vitest';
import { formatTsv, parseChannelsTsv, parseEegJson, parseElectrodesTsv, parseEventsTsv, parseTsv } from '../../../src/core/formats/bids.ts';

describe('parseTsv (BIDS TSV rules, docs/methods.md §12)', () => {
  it('reads columns and rows, keeps n/a as written, accepts CRLF, a BOM and a trailing newline', () => {
    const r = parseTsv('\ufeffname\ttype\r\nFp1\tEEG\r\nVEOG\tn/a\r\n', 'x_channels.tsv');
    expect(r.ok && r.value).toEqual({ columns: ['name', 'type'], rows: [['Fp1', 'EEG'], ['VEOG', 'n/a']] });
  });

  it('reads double-quoted cells that contain tabs (BIDS: strings containing tabs are quoted)', () => {
    const r = parseTsv('onset\tduration\ttrial_type\n1\t0\t"a\tb ""q"""\n', 'e.tsv');
    expect(r.ok && r.value.rows[0]).toEqual(['1', '0', 'a\tb "q"']);
  });

  it('refuses duplicate or blank column names and rows with the wrong number of cells, naming the line', () => {
    const dup = parseTsv('name\tname\nA\tB\n', 'c.tsv');
    expect(!dup.ok && dup.error).toMatchObject({ code: 'bad-tsv', message: 'c.tsv: column "name" appears twice in the header line', line: 1 });
    const blank = parseTsv('name\t\tx\n', 'c.tsv');
    expect(!blank.ok && blank.error.code).toBe('bad-tsv');
    const short = parseTsv('name\ttype\tunits\nFp1\tEEG\n', 'c.tsv');
    expect(!short.ok && short.error).toMatchObject({ code: 'bad-tsv', message: 'c.tsv: line 2 has 2 cells but the header names 3 columns', line: 2 });
    const empty = parseTsv('', 'c.tsv');
    expect(!empty.ok && empty.error.code).toBe('bad-tsv');
  });
});

describe('parseChannelsTsv', () => {
  it('reads the docs/methods.md §12 example: name, type, units, status', () => {
    const r = parseChannelsTsv('name\ttype\tunits\tstatus\tstatus_description\nFp1\tEEG\tuV\tgood\tn/a\nVEOG\tVEOG\tuV\tbad\tflat\n', 'sub-01_channels.tsv');
    expect(r.ok && r.value).toEqual([
      { name: 'Fp1', type: 'EEG', units: 'uV', status: 'good' },
      { name: 'VEOG', type: 'VEOG', units: 'uV', status: 'bad' },
    ]);
  });

  it('names every missing required column', () => {
    const r = parseChannelsTsv('name\tstatus\nFp1\tgood\n', 'sub-01_channels.tsv');
    expect(!r.ok && r.error).toMatchObject({ code: 'missing-column', message: 'sub-01_channels.tsv: missing required columns "type", "units" (has name, status)' });
  });

  it('warns about lower-case and unknown types instead of guessing silently', () => {
    const r = parseChannelsTsv('name\ttype\tunits\nFp1\teeg\tuV\nX\tFOO\tuV\n', 'c.tsv');
    expect(r.ok && r.value.map((c) => c.type)).toEqual(['EEG', 'MISC']);
    expect(r.ok && r.warnings).toHaveLength(2);
  });
});

describe('parseElectrodesTsv', () => {
  const tsv = 'name\tx\ty\tz\nCz\t0\t0\t0.09\nFpz\t0\t0.0856\t0.0278\nOz\tn/a\tn/a\tn/a\n';

  it('converts metres to millimetres using EEGCoordinateUnits from the coordinate-system JSON', () => {
    const r = parseElectrodesTsv(tsv, 'e.tsv', JSON.stringify({ EEGCoordinateSystem: 'Other', EEGCoordinateUnits: 'm' }));
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.value.units).toBe('m');
      expect(r.value.assumedUnits).toBe(false);
      expect(r.value.names).toEqual(['Cz', 'Fpz', 'Oz']);
      expect(Array.from(r.value.positionsMm.subarray(0, 6)).map((v) => +v.toFixed(9))).toEqual([0, 0, 90, 0, 85.6, 27.8]);
      expect(Number.isNaN(r.value.positionsMm[6])).toBe(true);
      expect(r.warnings).toEqual([]);
    }
  });

  it('assumes millimetres without a coordinate-system JSON and says so', () => {
    const r = parseElectrodesTsv(tsv, 'e.tsv');
    expect(r.ok && r.value.assumedUnits).toBe(true);
    expect(r.ok && r.warnings[0]).toBe('e.tsv: no coordinate-system JSON; electrode coordinates assumed to be in mm');
    const cm = parseElectrodesTsv(tsv, 'e.tsv', '{"EEGCoordinateUnits":"cm"}');
    expect(cm.ok && cm.value.positionsMm[2]).toBeCloseTo(0.9, 12);
  });

  it('refuses a missing z column, a non-numeric coordinate and invalid JSON', () => {
    const noZ = parseElectrodesTsv('name\tx\ty\nCz\t0\t0\n', 'e.tsv');
    expect(!noZ.ok && noZ.error.code).toBe('missing-column');
    const bad = parseElectrodesTsv('name\tx\ty\tz\nCz\t0\tzero\t1\n', 'e.tsv');
    expect(!bad.ok && bad.error).toMatchObject({ code: 'bad-number', line: 2, message: 'e.tsv: line 2 y is "zero", not a number' });
    const json = parseElectrodesTsv(tsv, 'e.tsv', '{units: m}');
    expect(!json.ok && json.error.code).toBe('bad-value');
  });
});

describe('parseEventsTsv', () => {
  it('keeps every other column as a factor of the event (BIDS specification, "Task events": any additional column)', () => {
    const r = parseEventsTsv('onset\tduration\ttrial_type\tcondition\tsample\n1\t0\ttone\trare\t250\n2\t0\ttone\tn/a\t500\n', 'e.tsv');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.map((e) => e.label)).toEqual(['tone', 'tone']);
    expect(r.value.map((e) => e.columns)).toEqual([{ condition: 'rare' }, { condition: 'n/a' }]);
  });
  it('reads onset, duration, trial_type and response_time (n/a duration → 0, n/a response → absent)', () => {
    const r = parseEventsTsv('onset\tduration\ttrial_type\tresponse_time\n1.500\t0\tstimulus\t0.412\n3\tn/a\tresponse\tn/a\n', 'e.tsv');
    expect(r.ok && r.value).toEqual([
      { onset: 1.5, duration: 0, label: 'stimulus', source: 'events-tsv', responseTime: 0.412 },
      { onset: 3, duration: 0, label: 'response', source: 'events-tsv' },
    ]);
  });

  it('skips rows with onset n/a with a warning, and refuses a missing duration column', () => {
    const r = parseEventsTsv('onset\tduration\nn/a\t0\n2\t1\n', 'e.tsv');
    expect(r.ok && r.value).toEqual([{ onset: 2, duration: 1, label: '', source: 'events-tsv' }]);
    expect(r.ok && r.warnings).toEqual(['e.tsv: 1 row with onset n/a skipped']);
    const missing = parseEventsTsv('onset\ttrial_type\n1\tx\n', 'e.tsv');
    expect(!missing.ok && missing.error).toMatchObject({ code: 'missing-column', message: 'e.tsv: missing required column "duration" (has onset, trial_type)' });
    const neg = parseEventsTsv('onset\tduration\n1\t-2\n', 'e.tsv');
    expect(!neg.ok && neg.error.code).toBe('bad-number');
  });
});

describe('formatTsv', () => {
  it('neutralises spreadsheet formula cells but leaves plain numbers alone (OWASP CSV injection, common practice)', () => {
    const text = formatTsv(['a', 'b'], [['=SUM(A1)', '-1.5'], ['+cmd', '@x'], ['-', '1e-3']]);
    expect(text).toBe("a\tb\n'=SUM(A1)\t-1.5\n'+cmd\t'@x\n'-\t1e-3\n");
  });

  it('quotes cells with tabs or quotes and reads back through parseTsv unchanged', () => {
    const rows = [['tab\there', 'say "hi"', 'n/a']];
    const back = parseTsv(formatTsv(['x', 'y', 'z'], rows), 'r.tsv');
    expect(back.ok && back.value.rows).toEqual(rows);
  });
});

describe('parseEegJson (BIDS v1.11 EEG sidecar: PowerLineFrequency REQUIRED, Hz or "n/a")', () => {
  it('reads PowerLineFrequency in Hz, "n/a" as unknown, and warns when it is missing or not a frequency', () => {
    expect(parseEegJson('{"TaskName":"x","PowerLineFrequency":60}', 'sub-01_task-x_eeg.json')).toEqual({ ok: true, value: { powerLineFrequency: 60, reference: null }, warnings: [] });
    expect(parseEegJson('{"PowerLineFrequency":"n/a"}', 'a_eeg.json')).toEqual({ ok: true, value: { powerLineFrequency: null, reference: null }, warnings: [] });
    const missing = parseEegJson('{"TaskName":"x"}', 'a_eeg.json');
    expect(missing.ok && missing.value.powerLineFrequency).toBeNull();
    expect(missing.ok && missing.warnings).toEqual(['a_eeg.json: no PowerLineFrequency (REQUIRED by BIDS)']);
    const text = parseEegJson('{"PowerLineFrequency":"60 Hz"}', 'a_eeg.json');
    expect(text.ok && text.warnings[0]).toMatch(/^a_eeg\.json: PowerLineFrequency is "60 Hz"/);
    // EEGReference (REQUIRED by BIDS): free text naming the reference
    expect(parseEegJson('{"PowerLineFrequency":50,"EEGReference":" linked mastoids "}', 'a_eeg.json')).toMatchObject({ value: { reference: 'linked mastoids' } });
    expect(parseEegJson('{"PowerLineFrequency":50,"EEGReference":"n/a"}', 'a_eeg.json')).toMatchObject({ value: { reference: null } });
    const bad = parseEegJson('{', 'a_eeg.json');
    expect(!bad.ok && bad.error.message).toMatch(/^a_eeg\.json: not valid JSON/);
    expect(parseEegJson('[60]', 'a_eeg.json').ok).toBe(false);
  });
});
