// Short synthetic sounds for the demo fonts, made from nothing but arithmetic: hums from a few
// sine partials with a slow wobble, clashes and blasts from shaped noise bursts, ignition and
// retraction from pitch sweeps. Deterministic (seeded noise), so the seed's files never change.
import type { Cue } from "../config/schema";
import { simpleWav } from "./wav-build";

export const SYNTH_RATE = 44100;

function noise(seed: number) {
  let s = seed >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s ^= s >>> 17;
    s ^= s << 5;
    return ((s >>> 0) / 0xffffffff) * 2 - 1;
  };
}

/** Interleaving is not needed: demo fonts are mono, 44.1 kHz, 16-bit (the usual target). */
function render(seconds: number, fn: (t: number, i: number) => number): Float32Array {
  const n = Math.round(seconds * SYNTH_RATE);
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) out[i] = fn(i / SYNTH_RATE, i);
  // Short fades keep the ends from clicking.
  const fade = Math.min(n >> 1, Math.round(0.005 * SYNTH_RATE));
  for (let i = 0; i < fade; i++) {
    out[i] *= i / fade;
    out[n - 1 - i] *= i / fade;
  }
  return out;
}

const TAU = 2 * Math.PI;

/** One sound for a cue; `base` is the font's fundamental in Hz, `variant` changes it a little. */
export function synthCue(cue: Cue, base: number, variant = 0): Float32Array {
  const rnd = noise(Math.round(base * 1000) + variant * 7919 + cue.length * 104729);
  const f = base * (1 + variant * 0.06);
  const hum = (t: number) => (0.5 * Math.sin(TAU * f * t) + 0.25 * Math.sin(TAU * 2 * f * t + 0.3) + 0.12 * Math.sin(TAU * 3.01 * f * t)) * (0.8 + 0.2 * Math.sin(TAU * 0.7 * t));
  switch (cue) {
    case "hum":
      return render(1.0, (t) => 0.5 * hum(t));
    case "swing":
      return render(0.4, (t) => 0.6 * Math.sin(Math.PI * (t / 0.4)) * hum(t * (1 + 0.3 * Math.sin(Math.PI * (t / 0.4)))));
    case "clash":
      return render(0.3, (t) => 0.7 * Math.exp(-t * 14) * (0.7 * rnd() + 0.3 * Math.sin(TAU * 3.3 * f * t)));
    case "blast":
      return render(0.3, (t) => 0.6 * Math.exp(-t * 9) * (0.5 * rnd() + 0.5 * Math.sin(TAU * (5 * f - 600 * t) * t)));
    case "lockup":
      return render(0.8, (t) => 0.45 * (0.6 * rnd() * (0.6 + 0.4 * Math.sin(TAU * 23 * t)) + 0.4 * hum(t)));
    case "drag":
      return render(0.8, (t) => 0.35 * rnd() * (0.5 + 0.5 * Math.sin(TAU * 11 * t)) + 0.15 * hum(t));
    case "ignite":
      return render(0.8, (t) => 0.6 * Math.min(1, t * 6) * Math.sin(TAU * (f * 0.5 + f * 0.75 * t) * t) * (1 - 0.3 * t) + 0.1 * rnd() * Math.exp(-t * 8));
    case "retract":
      return render(0.9, (t) => 0.55 * (1 - t / 0.9) * Math.sin(TAU * (f * 1.1 - f * 0.55 * t) * t));
    case "boot":
      return render(0.6, (t) => 0.4 * Math.sin(TAU * (t < 0.3 ? 2 * f : 3 * f) * t) * Math.exp(-((t % 0.3) * 6)));
    case "name":
      return render(0.6, (t) => 0.4 * Math.sin(TAU * 4 * f * t) * Math.sin(TAU * 2.5 * t) ** 2);
  }
}

/** The demo font's files as (name, WAV bytes): two variants of swing and clash, one of the rest. */
export function synthFont(cues: readonly Cue[], base: number): { name: string; bytes: Uint8Array }[] {
  const out: { name: string; bytes: Uint8Array }[] = [];
  for (const cue of cues) {
    const variants = cue === "swing" || cue === "clash" ? 2 : 1;
    for (let v = 0; v < variants; v++) out.push({ name: variants > 1 ? `${cue}-${v + 1}.wav` : `${cue}.wav`, bytes: simpleWav(synthCue(cue, base, v)) });
  }
  return out;
}
