"""Executes one Rust notebook with the evcxr_jupyter kernel through nbclient and writes the
executed copy, so tests/evcxr.rs can check its outputs.

Usage: python run_notebook.py NOTEBOOK OUT [--kernel rust] [--timeout SECONDS]
Prints one JSON line: total and per-cell seconds (from nbclient's execution timestamps).
"""
import argparse
import datetime
import json
import os
import sys
import time

import nbformat
from nbclient import NotebookClient


def seconds(cell):
    t = cell.get("metadata", {}).get("execution", {})
    a, b = t.get("iopub.execute_input"), t.get("shell.execute_reply")
    if not (a and b):
        return None
    parse = lambda s: datetime.datetime.fromisoformat(s.replace("Z", "+00:00"))
    return round((parse(b) - parse(a)).total_seconds(), 2)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("notebook")
    ap.add_argument("out")
    ap.add_argument("--kernel", default="rust")
    ap.add_argument("--timeout", type=int, default=1200)
    args = ap.parse_args()
    nb = nbformat.read(args.notebook, as_version=4)
    # Like Jupyter, start the kernel in the notebook's folder: the `:dep ... path = ".."` line
    # then names the crate.
    folder = os.path.dirname(os.path.abspath(args.notebook))
    client = NotebookClient(nb, kernel_name=args.kernel, timeout=args.timeout,
                            startup_timeout=120, allow_errors=False, record_timing=True,
                            resources={"metadata": {"path": folder}})
    start = time.monotonic()
    error = None
    try:
        client.execute()
    except Exception as e:  # keep the partial notebook for the report
        error = f"{type(e).__name__}: {str(e)[:2000]}"
    total = round(time.monotonic() - start, 2)
    os.makedirs(os.path.dirname(os.path.abspath(args.out)), exist_ok=True)
    nbformat.write(nb, args.out)
    cells = [{"id": c.get("id"), "seconds": seconds(c)} for c in nb.cells if c.cell_type == "code"]
    print(json.dumps({"ok": error is None, "error": error, "total_seconds": total, "cells": cells}))
    sys.exit(0 if error is None else 1)


if __name__ == "__main__":
    main()
