/**
 * The command line's failures: a {@link CliProblem} is one line for the user
 * (exit code 2), and the plain-words reasons of file-system errors.
 *
 * @module
 */

/** One thing wrong with the command line, said in one line that names the flag and what to type. */
export class CliProblem extends Error {
  /** @param message - the line printed after `filterwright: ` */
  constructor(message: string) {
    super(message);
    this.name = "CliProblem";
  }
}

/** Several problems found at once, each printed on its own line. */
export class CliProblems extends Error {
  /** The lines, in the order found. */
  readonly lines: readonly string[];
  /** @param lines - one line per problem (at least one) */
  constructor(lines: readonly string[]) {
    super(lines.join("; "));
    this.name = "CliProblems";
    this.lines = [...lines];
  }
}

/** Node's error codes of file access, said in plain words (reading and writing differ only for a missing path). */
const REASONS: Readonly<Record<string, string>> = {
  EACCES: "permission denied",
  EPERM: "the operation is not permitted",
  EISDIR: "it is a folder, not a file",
  ENOTDIR: "a part of the path is a file, not a folder",
  EROFS: "the file system is read-only",
  ENOSPC: "there is no space left on the device",
  EDQUOT: "the disk quota is used up",
  ENAMETOOLONG: "the name is too long",
  EMFILE: "too many files are open",
  ENFILE: "too many files are open",
  EBUSY: "the file is in use",
  ELOOP: "the path has too many symbolic links (a loop?)",
  EEXIST: "a file of that name is in the way",
  EINVAL: "the name is not a valid path",
  EIO: "the device reported an input/output error",
};

/** The error code of a file-system error (`err.code`, or a leading `ECODE:` in the message), if any. */
function errorCode(e: unknown): string | undefined {
  if (typeof e === "object" && e !== null) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && /^E[A-Z]+$/.test(code)) return code;
  }
  const m = /^(E[A-Z]{2,})\b/.exec(e instanceof Error ? e.message : String(e));
  return m?.[1];
}

/**
 * Why a file could not be read or written, in plain words with the system's
 * code in brackets, e.g. `the folder it goes in does not exist (ENOENT)`.
 *
 * @param e - what the file access threw
 * @param writing - whether the file was being written (a missing path means a missing folder)
 * @returns the reason, without a trailing full stop
 */
export function ioReason(e: unknown, writing: boolean): string {
  const code = errorCode(e);
  if (code === "ENOENT") return `${writing ? "the folder it goes in does not exist" : "there is no such file"} (ENOENT)`;
  if (code !== undefined && REASONS[code] !== undefined) return `${REASONS[code]} (${code})`;
  const text = e instanceof Error ? e.message : String(e);
  return text.split("\n")[0] ?? "unknown reason";
}
