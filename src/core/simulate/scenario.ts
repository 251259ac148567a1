/**
 * The session's timeline: a participant walks laps along a corridor (straight stretches, then a turn)
 * while hearing frequent low and rare high tones and silently counting the high ones. Everything that
 * happens at a moment — heel strikes, tones, blinks, gaze shifts, heartbeats, muscle bursts, electrode
 * pops — is drawn here from named Rng streams, then quantised to the sample grid so that the kernels in
 * simulate.ts and the exported events agree to the sample.
 *
 * All rates and durations below are round numbers chosen to look like a walking oddball session; where a
 * number rests on a fact of the trade it says so (from memory unless a source is named).
 */
import { streamRng } from './rng.ts';

export interface Step {
  readonly timeS: number;
  readonly foot: 'left' | 'right';
  readonly turning: boolean;
}
export interface Tone {
  readonly timeS: number;
  readonly rare: boolean;
}
export interface Blink {
  readonly timeS: number;
  readonly riseS: number;
  readonly fallS: number;
  readonly amplitude: number;
}
export interface Saccade {
  /** Saccade onset, s. */
  readonly timeS: number;
  /** Horizontal gaze angle after the saccade, degrees (+ = rightwards). */
  readonly targetDeg: number;
  readonly durS: number;
}
export interface Burst {
  readonly timeS: number;
  readonly durS: number;
  readonly amplitude: number;
}
export interface Pop {
  readonly timeS: number;
  /** Jump height in activation units (signed). */
  readonly height: number;
  /** Exponential recovery time constant, s. */
  readonly tauS: number;
}
export interface Turn {
  readonly startS: number;
  readonly endS: number;
  /** +1 turning right, −1 turning left. */
  readonly direction: 1 | -1;
}

export interface Scenario {
  readonly durationS: number;
  readonly sampleRate: number;
  readonly turns: readonly Turn[];
  readonly steps: readonly Step[];
  readonly tones: readonly Tone[];
  readonly blinks: readonly Blink[];
  readonly saccades: readonly Saccade[];
  /** R-peak times, s (may start before 0 so the first beat's tail is in the record). */
  readonly heartbeats: readonly number[];
  readonly jawLeftBursts: readonly Burst[];
  readonly jawRightBursts: readonly Burst[];
  readonly neckBursts: readonly Burst[];
  readonly pops: readonly Pop[];
}

/** Walking cadence on the straight, steps/s (~1.8/s is a common free-walking cadence; from memory). */
export const CADENCE_STEPS_PER_S = 1.8;
/** Share of rare (high) tones; oddball paradigms commonly use 10–20 % (common practice). */
export const RARE_TONE_PROBABILITY = 0.2;

/** Rounds a time to the nearest sample of rate fs. */
export function onSampleGrid(timeS: number, fs: number): number {
  return Math.round(timeS * fs) / fs;
}

