"""A soak: N cells (default 10 000) mixing results, output and errors, checking every reply and
reporting the kernel's memory growth (VmRSS from /proc, Linux).

Prints one JSON line; exit code 1 when a reply was wrong.
"""
import argparse
import json
import sys
import time

import kutil


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("-n", type=int, default=10_000)
    args = ap.parse_args()
    km, kc = kutil.start()
    report = {}
    try:
        p = kutil.pid(km)
        wrong = 0
        rss = {}
        t0 = time.monotonic()
        for i in range(args.n):
            kind = i % 4
            if kind == 0:
                code, want = f"let v{i % 100} = {i}; v{i % 100} * 2", str(2 * i)
            elif kind == 1:
                code, want = f'throw "soak {i}"', None
            elif kind == 2:
                code, want = f'print("line {i}")', None
            else:
                code, want = f"{i} + 1", str(i + 1)
            r, outs = kutil.run(kc, code)
            if kind == 1:
                ok = r["status"] == "error" and any(m["msg_type"] == "error" for m in outs)
            elif kind == 2:
                ok = r["status"] == "ok" and any(
                    m["msg_type"] == "stream" and f"line {i}" in m["content"]["text"] for m in outs)
            else:
                ok = r["status"] == "ok" and kutil.plain(outs) == want
            wrong += 0 if ok else 1
            if i in (99, args.n // 2, args.n - 1):
                rss[i + 1] = kutil.rss_kib(p)
        dt = time.monotonic() - t0
        first, last = rss.get(100), rss.get(args.n)
        report = {
            "cells": args.n,
            "wrong_replies": wrong,
            "seconds": round(dt, 2),
            "ms_per_cell": round(1000 * dt / max(args.n, 1), 3),
            "rss_kib_after_cells": rss,
            "rss_growth_kib_from_cell_100": (last - first) if first and last else None,
        }
        report["ok"] = wrong == 0
    finally:
        kutil.stop(km, kc)
    print(json.dumps(report))
    sys.exit(0 if report.get("ok") else 1)


if __name__ == "__main__":
    main()
