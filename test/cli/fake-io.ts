import type { CliIo } from "../../src/cli/run.ts";

/** Captured streams and an in-memory file system for runCli. */
export type FakeIo = CliIo & { out: string; err: string; files: Record<string, string> };

/** An I/O object whose streams are captured and whose files live in memory (reading a missing one throws as Node does). */
export function fakeIo(files: Record<string, string> = {}, overrides: Partial<CliIo> = {}): FakeIo {
  const io: FakeIo = {
    out: "",
    err: "",
    files: { ...files },
    stdout: (t: string) => {
      io.out += t;
    },
    stderr: (t: string) => {
      io.err += t;
    },
    readFile: (p: string) => {
      const t = io.files[p];
      if (t === undefined) throw Object.assign(new Error(`ENOENT: no such file or directory, open '${p}'`), { code: "ENOENT" });
      return t;
    },
    readStdin: () => {
      const t = io.files["<stdin>"];
      if (t === undefined) throw Object.assign(new Error("EAGAIN: resource temporarily unavailable, read"), { code: "EAGAIN" });
      return t;
    },
    writeFile: (p: string, t: string) => {
      io.files[p] = t;
    },
    ...overrides,
  };
  return io;
}
