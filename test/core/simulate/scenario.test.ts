import { describe, expect, it } from 'vitest';
import { CADENCE_STEPS_PER_S, createScenario } from '../../../src/core/simulate/scenario.ts';

// Ten minutes of timeline is cheap (no signals are made); rates are checked against the ranges the
// scenario promises, which follow common practice for walking, oddball tasks, blinks and heart rate.
const fs = 250;
const sc = createScenario(21, 600, fs);
const onGrid = (t: number) => Math.abs(t * fs - Math.round(t * fs)) < 1e-6;

describe('createScenario', () => {
  it('walks at ~1.8 steps per second on the straight, alternating feet, slower in the turns', () => {
    const straight: number[] = [];
    const turning: number[] = [];
    for (let i = 1; i < sc.steps.length; i++) {
      const d = sc.steps[i].timeS - sc.steps[i - 1].timeS;
      (sc.steps[i - 1].turning ? turning : straight).push(d);
      expect(sc.steps[i].foot).not.toBe(sc.steps[i - 1].foot);
    }
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    expect(Math.abs(1 / mean(straight) - CADENCE_STEPS_PER_S)).toBeLessThan(0.05);
    expect(mean(turning)).toBeGreaterThan(mean(straight));
    expect(sc.turns.length).toBeGreaterThanOrEqual(25); // a turn every ~20 s
  });

  it('plays about 20 % rare tones, never two in a row, 1.1–1.5 s apart', () => {
    const rare = sc.tones.filter((t) => t.rare).length / sc.tones.length;
    expect(rare).toBeGreaterThan(0.15);
    expect(rare).toBeLessThan(0.25);
    for (let i = 1; i < sc.tones.length; i++) {
      expect(sc.tones[i].rare && sc.tones[i - 1].rare).toBe(false);
      const d = sc.tones[i].timeS - sc.tones[i - 1].timeS;
      expect(d).toBeGreaterThanOrEqual(1.1 - 1 / fs);
      expect(d).toBeLessThanOrEqual(1.5 + 1 / fs);
    }
  });

  it('blinks 10–20 times per minute, more often in the 0.3–0.7 s after a tone', () => {
    const perMin = sc.blinks.length / 10;
    expect(perMin).toBeGreaterThanOrEqual(10);
    expect(perMin).toBeLessThanOrEqual(20);
    const afterTone = sc.blinks.filter((b) => sc.tones.some((t) => b.timeS - t.timeS >= 0.3 && b.timeS - t.timeS <= 0.7)).length;
    // Fraction of time inside post-tone windows: 0.4 s per ~1.3 s of onset asynchrony ≈ 0.31.
    const windowShare = (sc.tones.length * 0.4) / 600;
    expect(afterTone / sc.blinks.length).toBeGreaterThan(1.3 * windowShare);
    for (const b of sc.blinks) expect(b.riseS + b.fallS).toBeGreaterThanOrEqual(0.23);
  });

  it('beats the heart at 60–90 per minute', () => {
    const bpm = (60 * (sc.heartbeats.length - 1)) / (sc.heartbeats[sc.heartbeats.length - 1] - sc.heartbeats[0]);
    expect(bpm).toBeGreaterThanOrEqual(60);
    expect(bpm).toBeLessThanOrEqual(90);
  });

  it('keeps gaze within ±20° and locks about half of the neck bursts to heel strikes', () => {
    for (const s of sc.saccades) expect(Math.abs(s.targetDeg)).toBeLessThanOrEqual(20);
    const locked = sc.neckBursts.filter((b) => sc.steps.some((s) => b.timeS - s.timeS >= 0.02 - 1e-9 && b.timeS - s.timeS <= 0.06 + 1e-9));
    expect(locked.length / sc.steps.length).toBeGreaterThan(0.35);
    expect(locked.length / sc.steps.length).toBeLessThan(0.55);
  });

  it('puts every timed event on the sample grid and is the same for the same seed', () => {
    for (const t of [...sc.steps, ...sc.tones, ...sc.blinks, ...sc.saccades, ...sc.pops, ...sc.neckBursts]) expect(onGrid(t.timeS)).toBe(true);
    for (const t of sc.heartbeats) expect(onGrid(t)).toBe(true);
    expect(createScenario(21, 600, fs)).toEqual(sc);
    expect(createScenario(22, 600, fs).tones).not.toEqual(sc.tones);
  });
});
