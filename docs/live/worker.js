// Runs one design off the page's thread and sends back what the page shows:
// the design's notebook bundle (verdict and stage table), two plots and the
// export files as text. Progress reports come as they happen; an error comes
// back as its name, code, field path and message.
import { designFilter, toSvgPlot, toSpiceNetlist, toBomCsv, toJson, toMarkdown, toCurveCsv } from "./lib/index.js";

self.onmessage = (event) => {
  const { id, spec } = event.data;
  try {
    const result = designFilter(spec, { onProgress: (p) => self.postMessage({ id, progress: p.message }) });
    const bundle = result[Symbol.for("Jupyter.display")]();
    self.postMessage({
      id,
      ok: true,
      meets: result.verification.boardsMeetSpec,
      html: bundle["text/html"],
      magnitude: toSvgPlot(result, { kind: "magnitude" }),
      delay: toSvgPlot(result, { kind: "group-delay" }),
      files: {
        "filter.cir": toSpiceNetlist(result),
        "bom.csv": toBomCsv(result),
        "design.json": toJson(result),
        "report.md": toMarkdown(result),
        "curves.csv": toCurveCsv(result),
      },
    });
  } catch (e) {
    self.postMessage({ id, ok: false, name: e?.name ?? "Error", code: e?.code, path: e?.path, message: String(e?.message ?? e) });
  }
};
