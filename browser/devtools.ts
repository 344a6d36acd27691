/**
 * A headless Chromium (found by ./chromium.ts) driven over the DevTools
 * protocol, for pages that must be clicked and waited on, with no dependency:
 * Node's WebSocket client (global in Node 22, `--experimental-websocket` in
 * Node 20; the browser config sets it) and Debian's `chromium` package.
 *
 * Reference: Chrome DevTools Protocol, domains Page, Runtime and Emulation
 * (chromedevtools.github.io/devtools-protocol).
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CHROMIUM_FLAGS, chromiumBinary } from "./chromium.ts";

interface Pending {
  resolve: (v: Record<string, unknown>) => void;
  reject: (e: Error) => void;
}

/** One page of a running browser. */
export class Page {
  private next = 1;
  private readonly pending = new Map<number, Pending>();
  private readonly listeners: ((method: string, params: Record<string, unknown>) => void)[] = [];
  /** Console messages and uncaught exceptions seen on the page. */
  readonly problems: string[] = [];

  constructor(private readonly ws: WebSocket) {
    ws.addEventListener("message", (ev) => {
      const msg = JSON.parse(String(ev.data)) as { id?: number; result?: Record<string, unknown>; error?: { message: string }; method?: string; params?: Record<string, unknown> };
      if (msg.id !== undefined) {
        const p = this.pending.get(msg.id);
        this.pending.delete(msg.id);
        if (msg.error !== undefined) p?.reject(new Error(msg.error.message));
        else p?.resolve(msg.result ?? {});
      } else if (msg.method !== undefined) {
        for (const l of this.listeners) l(msg.method, msg.params ?? {});
      }
    });
    this.listeners.push((method, params) => {
      if (method === "Runtime.exceptionThrown") {
        const d = params["exceptionDetails"] as { text?: string; exception?: { description?: string } };
        this.problems.push(`exception: ${d.exception?.description ?? d.text ?? "?"}`);
      }
      if (method === "Runtime.consoleAPICalled" && params["type"] === "error") {
        this.problems.push(`console.error: ${JSON.stringify(params["args"])}`);
      }
    });
  }

  /** Send one protocol command. */
  send(method: string, params: Record<string, unknown> = {}): Promise<Record<string, unknown>> {
    const id = this.next++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.ws.send(JSON.stringify({ id, method, params }));
    });
  }

  /** Evaluate an expression in the page (promises awaited) and return its value. */
  async evaluate<T>(expression: string): Promise<T> {
    const r = (await this.send("Runtime.evaluate", { expression, awaitPromise: true, returnByValue: true })) as {
      result: { value?: T };
      exceptionDetails?: { text: string; exception?: { description?: string } };
    };
    if (r.exceptionDetails !== undefined) throw new Error(`in the page: ${r.exceptionDetails.exception?.description ?? r.exceptionDetails.text}`);
    return r.result.value as T;
  }

  /** Load a URL and wait for its load event. */
  async goto(url: string): Promise<void> {
    const loaded = new Promise<void>((resolve) => {
      this.listeners.push((method) => {
        if (method === "Page.loadEventFired") resolve();
      });
    });
    await this.send("Page.navigate", { url });
    await loaded;
  }

  /** Poll an expression until it is truthy (or throw after `timeoutMs`). */
  async waitFor(expression: string, timeoutMs = 60_000): Promise<void> {
    const end = Date.now() + timeoutMs;
    while (Date.now() < end) {
      if (await this.evaluate<boolean>(`Boolean(${expression})`)) return;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`timed out after ${timeoutMs} ms waiting for ${expression}`);
  }

  /** Set the viewport size (CSS pixels, scale 1). */
  async viewport(width: number, height: number): Promise<void> {
    await this.send("Emulation.setDeviceMetricsOverride", { width, height, deviceScaleFactor: 1, mobile: false });
  }

  /** A PNG screenshot of the whole page, scaled by `scale` (0.6 gives a small image for the docs). */
  async screenshot(scale = 1): Promise<Buffer> {
    const size = await this.evaluate<{ w: number; h: number }>(`({ w: document.documentElement.scrollWidth, h: document.documentElement.scrollHeight })`);
    const r = (await this.send("Page.captureScreenshot", {
      format: "png",
      captureBeyondViewport: true,
      clip: { x: 0, y: 0, width: size.w, height: size.h, scale },
    })) as { data: string };
    return Buffer.from(r.data, "base64");
  }
}

/** A running headless browser with one page. */
export interface Browser {
  readonly page: Page;
  close(): Promise<void>;
}

/**
 * Start headless Chromium with a fresh profile and no background networking,
 * and attach to its first page.
 *
 * @returns the browser
 */
export async function launchChromium(): Promise<Browser> {
  const bin = chromiumBinary();
  if (bin === null) throw new Error("Chromium is required (the CI environment variable is set) but was not found on the PATH; apt-get install -y chromium");
  const profile = mkdtempSync(join(tmpdir(), "filterwright-chromium-"));
  const child: ChildProcess = spawn(
    bin,
    [
      ...CHROMIUM_FLAGS,
      `--user-data-dir=${profile}`,
      "--remote-debugging-port=0",
      "about:blank",
    ],
    { stdio: ["ignore", "ignore", "pipe"] },
  );
  const port = await new Promise<number>((resolve, reject) => {
    let err = "";
    const t = setTimeout(() => reject(new Error(`Chromium did not start: ${err.slice(-500)}`)), 30_000);
    child.stderr?.on("data", (d: Buffer) => {
      err += d.toString();
      const m = /DevTools listening on ws:\/\/[^:]+:(\d+)\//.exec(err);
      if (m !== null) {
        clearTimeout(t);
        resolve(Number(m[1]));
      }
    });
    child.on("exit", (code) => reject(new Error(`Chromium exited (${code}): ${err.slice(-500)}`)));
  });
  const targets = (await (await fetch(`http://127.0.0.1:${port}/json/list`)).json()) as { type: string; webSocketDebuggerUrl: string }[];
  const target = targets.find((t) => t.type === "page");
  if (target === undefined) throw new Error("Chromium has no page target");
  const ws = new WebSocket(target.webSocketDebuggerUrl);
  await new Promise<void>((resolve, reject) => {
    ws.addEventListener("open", () => resolve());
    ws.addEventListener("error", () => reject(new Error("could not connect to Chromium's DevTools endpoint")));
  });
  const page = new Page(ws);
  await page.send("Page.enable");
  await page.send("Runtime.enable");
  return {
    page,
    close: async () => {
      ws.close();
      child.kill("SIGKILL");
      await new Promise((r) => setTimeout(r, 200));
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
