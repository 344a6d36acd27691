// Runs one design off the page's thread and sends back what the page shows:
// the design's notebook bundle (verdict and stage table), two plots, the
// comparison with active ladders when asked (the netlist and BOM are then of
// the chosen realisation) and the export files as text. Progress reports come as they happen; an error comes
// back as its name, code, field path and message.
import { designFilter, compareRealisations, toSvgPlot, toSpiceNetlist, toBomCsv, toJson, toMarkdown, toCurveCsv } from "./lib/index.js";

self.onmessage = (event) => {
  const { id, spec, compare } = event.data;
  try {
    const result = designFilter(spec, { onProgress: (p) => self.postMessage({ id, progress: p.message }) });
    const bundle = result[Symbol.for("Jupyter.display")]();
    let comparison = null;
    let realisation = {};
    let markdownOptions = {};
    if (compare) {
      self.postMessage({ id, progress: "comparing with active ladders on 1000 boards" });
      const c = compareRealisations(result, { runs: 1000 });
      comparison = {
        rows: c.candidates.map((k, i) => ({ method: k.method, opamps: k.opamps, parts: k.parts, yield: k.yield, lower95: k.lower95, upper95: k.upper95, chosen: i === c.chosen })),
        skipped: c.skipped.map((k) => `${k.method}: ${k.reason}`),
        reason: c.reason,
      };
      realisation = { realisation: c.candidates[c.chosen] };
      markdownOptions = { realisations: c };
    }
    self.postMessage({
      id,
      ok: true,
      meets: result.verification.boardsMeetSpec,
      html: bundle["text/html"],
      magnitude: toSvgPlot(result, { kind: "magnitude" }),
      delay: toSvgPlot(result, { kind: "group-delay" }),
      comparison,
      files: {
        "filter.cir": toSpiceNetlist(result, realisation),
        "bom.csv": toBomCsv(result, realisation),
        "design.json": toJson(result),
        "report.md": toMarkdown(result, markdownOptions),
        "curves.csv": toCurveCsv(result),
      },
    });
  } catch (e) {
    self.postMessage({ id, ok: false, name: e?.name ?? "Error", code: e?.code, path: e?.path, message: String(e?.message ?? e) });
  }
};
