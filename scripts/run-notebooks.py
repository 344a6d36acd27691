#!/usr/bin/python3
"""Execute every example notebook (examples/notebooks/*.ipynb, or the paths given) headless with
the Deno Jupyter kernel and check it: no cell raised, and every cell that
names the outputs it must show (metadata.filterwright.expect: MIME types, or
"stream" for printed text) shows them. Exits 1 naming the notebook and cell.

The kernel is driven through jupyter_client rather than nbconvert: Deno's
kernel sometimes reports "idle" before the cell's result message, and a client
that stops reading at "idle" then drops the result (seen here in 4 of 9
nbconvert runs). This runner reads until the cell's execute_reply and idle
have both arrived, then keeps reading until the channel has been quiet for
GRACE_S seconds.

Needs Debian's jupyter-client and python3-ipykernel and `npx deno jupyter
--install` (the .ci/run step does both). With --write, the executed notebooks
(with their outputs) are written back beside the sources.
"""
import json
import pathlib
import queue
import sys
import time

from jupyter_client.manager import start_new_kernel

ROOT = pathlib.Path(__file__).resolve().parent.parent
BOOKS = sorted((ROOT / "examples" / "notebooks").glob("*.ipynb"))
CELL_TIMEOUT_S = 300
GRACE_S = 1.0


def run_cell(kc, code):
    """Execute one cell; return its outputs as nbformat output dicts."""
    msg_id = kc.execute(code, store_history=True)
    outputs, replied, idle = [], False, False
    deadline = time.time() + CELL_TIMEOUT_S
    quiet_since = None
    while time.time() < deadline:
        if not replied:
            try:
                reply = kc.get_shell_msg(timeout=0.05)
                if reply["parent_header"].get("msg_id") == msg_id:
                    replied = True
            except queue.Empty:
                pass
        try:
            msg = kc.get_iopub_msg(timeout=0.1)
        except queue.Empty:
            if replied and idle:
                quiet_since = quiet_since or time.time()
                if time.time() - quiet_since >= GRACE_S:
                    return outputs
            continue
        quiet_since = None
        if msg["parent_header"].get("msg_id") != msg_id:
            continue
        kind, content = msg["msg_type"], msg["content"]
        if kind == "status" and content["execution_state"] == "idle":
            idle = True
        elif kind == "stream":
            outputs.append({"output_type": "stream", "name": content["name"], "text": content["text"]})
        elif kind in ("execute_result", "display_data"):
            outputs.append({"output_type": kind, "data": content["data"], "metadata": content.get("metadata", {})})
        elif kind == "error":
            outputs.append({"output_type": "error", "ename": content["ename"], "evalue": content["evalue"], "traceback": content["traceback"]})
    raise TimeoutError(f"cell did not finish within {CELL_TIMEOUT_S} s")


def run_book(path, write):
    nb = json.loads(path.read_text())
    problems, shown = [], 0
    km, kc = start_new_kernel(kernel_name="deno", cwd=str(path.parent))
    try:
        for i, cell in enumerate(nb["cells"]):
            if cell["cell_type"] != "code":
                continue
            code = "".join(cell["source"]) if isinstance(cell["source"], list) else cell["source"]
            outputs = run_cell(kc, code)
            cell["outputs"] = outputs
            for o in outputs:
                if o["output_type"] == "error":
                    problems.append(f"{path.name} cell {i}: {o['ename']}: {o['evalue']}")
            kinds = {k for o in outputs for k in (["stream"] if o["output_type"] == "stream" else o.get("data", {}).keys())}
            for want in cell.get("metadata", {}).get("filterwright", {}).get("expect", []):
                if want in kinds:
                    shown += 1
                else:
                    problems.append(f"{path.name} cell {i}: expected a {want} output, got {', '.join(sorted(kinds)) or 'none'}")
    finally:
        kc.stop_channels()
        km.shutdown_kernel(now=True)
    if write:
        path.write_text(json.dumps(nb, indent=1) + "\n")
    return problems, shown


def main():
    write = "--write" in sys.argv[1:]
    given = [pathlib.Path(a).resolve() for a in sys.argv[1:] if not a.startswith("--")]
    books = given or BOOKS
    if not books:
        print("no notebooks in examples/notebooks", file=sys.stderr)
        return 1
    problems = []
    for book in books:
        t0 = time.time()
        p, shown = run_book(book, write)
        problems += p
        print(f"{book.name}: executed in {time.time() - t0:.1f} s, {shown} expected outputs shown")
    if problems:
        print("\n".join(problems), file=sys.stderr)
        return 1
    print(f"{len(books)} notebook(s) passed")
    return 0


if __name__ == "__main__":
    sys.exit(main())
