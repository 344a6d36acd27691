// The whole design pipeline for an 8th-order lowpass: family sizing, prototype,
// placement in the slack, sections, gain distribution, topology choice,
// preferred values with joint re-tuning, and the as-built check against the
// mask (dense mask grids plus the 256-point response curve stored in the result).
// No python reference: scipy has no part-level design, so a ratio against its
// order/prototype/sos steps alone would compare different work.
import { designFilter } from "../dist/design/index.js";

const spec = {
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
};

export const benchmarks = [
  {
    name: "designFilter: 8th-order Chebyshev I lowpass, full pipeline incl. verification (256-point curve)",
    fn: () => designFilter(spec),
    note: "no scipy equivalent (scipy stops at the transfer function)",
  },
];
