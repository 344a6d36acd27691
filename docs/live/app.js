// The live page: reads the form into a filterwright spec, designs it in a
// worker (so the page stays responsive and the run can be cancelled), and
// shows the verdict, the stage table, the plots and the downloads.
const form = document.getElementById("spec");
const status = document.getElementById("status");
const errorBox = document.getElementById("error");
const resultBox = document.getElementById("result");
const cancel = document.getElementById("cancel");
const designButton = document.getElementById("design");

let worker = null;
let runId = 0;
const urls = [];

/** "1k, 4k" -> ["1k", "4k"]; one edge stays a single value. */
function edges(text) {
  const parts = text.split(",").map((s) => s.trim()).filter((s) => s.length > 0);
  return parts.length === 1 ? parts[0] : parts;
}

/** Numbers typed in a form field, with engineering suffixes left for the library to parse. */
function number(text) {
  const t = text.trim();
  return /^[-+]?[0-9]*\.?[0-9]+(e[-+]?[0-9]+)?$/i.test(t) ? Number(t) : t;
}

function specFromForm() {
  const f = new FormData(form);
  const gbw = String(f.get("gbwHz")).trim();
  return {
    response: f.get("response"),
    passband: { edgeHz: edges(String(f.get("passEdge"))), maxLossDb: number(String(f.get("maxLossDb"))) },
    stopband: { edgeHz: edges(String(f.get("stopEdge"))), minAttenuationDb: number(String(f.get("minAttenuationDb"))) },
    gain: { db: number(String(f.get("gainDb"))) },
    parts: { resistorSeries: f.get("resistorSeries"), capacitorSeries: f.get("capacitorSeries") },
    opamp: gbw === "ideal" ? "ideal" : { gbwHz: number(gbw), a0: number(String(f.get("a0"))) },
    yieldTarget: number(String(f.get("yieldPercent"))) / 100,
  };
}

function stop() {
  if (worker !== null) worker.terminate();
  worker = null;
  cancel.disabled = true;
  designButton.disabled = false;
}

function download(name, text) {
  const type = name.endsWith(".json") ? "application/json" : name.endsWith(".csv") ? "text/csv" : "text/plain";
  const url = URL.createObjectURL(new Blob([text], { type }));
  urls.push(url);
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  a.textContent = name;
  return a;
}

/** The comparison table (built from text, no HTML from the worker). */
function showComparison(c) {
  const box = document.getElementById("realisations");
  box.hidden = c === null;
  if (c === null) return;
  const pc = (x) => `${(100 * x).toFixed(1)} %`;
  const table = document.createElement("table");
  const head = table.createTHead().insertRow();
  for (const h of ["realisation", "op-amps", "resistors and capacitors", "yield", "95 % interval"]) head.insertCell().outerHTML = `<th>${h}</th>`;
  const body = table.createTBody();
  for (const r of c.rows) {
    const tr = body.insertRow();
    if (r.chosen) tr.className = "chosen";
    for (const cell of [r.method, String(r.opamps), String(r.parts), pc(r.yield), `${pc(r.lower95)} – ${pc(r.upper95)}`]) tr.insertCell().textContent = cell;
  }
  const reason = document.createElement("p");
  reason.textContent = `Choice: ${c.reason}${c.rows.findIndex((r) => r.chosen) > 0 ? " The netlist and BOM below are of this realisation." : ""}`;
  const skipped = c.skipped.map((t) => {
    const p = document.createElement("p");
    p.textContent = `Not built: ${t}`;
    return p;
  });
  box.replaceChildren(table, reason, ...skipped);
}

function show(msg) {
  for (const u of urls.splice(0)) URL.revokeObjectURL(u);
  document.getElementById("summary").innerHTML = msg.html;
  document.getElementById("plot-magnitude").innerHTML = msg.magnitude;
  document.getElementById("plot-delay").innerHTML = msg.delay;
  showComparison(msg.comparison);
  const links = document.getElementById("downloads");
  links.replaceChildren("Downloads: ", ...Object.entries(msg.files).map(([n, t]) => download(n, t)));
  resultBox.hidden = false;
  resultBox.dataset.meets = String(msg.meets);
}

form.addEventListener("submit", (event) => {
  event.preventDefault();
  stop();
  errorBox.hidden = true;
  const id = ++runId;
  const started = performance.now();
  worker = new Worker(new URL("worker.js", import.meta.url), { type: "module" });
  worker.onmessage = ({ data }) => {
    if (data.id !== id) return;
    if (data.progress !== undefined) {
      status.textContent = data.progress;
      return;
    }
    stop();
    const seconds = ((performance.now() - started) / 1000).toFixed(1);
    if (data.ok) {
      show(data);
      status.textContent = `designed in ${seconds} s`;
    } else {
      resultBox.hidden = true;
      errorBox.hidden = false;
      errorBox.textContent = `${data.name}${data.path ? ` (${data.path})` : ""}: ${data.message}`;
      status.textContent = "";
    }
    document.body.dataset.state = data.ok ? "done" : "error";
  };
  worker.onerror = (e) => {
    stop();
    errorBox.hidden = false;
    errorBox.textContent = `The page could not load the library: ${e.message}`;
    document.body.dataset.state = "error";
  };
  document.body.dataset.state = "running";
  status.textContent = "designing…";
  cancel.disabled = false;
  designButton.disabled = true;
  worker.postMessage({ id, spec: specFromForm(), compare: form.elements.namedItem("compare").checked });
});

cancel.addEventListener("click", () => {
  stop();
  status.textContent = "cancelled";
  document.body.dataset.state = "cancelled";
});
document.body.dataset.state = "ready";
