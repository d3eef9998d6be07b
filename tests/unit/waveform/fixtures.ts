import type { StepInterval, Waveforms } from "@/lib/sim/types";

/** A synthetic breath-like trace: 1 kHz, 20 /min, with sharp peaks and seeded noise. */
export function syntheticWaveforms(durationS: number, dtS = 0.001, seed = 7): { w: Waveforms; steps: StepInterval[]; stepNames: string[] } {
  const n = Math.round(durationS / dtS) + 1;
  const w: Waveforms = {
    t: new Float64Array(n),
    paw: new Float32Array(n),
    flow: new Float32Array(n),
    volume: new Float32Array(n),
    pmus: new Float32Array(n),
    arm: new Float32Array(n),
    step: new Uint16Array(n),
  };
  let x = seed >>> 0;
  const rand = () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 2 ** 32 - 0.5;
  };
  const period = 3;
  const steps: StepInterval[] = [];
  for (let i = 0; i < n; i++) {
    const t = i * dtS;
    const phase = t % period;
    const inhale = phase < 1;
    w.t[i] = t;
    w.paw[i] = inhale ? 5 + 10 * (1 - Math.exp(-phase / 0.05)) + rand() * 0.2 : 5 + rand() * 0.2;
    w.flow[i] = inhale ? 120 * Math.exp(-phase / 0.25) : -90 * Math.exp(-(phase - 1) / 0.25);
    w.volume[i] = inhale ? 490 * (1 - Math.exp(-phase / 0.25)) : 490 * Math.exp(-(phase - 1) / 0.25);
    w.pmus[i] = 0;
    w.arm[i] = inhale ? 90 * phase : 0;
    w.step[i] = inhale ? 0 : 1;
  }
  for (let s = 0; s < durationS; s += period) {
    steps.push({ step: "inhale", from: s, to: Math.min(s + 1, durationS) });
    if (s + 1 < durationS) steps.push({ step: "exhale", from: s + 1, to: Math.min(s + period, durationS) });
  }
  return { w, steps, stepNames: ["inhale", "exhale"] };
}
