/**
 * Checks shared by the active ladder tests: the circuit's own nodal
 * analysis against a reference transfer over a dense log grid, the
 * elliptic fixture ladders as prototypes, and the circuit's poles.
 */
import { acAnalysis } from "../../src/circuit/index.ts";
import type { Circuit } from "../../src/circuit/types.ts";
import { circuitPolynomials, rightHalfPlaneRoots } from "../../src/evaluate/index.ts";
import type { ActiveLadder } from "../../src/ladder/active/index.ts";
import type { LadderPrototype } from "../../src/ladder/types.ts";
import { logGrid } from "../../src/tf/index.ts";
import { frequencyResponse } from "../../src/tf/index.ts";
import type { Zpk } from "../../src/tf/types.ts";
import { complexList, loadFixture } from "./fixtures.ts";

/** A dense log grid in Hz: `decadesBelow` decades below `edgeHz` to `decadesAbove` above. */
export function denseGridHz(edgeHz: number, decadesBelow = 3, decadesAbove = 2, points = 1500): Float64Array {
  return logGrid(edgeHz / 10 ** decadesBelow, edgeHz * 10 ** decadesAbove, points);
}

/** The circuit's response at its output, from its own nodal analysis. */
export function circuitResponse(ladder: ActiveLadder, freqHz: Float64Array): { re: Float64Array; im: Float64Array } {
  const r = acAnalysis(ladder.circuit, { source: ladder.source, outputs: [ladder.output], freqHz });
  return r.outputs[ladder.output] as { re: Float64Array; im: Float64Array };
}

/** The largest |dB| difference between two responses over a grid, and the largest phase difference (radians). */
export function worstDifference(a: { re: Float64Array; im: Float64Array }, b: { re: Float64Array; im: Float64Array }): { db: number; rad: number } {
  let db = 0;
  let rad = 0;
  for (let i = 0; i < a.re.length; i++) {
    const ar = a.re[i] as number;
    const ai = a.im[i] as number;
    const br = b.re[i] as number;
    const bi = b.im[i] as number;
    db = Math.max(db, Math.abs(10 * Math.log10((ar * ar + ai * ai) / (br * br + bi * bi))));
    // the phase of a / b
    rad = Math.max(rad, Math.abs(Math.atan2(ai * br - ar * bi, ar * br + ai * bi)));
  }
  return { db, rad };
}

/** The circuit against a transfer function (rad/s) over the grid. */
export function errorAgainst(ladder: ActiveLadder, transfer: Zpk, freqHz: Float64Array): { db: number; rad: number } {
  const w = freqHz.map((f) => 2 * Math.PI * f);
  return worstDifference(circuitResponse(ladder, freqHz), frequencyResponse(transfer, w));
}

interface EllipticFixture {
  readonly ladders: readonly {
    readonly order: number;
    readonly rippleDb: number;
    readonly attenuationDb: number;
    readonly form: "series-first";
    readonly sourceOhms: number;
    readonly loadOhms: number;
    readonly elements: readonly { kind: "series-L" | "shunt-C"; value: number; seriesL?: number }[];
    readonly transfer: { zeros: [number, number][]; poles: [number, number][]; gain: number };
  }[];
}

/** The elliptic ladders of test/fixtures/ladder-elliptic.json (orders 3 and 5). */
export function ellipticLadders(): LadderPrototype[] {
  const f = loadFixture<EllipticFixture>("ladder-elliptic.json");
  return f.ladders.map((l) => ({
    family: "elliptic",
    order: l.order,
    form: l.form,
    sourceOhms: l.sourceOhms,
    loadOhms: l.loadOhms,
    elements: l.elements,
    transfer: { zeros: complexList(l.transfer.zeros), poles: complexList(l.transfer.poles), gain: l.transfer.gain },
  }));
}

/** Roots of the circuit's characteristic polynomial in the closed right half-plane (Routh), and the degree. */
export function unstableRoots(circuit: Circuit, output: string, edgeHz: number): { rhp: number; degree: number } {
  const w = 2 * Math.PI * edgeHz;
  const p = circuitPolynomials(circuit, { source: "Vin", output, spanRadS: [w / 1000, w * 1000] }, w);
  if (p === null) throw new Error("singular circuit");
  return { rhp: rightHalfPlaneRoots(p.den), degree: p.den.length - 1 };
}

/**
 * The circuit with every GIC grounded inductor replaced by the inductor it
 * simulates (C4 R1 R3 R5 / R2 of its own parts), so the GIC circuit can be
 * compared with the passive ladder it stands for.
 */
export function gicsAsInductors(ladder: ActiveLadder): Circuit {
  const gic = /^g\d+_/;
  const byName = new Map(ladder.parts.map((p) => [p.name, p]));
  const inGic = (node: string): boolean => gic.test(node);
  const kept = ladder.circuit.elements.filter((e) => (e.kind === "OA" ? !inGic(e.out) : e.kind === "V" || e.kind === "E" ? true : !(inGic(e.a) || inGic(e.b))));
  const inductors: Circuit["elements"][number][] = [];
  // group the GIC parts by their label (everything before ": GIC Z")
  const groups = new Map<string, Record<string, number>>();
  const inputOf = new Map<string, string>();
  for (const e of ladder.circuit.elements) {
    if (e.kind !== "R" && e.kind !== "C") continue;
    const role = byName.get(e.name)?.role ?? "";
    const m = /^(.*): GIC (Z\d)$/.exec(role);
    if (m === null) continue;
    const label = m[1] as string;
    const g = groups.get(label) ?? {};
    g[m[2] as string] = e.value;
    groups.set(label, g);
    if (m[2] === "Z1") inputOf.set(label, e.a);
  }
  let k = 0;
  for (const [label, z] of groups) {
    const henries = ((z["Z4"] as number) * (z["Z1"] as number) * (z["Z3"] as number) * (z["Z5"] as number)) / (z["Z2"] as number);
    inductors.push({ kind: "L", name: `Lsim${++k}`, a: inputOf.get(label) as string, b: "0", value: henries });
  }
  return { title: `${ladder.circuit.title} with inductors`, elements: [...kept, ...inductors] };
}
