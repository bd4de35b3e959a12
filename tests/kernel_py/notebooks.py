"""nbclient executes every notebook in a folder (default notebooks/) with the gaugebook kernel,
plus one notebook built here, so the nbclient path is exercised even when the folder is empty.

Usage: python notebooks.py [--dir notebooks] [--out DIR]
Prints one JSON line; exit code 1 when a notebook fails.
"""
import argparse
import glob
import json
import os
import sys

import nbformat
from nbclient import NotebookClient

BUILT = [
    'let r = q("350 ohm");\nr',
    'print("hello from nbclient")',
    'display(q("2 mV/V"))',
    "fn twice(x) { 2 * x }\ntwice(21)",
]


def run(nb, path_for_errors):
    # Like Jupyter itself, start the kernel in the notebook's folder, so relative data paths
    # resolve the same way in JupyterLab, under nbclient and in `gaugebook nb run`.
    folder = os.path.dirname(os.path.abspath(path_for_errors)) if os.path.exists(path_for_errors) else os.getcwd()
    client = NotebookClient(nb, kernel_name="gaugebook", timeout=120, allow_errors=False,
                            resources={"metadata": {"path": folder}})
    client.execute()
    return nb


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--dir", default="notebooks")
    ap.add_argument("--out", default=None)
    args = ap.parse_args()
    results = {}
    nb = nbformat.v4.new_notebook()
    nb.cells = [nbformat.v4.new_code_cell(c) for c in BUILT]
    run(nb, "<built>")
    outs = nb.cells[3].outputs
    built_ok = (outs and outs[0]["output_type"] == "execute_result"
                and outs[0]["data"]["text/plain"] == "42"
                and nb.cells[1].outputs[0]["text"].startswith("hello from nbclient"))
    results["<built>"] = "ok" if built_ok else "wrong outputs"
    for path in sorted(glob.glob(os.path.join(args.dir, "*.ipynb"))):
        try:
            nb = nbformat.read(path, as_version=4)
            kernel = nb.metadata.get("kernelspec", {}).get("name", "gaugebook")
            if kernel != "gaugebook":
                continue  # a Rust (evcxr) notebook: tests/evcxr.rs runs it with its own kernel
            run(nb, path)
            results[path] = "ok"
            if args.out:
                os.makedirs(args.out, exist_ok=True)
                nbformat.write(nb, os.path.join(args.out, os.path.basename(path)))
        except Exception as e:  # report every notebook, then fail
            results[path] = f"{type(e).__name__}: {str(e)[:500]}"
    ok = all(v == "ok" for v in results.values())
    print(json.dumps({"notebooks": results, "ok": ok}))
    sys.exit(0 if ok else 1)


if __name__ == "__main__":
    main()
