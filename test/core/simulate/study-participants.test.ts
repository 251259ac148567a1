import { describe, expect, it } from 'vitest';
import { createWelchPlan, welchFrequencies, welchPsd } from '../../../src/core/signal/welch.ts';
import { simulateSession } from '../../../src/core/simulate/simulate.ts';
import { participantOptions, studyParticipant } from '../../../src/core/simulate/study-participants.ts';
import { hz } from '../../../src/core/units.ts';

describe('simulated study participants differ', () => {
  it('draws an alpha peak in 8.5–11.5 Hz (inside the adult 8–12 Hz range, common practice) and an artefact mix per participant; the last is noisy', () => {
    const ps = Array.from({ length: 6 }, (_, k) => studyParticipant(7, k, 6));
    for (const p of ps) {
      expect(p.alphaPeakHz).toBeGreaterThanOrEqual(8.5);
      expect(p.alphaPeakHz).toBeLessThanOrEqual(11.5);
      expect(p.classGain.blink).toBeGreaterThanOrEqual(0.5);
    }
    expect(new Set(ps.map((p) => p.alphaPeakHz)).size).toBeGreaterThan(1);
    expect(ps.map((p) => p.noisy)).toEqual([false, false, false, false, false, true]);
    expect(studyParticipant(7, 2, 6)).toEqual(ps[2]);
  });

  it('the simulated alpha source peaks at the participant\'s alpha frequency (within half a 0.49 Hz Welch bin), its harmonic at twice it', () => {
    const p = { ...studyParticipant(7, 0, 4), alphaPeakHz: 11.2 };
    const s = simulateSession({ ...participantOptions(p), minutes: 1, channels: 32, rate: hz(250), lineHz: 50 });
    const alpha = s.sources.find((x) => x.id === 'alpha-posterior');
    expect(alpha).toBeDefined();
    const plan = createWelchPlan(512);
    const psd = welchPsd(plan, alpha!.activation, 250);
    const f = welchFrequencies(plan, 250);
    let best = 0;
    for (let i = 1; i < f.length; i++) if (f[i] > 6 && f[i] < 16 && psd[i] > psd[best]) best = i;
    expect(Math.abs(f[best] - 11.2)).toBeLessThanOrEqual(250 / 1024);
    expect(alpha!.description).toContain('22.4 Hz');
  });

  it('a class gain scales that class\'s true map and nothing else', () => {
    const base = simulateSession({ seed: 3, minutes: 0.2 });
    const scaled = simulateSession({ seed: 3, minutes: 0.2, classGain: { blink: 0.5 } });
    for (const [i, src] of base.sources.entries()) {
      const factor = src.class === 'blink' ? 0.5 : 1;
      expect(scaled.sources[i].map[0]).toBeCloseTo(src.map[0] * factor, 12);
    }
  });
});
