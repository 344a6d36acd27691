import { it } from "vitest";
import { designFilter } from "../../src/design/index.ts";
it("s", () => {
  const specs: any[] = [
    { response: "lowpass", passband: { edgeHz: 20, maxLossDb: 0.5 }, stopband: { edgeHz: 50, minAttenuationDb: 45 } },
    { response: "highpass", passband: { edgeHz: 30, maxLossDb: 1 }, stopband: { edgeHz: 12, minAttenuationDb: 30 } },
    { response: "lowpass", passband: { edgeHz: 20000, maxLossDb: 0.5 }, stopband: { edgeHz: 40000, minAttenuationDb: 40 }, opamp: { a0: 1e5, gbwHz: 2e6 } },
  ];
  for (const s of specs) { const r = designFilter(s); console.log(r.family, r.order, r.stages.map((x) => x.topology).join(" ")); }
});
