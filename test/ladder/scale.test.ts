import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { LADDER_RESPONSES, scaleLadder, type LadderForm, type LadderPrototype, type ScaleLadderOptions } from "../../src/ladder/index.ts";
import { butterworthLadder, chebyshevLadder, ellipticLadder } from "./prototypes.ts";
import { ladderGridHz, worstAgainst } from "./grid.ts";

/** Down to -100 dB the double-precision nodal solve itself stays within 4e-10 dB (measured); below it, its rounding grows with the attenuation. */
const FLOOR_DB = -100;

const FORMS: readonly LadderForm[] = ["shunt-first", "series-first"];

const prototypes: [string, LadderPrototype][] = [];
for (const form of FORMS) {
  for (const n of [1, 2, 3, 4, 5, 7, 8, 10]) prototypes.push([`butterworth ${n} ${form}`, butterworthLadder(n, form)]);
  for (const n of [2, 3, 4, 5, 6, 9]) prototypes.push([`chebyshev1 ${n} 0.5 dB ${form}`, chebyshevLadder(n, 0.5, form)]);
  prototypes.push([`chebyshev1 4 2 dB ${form}`, chebyshevLadder(4, 2, form)]);
  prototypes.push([`elliptic 3 ${form}`, ellipticLadder(form)]);
}

const targets: [string, ScaleLadderOptions][] = [
  ["lowpass 10 kHz, 50 ohm source", { response: "lowpass", edgeHz: 10e3, sourceOhms: 50 }],
  ["highpass 2.2 MHz, 75 ohm load", { response: "highpass", edgeHz: 2.2e6, loadOhms: 75 }],
  ["bandpass 9-11 kHz edges, 600 ohm source", { response: "bandpass", edgeHz: [9e3, 11e3], sourceOhms: 600 }],
  ["bandpass 10.7 MHz centre, 330 kHz wide", { response: "bandpass", centreHz: 10.7e6, bandwidthHz: 330e3, sourceOhms: 50 }],
  ["bandstop 100 kHz centre, 30 kHz wide", { response: "bandstop", centreHz: 100e3, bandwidthHz: 30e3, sourceOhms: 1e3 }],
];

describe("scaleLadder: the nodal response equals the transformed prototype transfer", () => {
  for (const [tname, options] of targets) {
    it.each(prototypes)(`${tname}: %s`, (_name, prototype) => {
      const ladder = scaleLadder(prototype, options);
      const f = ladderGridHz(ladder);
      const w = worstAgainst(ladder, ladder.transfer, f, FLOOR_DB);
      expect(w.points).toBeGreaterThan(200);
      expect(w.db).toBeLessThan(1e-9);
      expect(w.complex).toBeLessThan(2e-10);
    });
  }
});

describe("scaleLadder: any band and terminations (property)", () => {
  it("the nodal response equals the transfer at random frequencies for random ladders, bands and source resistances", () => {
    const ladder = fc.oneof(
      fc.record({ n: fc.integer({ min: 1, max: 9 }), form: fc.constantFrom(...FORMS) }).map(({ n, form }) => butterworthLadder(n, form)),
      fc
        .record({ n: fc.integer({ min: 2, max: 9 }), ripple: fc.double({ min: 0.01, max: 3, noNaN: true }), form: fc.constantFrom(...FORMS) })
        .map(({ n, ripple, form }) => chebyshevLadder(n, ripple, form)),
      fc.constantFrom(...FORMS).map((form) => ellipticLadder(form)),
    );
    const target = fc.record({
      response: fc.constantFrom(...LADDER_RESPONSES),
      fHz: fc.double({ min: 1, max: 1e9, noNaN: true }),
      fractional: fc.double({ min: 0.01, max: 2, noNaN: true }),
      ohms: fc.double({ min: 1, max: 1e5, noNaN: true }),
    });
    fc.assert(
      fc.property(ladder, target, fc.array(
          // off the band centre itself, where a lossless bandstop ladder's resonators leave the nodal equations singular
          fc.double({ min: -1, max: 1, noNaN: true }).filter((x) => Math.abs(x) > 1e-4),
          { minLength: 5, maxLength: 5 },
        ), (p, t, at) => {
        const band = t.response === "bandpass" || t.response === "bandstop";
        const options: ScaleLadderOptions = band
          ? { response: t.response, centreHz: t.fHz, bandwidthHz: t.fHz * t.fractional, sourceOhms: t.ohms }
          : { response: t.response, edgeHz: t.fHz, sourceOhms: t.ohms };
        const l = scaleLadder(p, options);
        const spread = band ? 1 + 2 * t.fractional : 10;
        const f = Float64Array.from(at, (x) => t.fHz * spread ** x);
        const w = worstAgainst(l, l.transfer, f, FLOOR_DB);
        expect(w.db).toBeLessThan(1e-9);
      }),
      { numRuns: 60 },
    );
  });
});
