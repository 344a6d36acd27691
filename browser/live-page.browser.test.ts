/**
 * The live page of the docs site (docs/live/), driven in headless Chromium:
 * it loads the ES-module build with no bundler, designs a filter from its
 * form in a worker, shows the verdict, stage table and plots, offers the
 * downloads, and reports a bad field by its path. With UPDATE_SCREENSHOTS=1
 * the screenshot is written to docs/images/live-page.png.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { requireChromium } from "./chromium.ts";
import { launchChromium, type Browser } from "./devtools.ts";
import { decodePng, inkStats } from "./png.ts";
import { serve } from "./static-server.ts";

const ROOT = resolve(import.meta.dirname, "..");

describe.skipIf(!requireChromium())("live page", () => {
  let browser: Browser;
  let server: { url: string; close: () => Promise<void> };

  beforeAll(async () => {
    const site = mkdtempSync(join(tmpdir(), "filterwright-live-"));
    execFileSync("node", [join(ROOT, "scripts", "build-live-page.mjs"), site], { stdio: "pipe" });
    server = await serve(site);
    browser = await launchChromium();
    await browser.page.viewport(1280, 900);
    await browser.page.goto(`${server.url}/index.html`);
    await browser.page.waitFor(`document.body.dataset.state === "ready"`);
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  const fill = (fields: Record<string, string>): string =>
    Object.entries(fields)
      .map(([k, v]) => `document.querySelector('[name="${k}"]').value = ${JSON.stringify(v)};`)
      .join("\n");

  it("designs a bandpass from the form and shows the verdict, the stages, the plots and the downloads", async () => {
    const page = browser.page;
    // A 40 kHz ultrasonic receiver's band filter (our own scenario).
    await page.evaluate(`${fill({ response: "bandpass", passEdge: "35k, 45k", maxLossDb: "1", stopEdge: "20k, 80k", minAttenuationDb: "30", gbwHz: "20M", a0: "2e5", yieldPercent: "90" })} document.getElementById("design").click(); true`);
    await page.waitFor(`["done", "error"].includes(document.body.dataset.state)`, 120_000);
    expect(await page.evaluate<string>(`document.body.dataset.state`)).toBe("done");
    const summary = await page.evaluate<string>(`document.getElementById("summary").textContent`);
    expect(summary).toMatch(/^Bandpass filter: \w+, \d+ poles/);
    expect(summary).toMatch(/(Meets|Does NOT meet) the spec: the design .* of boards/);
    const rows = await page.evaluate<number>(`document.querySelectorAll("#summary tbody tr").length`);
    expect(rows).toBeGreaterThanOrEqual(2);
    expect(await page.evaluate<number>(`document.querySelectorAll(".plots svg").length`)).toBe(2);
    const names = await page.evaluate<string[]>(`[...document.querySelectorAll("#downloads a")].map((a) => a.download)`);
    expect(names).toEqual(["filter.cir", "bom.csv", "design.json", "report.md", "curves.csv"]);
    const netlist = await page.evaluate<string>(`fetch(document.querySelector('#downloads a[download="filter.cir"]').href).then((r) => r.text())`);
    expect(netlist.split("\n")[0]).toMatch(/^filterwright /); // the SPICE title line
    expect(netlist).toMatch(/\.end\s*$/);
    const bom = await page.evaluate<string>(`fetch(document.querySelector('#downloads a[download="bom.csv"]').href).then((r) => r.text())`);
    expect(bom.split("\n")[0]).toContain("designators");
    // No part of the page overflows the viewport's width.
    expect(await page.evaluate<number>(`document.documentElement.scrollWidth`)).toBeLessThanOrEqual(1280);
    const shot = await page.screenshot(0.6);
    const ink = inkStats(decodePng(shot));
    expect(ink.colours).toBeGreaterThan(50);
    expect(ink.inkFraction).toBeGreaterThan(0.05);
    if (process.env["UPDATE_SCREENSHOTS"] === "1") writeFileSync(join(ROOT, "docs", "images", "live-page.png"), shot);
    expect(page.problems).toEqual([]);
  });

  it("compares a sharp lowpass's cascade with its active ladders and offers the chosen board's netlist", async () => {
    const page = browser.page;
    // The sonar receiver's anti-alias lowpass of examples/notebooks (our own scenario), left to the automatic family.
    await page.evaluate(`${fill({ response: "lowpass", passEdge: "18k", maxLossDb: "0.25", stopEdge: "26k", minAttenuationDb: "33", gbwHz: "ideal", yieldPercent: "50" })} document.querySelector('[name="compare"]').checked = true; document.getElementById("design").click(); true`);
    await page.waitFor(`["done", "error"].includes(document.body.dataset.state)`, 120_000);
    expect(await page.evaluate<string>(`document.body.dataset.state`)).toBe("done");
    const methods = await page.evaluate<string[]>(`[...document.querySelectorAll("#realisations tbody tr td:first-child")].map((td) => td.textContent)`);
    expect(methods[0]).toBe("biquad-cascade");
    expect(methods.length).toBeGreaterThanOrEqual(2);
    expect(await page.evaluate<number>(`document.querySelectorAll("#realisations tr.chosen").length`)).toBe(1);
    const reason = await page.evaluate<string>(`document.querySelector("#realisations p").textContent`);
    expect(reason).toMatch(/^Choice: the /);
    const chosen = await page.evaluate<string>(`document.querySelector("#realisations tr.chosen td").textContent`);
    const netlist = await page.evaluate<string>(`fetch(document.querySelector('#downloads a[download="filter.cir"]').href).then((r) => r.text())`);
    if (chosen === "biquad-cascade") expect(netlist).not.toContain("as an active ladder");
    else expect(netlist).toContain(`as an active ladder (${chosen}`);
    await page.evaluate(`document.querySelector('[name="compare"]').checked = false; true`);
    expect(page.problems).toEqual([]);
  });

  it("names the bad field when the form holds an impossible value", async () => {
    const page = browser.page;
    await page.evaluate(`${fill({ response: "lowpass", passEdge: "-2k", stopEdge: "8k" })} document.getElementById("design").click(); true`);
    await page.waitFor(`["done", "error"].includes(document.body.dataset.state)`, 60_000);
    expect(await page.evaluate<string>(`document.body.dataset.state`)).toBe("error");
    const text = await page.evaluate<string>(`document.getElementById("error").textContent`);
    expect(text).toContain("SpecError");
    expect(text).toContain("passband.edgeHz");
    expect(await page.evaluate<boolean>(`document.getElementById("result").hidden`)).toBe(true);
  });
});
