/**
 * The ideal section a stage target asks for, evaluated from its f0, Q, fz and
 * gain alone (no circuit involved), for checking designs against; a
 * third-order target is its real pole times its pole pair.
 */
import type { StageTarget } from "../../src/topologies/types.ts";

/** The section a target asks for, evaluated directly from f0, Q, fz and gain (no circuit involved). */
export function targetResponse(t: StageTarget, fHz: number): { re: number; im: number } {
  const w0 = 2 * Math.PI * t.f0Hz;
  const w = 2 * Math.PI * fHz;
  const k = t.gain;
  const div = (a: [number, number], b: [number, number]): { re: number; im: number } => {
    const d = b[0] * b[0] + b[1] * b[1];
    return { re: (a[0] * b[0] + a[1] * b[1]) / d, im: (a[1] * b[0] - a[0] * b[1]) / d };
  };
  if (t.order === 3) {
    const { realPoleHz, ...pair } = t;
    const p = targetResponse({ ...pair, order: 2 }, fHz);
    const r = targetResponse({ order: 1, kind: t.kind, f0Hz: realPoleHz as number, gain: 1 }, fHz);
    return { re: p.re * r.re - p.im * r.im, im: p.re * r.im + p.im * r.re };
  }
  if (t.order === 1) {
    const den: [number, number] = [w0, w];
    if (t.kind === "lowpass") return div([k * w0, 0], den);
    if (t.kind === "highpass") return div([0, k * w], den);
    return div([k * w0, -k * w], den); // allpass, +k at DC
  }
  const q = t.q as number;
  // s = j w: s^2 = -w^2
  const den: [number, number] = [w0 * w0 - w * w, (w0 / q) * w];
  switch (t.kind) {
    case "lowpass":
      return div([k * w0 * w0, 0], den);
    case "highpass":
      return div([-k * w * w, 0], den);
    case "bandpass":
      return div([0, (k * w0 * w) / q], den);
    case "allpass":
      return div([k * (w0 * w0 - w * w), (-k * w0 * w) / q], den);
    default: {
      const wz = 2 * Math.PI * (t.fzHz ?? t.f0Hz);
      // lowpass-notch: gain at DC; highpass-notch and notch: gain at high frequency
      const scale = t.kind === "lowpass-notch" ? (w0 * w0) / (wz * wz) : 1;
      return div([k * scale * (wz * wz - w * w), 0], den);
    }
  }
}

