// The sources run unchanged under Deno (imports end in .ts), so notebooks can
// import filterwright straight from src/. These tests check that path, for
// the root entry and the layer entries: no std library imports, so they run
// offline.
import { designFilter, designLcLadder, formatValue, lcLadderNetlist, parseValue, toSpiceNetlist } from "../src/index.ts";
import { butterworth } from "../src/approx/index.ts";
import { eSeries, snapToSeries } from "../src/parts/index.ts";
import { frequencyResponse } from "../src/tf/index.ts";

function assert(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(message);
}

Deno.test("parseValue and formatValue round-trip RKM and SI notation", () => {
  assert(parseValue("4k7") === 4700, "4k7 parses to 4700");
  assert(Math.abs(parseValue("2.2 µF", { unit: "F" }) - 2.2e-6) < 1e-21, "2.2 µF parses");
  assert(parseValue(formatValue(12740, { digits: 4 })) === 12740, "format/parse round trip");
});

Deno.test("butterworth(4) is -3.0103 dB at 1 rad/s", () => {
  const r = frequencyResponse(butterworth(4), new Float64Array([1]));
  const db = 10 * Math.log10((r.re[0] ?? 0) ** 2 + (r.im[0] ?? 0) ** 2);
  assert(Math.abs(db + 3.0102999566398) < 1e-9, `got ${db} dB`);
});

Deno.test("snapToSeries picks the E24 value 4.7k for 4.65k", () => {
  assert(eSeries("E24").length === 24, "E24 has 24 values");
  assert(snapToSeries(4650, { series: "E24", mode: "nearest" }).value === 4700, "nearest E24");
});

Deno.test("designFilter meets a lowpass mask and exports a netlist", () => {
  const result = designFilter({
    response: "lowpass",
    passband: { edgeHz: 1000, maxLossDb: 1 },
    stopband: { edgeHz: 4000, minAttenuationDb: 40 },
  });
  assert(result.verification.meetsSpec, "as-built design meets the mask");
  const netlist = toSpiceNetlist(result);
  assert(/\.ac\s/i.test(netlist) && /\.end\s*$/i.test(netlist.trim() + "\n"), "netlist has .ac and .end");
});

Deno.test("designLcLadder builds a passive 30 MHz lowpass whose boards meet the mask", () => {
  const d = designLcLadder(
    { response: "lowpass", passband: { edgeHz: 30e6, maxLossDb: 1 }, stopband: { edgeHz: 60e6, minAttenuationDb: 45 }, parts: { capacitorSeries: "E24" } },
    { inductorSeries: "E24", inductorTolerance: 0.02, capacitorTolerance: 0.01, inductorQ: 80, boards: 256, seed: 11 },
  );
  assert(d.verification.meetsSpec && d.verification.yield.fraction > 0.95, "the ladder and its boards meet the mask");
  assert(lcLadderNetlist(d).includes(".print ac vdb(out)"), "netlist prints vdb(out)");
});
