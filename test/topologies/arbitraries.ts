/**
 * fast-check generators of stage targets and choices for a topology, over a
 * wide range (f0 0.5 Hz .. 500 kHz, Q 0.3 .. 30, |gain| 0.1 .. 100, a third-order
 * stage's real pole 0.2 .. 5 times f0), kept to
 * what the topology can realise by filtering through its own `check`.
 */
import fc from "fast-check";
import type { StageChoices, StageTarget, Topology } from "../../src/topologies/types.ts";

const logUniform = (lo: number, hi: number): fc.Arbitrary<number> =>
  fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map((x) => Math.exp(x));

/** A raw target for a topology (not yet filtered by check). */
export function targetArb(topo: Topology): fc.Arbitrary<StageTarget> {
  return fc
    .record({
      kind: fc.constantFrom(...topo.kinds),
      f0Hz: logUniform(0.5, 5e5),
      q: logUniform(0.3, 30),
      gain: logUniform(0.1, 100),
      fzRatio: logUniform(1.02, 20),
      realRatio: logUniform(0.2, 5),
    })
    .map(({ kind, f0Hz, q, gain, fzRatio, realRatio }) => {
      const fixed = (topo as Topology).fixedGain;
      let g = gain;
      if (topo.id.includes("unity") || topo.id.includes("buffer")) g = 1;
      const realPole = topo.order === 3 ? { realPoleHz: f0Hz * realRatio } : {};
      if (fixed !== undefined) g = fixed({ order: topo.order, kind, f0Hz, q, ...realPole });
      if (topo.inverting) g = -g;
      const t: StageTarget = {
        order: topo.order,
        kind,
        f0Hz,
        ...(topo.order >= 2 ? { q } : {}),
        ...realPole,
        gain: g,
        ...(kind === "lowpass-notch" ? { fzHz: f0Hz * fzRatio } : {}),
        ...(kind === "highpass-notch" ? { fzHz: f0Hz / fzRatio } : {}),
      };
      return t;
    });
}

/** Choices: none, a capacitor or a resistor; sometimes a capacitor ratio or (not both) a resistor ratio. */
export const choicesArb: fc.Arbitrary<StageChoices> = fc
  .record({
    level: fc.constantFrom("none", "capacitor", "resistor"),
    c: logUniform(1e-11, 1e-5),
    r: logUniform(100, 1e6),
    ratio: fc.option(logUniform(0.1, 5000), { nil: undefined }),
    rRatio: fc.option(logUniform(0.05, 20), { nil: undefined }),
  })
  .map(({ level, c, r, ratio, rRatio }) => ({
    ...(level === "capacitor" ? { capacitor: c } : {}),
    ...(level === "resistor" ? { resistor: r } : {}),
    ...(ratio === undefined ? {} : { capacitorRatio: ratio }),
    ...(rRatio === undefined || ratio !== undefined ? {} : { resistorRatio: rRatio }),
  }));

/** A realisable (target, choices) pair for the topology. */
export function realisableArb(topo: Topology): fc.Arbitrary<{ target: StageTarget; choices: StageChoices }> {
  return fc
    .record({ target: targetArb(topo), choices: choicesArb })
    .filter(({ target, choices }) => topo.check(target, choices) === null);
}

/**
 * One fixed target each topology realises (f0 2 kHz, Q 1.2, a gain it
 * accepts; Q 8 for the Deliyannis-Friend bandpass, which starts at Q 5; a
 * third-order stage's real pole at 1.5 kHz, with Q 0.9).
 */
export function sampleTarget(t: Topology): StageTarget {
  const kind = t.kinds[0] as StageTarget["kind"];
  const base = {
    order: t.order,
    kind,
    f0Hz: 2000,
    q: t.id === "deliyannis-friend-bandpass" ? 8 : t.order === 3 ? 0.9 : 1.2,
    ...(t.order === 3 ? { realPoleHz: 1500 } : {}),
  } as const;
  let gain = t.id.includes("unity") || t.id.includes("buffer") ? 1 : 2.5;
  if (t.id === "mfb-bandpass") gain = 3;
  // the single-amplifier notch sections have a bounded gain (HF gain below 1 for the highpass-notch)
  if (t.id === "boctor-lowpass-notch") gain = 1.5;
  if (t.id === "boctor-highpass-notch") gain = 0.8;
  if (t.fixedGain !== undefined) gain = t.fixedGain(base);
  return {
    ...base,
    gain: t.inverting ? -gain : gain,
    ...(kind === "lowpass-notch" ? { fzHz: 5000 } : {}),
    ...(kind === "highpass-notch" ? { fzHz: 900 } : {}),
  };
}