/** Draws the whole timeline for `durationS` seconds at `fs` Hz from session `seed`. */
export function createScenario(seed: number, durationS: number, fs: number): Scenario {
  const grid = (t: number) => onSampleGrid(t, fs);

  // Laps: ~16–20 s straight (a 20 m corridor at ~1.1 m/s), then a 3–4 s turn, alternating direction.
  const lapRng = streamRng(seed, 'scenario/laps');
  const turns: Turn[] = [];
  let t = 2 + lapRng.between(14, 18);
  let dir: 1 | -1 = lapRng.uniform() < 0.5 ? 1 : -1;
  while (t < durationS) {
    const d = lapRng.between(3, 4);
    turns.push({ startS: t, endS: t + d, direction: dir });
    dir = dir === 1 ? -1 : 1;
    t += d + lapRng.between(16, 20);
  }
  const turningAt = (s: number) => turns.some((u) => s >= u.startS && s < u.endS);

  // Heel strikes: walking starts at 2 s; step intervals jitter by ~3 %, slower and irregular in turns.
  const stepRng = streamRng(seed, 'scenario/steps');
  const steps: Step[] = [];
  let foot: 'left' | 'right' = stepRng.uniform() < 0.5 ? 'left' : 'right';
  for (let s = 2; s < durationS; ) {
    const turning = turningAt(s);
    steps.push({ timeS: grid(s), foot, turning });
    foot = foot === 'left' ? 'right' : 'left';
    s += turning ? 0.68 + 0.06 * stepRng.normal() : 1 / CADENCE_STEPS_PER_S + 0.016 * stepRng.normal();
  }

  // Tones: onset asynchrony 1.1–1.5 s; rare with p = 0.2, never two rare in a row (common practice).
  const toneRng = streamRng(seed, 'scenario/tones');
  const tones: Tone[] = [];
  let lastRare = true;
  for (let s = 1 + toneRng.between(0, 0.5); s < durationS; s += toneRng.between(1.1, 1.5)) {
    const rare: boolean = !lastRare && toneRng.uniform() < RARE_TONE_PROBABILITY / (1 - RARE_TONE_PROBABILITY);
    tones.push({ timeS: grid(s), rare });
    lastRare = rare;
  }

  // Blinks: a spontaneous Poisson stream (~9/min) plus blinks 0.3–0.7 s after tones (12 % of standard,
  // 30 % of rare tones), ~16/min in all (spontaneous rates of 10–20/min are common practice); a blink is
  // dropped if it starts within 0.6 s of the previous one.
  const blinkRng = streamRng(seed, 'scenario/blinks');
  const blinkTimes: number[] = [];
  for (let s = blinkRng.between(0, 3); s < durationS; s += -Math.log(1 - blinkRng.uniform()) / 0.15) blinkTimes.push(s);
  for (const tone of tones) {
    if (blinkRng.uniform() < (tone.rare ? 0.3 : 0.12)) blinkTimes.push(tone.timeS + blinkRng.between(0.3, 0.7));
  }
  blinkTimes.sort((a, b) => a - b);
  const blinks: Blink[] = [];
  let lastBlink = -Infinity;
  for (const s of blinkTimes) {
    if (s - lastBlink < 0.6 || s >= durationS) continue;
    lastBlink = s;
    blinks.push({
      timeS: grid(s),
      riseS: blinkRng.between(0.08, 0.12),
      fallS: blinkRng.between(0.15, 0.25),
      amplitude: blinkRng.between(0.75, 1.25),
    });
  }

  // Gaze: fixations of 0.25 s + exponential(0.6 s); horizontal target ~N(0, 7°) clipped to ±20°, shifted
  // 12° towards the turn during turns. Saccade duration 21 ms + 2.2 ms/° (main-sequence rule of thumb,
  // from memory).
  const gazeRng = streamRng(seed, 'scenario/gaze');
  const saccades: Saccade[] = [];
  let gaze = 0;
  for (let s = gazeRng.between(0.2, 1); s < durationS; ) {
    const turn = turns.find((u) => s >= u.startS && s < u.endS);
    const target = Math.max(-20, Math.min(20, 7 * gazeRng.normal() + (turn ? 12 * turn.direction : 0)));
    const durS = 0.021 + 0.0022 * Math.abs(target - gaze);
    saccades.push({ timeS: grid(s), targetDeg: target, durS });
    gaze = target;
    s += durS + 0.25 - 0.6 * Math.log(1 - gazeRng.uniform());
  }

  // Heart: 75 bpm while walking, respiratory sinus arrhythmia ±4 % at 0.25 Hz, beat jitter 15 ms.
  const heartRng = streamRng(seed, 'scenario/heart');
  const heartbeats: number[] = [];
  const rr0 = 60 / 75;
  for (let s = -heartRng.between(0, rr0); s < durationS + 0.5; ) {
    heartbeats.push(grid(s));
    s += rr0 * (1 + 0.04 * Math.sin(2 * Math.PI * 0.25 * s)) + 0.015 * heartRng.normal();
  }

  // Jaw muscles: independent clench bursts on each side, ~4 per minute, 0.3–1.2 s.
  const burstStream = (name: string, perMin: number): Burst[] => {
    const r = streamRng(seed, name);
    const out: Burst[] = [];
    for (let s = -Math.log(1 - r.uniform()) * (60 / perMin); s < durationS; s += r.between(0.2, 0.5) - Math.log(1 - r.uniform()) * (60 / perMin)) {
      const durS = r.between(0.3, 1.2);
      out.push({ timeS: grid(s), durS, amplitude: r.between(0.6, 1.4) });
      s += durS;
    }
    return out;
  };
  const jawLeftBursts = burstStream('scenario/jaw-left', 4);
  const jawRightBursts = burstStream('scenario/jaw-right', 4);

  // Neck muscles: a short burst 20–60 ms after 45 % of heel strikes, plus a long burst through each turn.
  const neckRng = streamRng(seed, 'scenario/neck');
  const neckBursts: Burst[] = [];
  for (const st of steps) {
    if (neckRng.uniform() < 0.45) {
      neckBursts.push({ timeS: grid(st.timeS + neckRng.between(0.02, 0.06)), durS: neckRng.between(0.12, 0.2), amplitude: neckRng.between(0.6, 1.2) });
    }
  }
  for (const u of turns) neckBursts.push({ timeS: grid(u.startS), durS: u.endS - u.startS, amplitude: 0.5 });
  neckBursts.sort((a, b) => a.timeS - b.timeS);

  // Loose electrode: pops every ~25 s on average, 1.5–4 units high, recovering with τ 0.3–1.5 s.
  const popRng = streamRng(seed, 'scenario/pops');
  const pops: Pop[] = [];
  for (let s = -25 * Math.log(1 - popRng.uniform()); s < durationS; s += 2 - 25 * Math.log(1 - popRng.uniform())) {
    pops.push({ timeS: grid(s), height: (popRng.uniform() < 0.5 ? -1 : 1) * popRng.between(1.5, 4), tauS: popRng.between(0.3, 1.5) });
  }

  return { durationS, sampleRate: fs, turns, steps, tones, blinks, saccades, heartbeats, jawLeftBursts, jawRightBursts, neckBursts, pops };
}
