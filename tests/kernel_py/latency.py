"""The latency benchmark: kernel_latency.py (bench/ of the shared workspace) run on this kernel
and on ipykernel, interleaved, printing both side by side and the ratios.

Usage: python latency.py --probe PATH/kernel_latency.py [--runs 3] [-n 500] [--code "1+1"]
Goal (issue 4): cold start <= 0.1x and median round trip <= 0.5x ipykernel's.
Prints a table on stderr and one JSON line on stdout.
"""
import argparse
import json
import statistics
import subprocess
import sys

KEYS = ["cold_start_s", "rtt_median_ms", "rtt_p99_ms", "rtt_min_ms", "rtt_max_ms", "shutdown_s"]


def probe(path, kernel, code, n):
    out = subprocess.run([sys.executable, path, "--kernel", kernel, "--code", code, "-n", str(n)],
                         capture_output=True, text=True, check=True)
    return json.loads(out.stdout.strip().splitlines()[-1])


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--probe", required=True)
    ap.add_argument("--runs", type=int, default=3)
    ap.add_argument("-n", type=int, default=500)
    ap.add_argument("--code", default="1+1")
    ap.add_argument("--other", default="python3", help="the comparison kernelspec")
    args = ap.parse_args()
    runs = {"gaugebook": [], args.other: []}
    for _ in range(args.runs):
        for k in runs:
            runs[k].append(probe(args.probe, k, args.code, args.n))
    med = {k: {key: statistics.median(r[key] for r in v) for key in KEYS} for k, v in runs.items()}
    ratios = {key: med["gaugebook"][key] / med[args.other][key] for key in KEYS}
    print(f"{'median of ' + str(args.runs) + ' runs':<16}" + "".join(f"{k:>15}" for k in KEYS),
          file=sys.stderr)
    for k in runs:
        print(f"{k:<16}" + "".join(f"{med[k][key]:>15.4f}" for key in KEYS), file=sys.stderr)
    print(f"{'ratio':<16}" + "".join(f"{ratios[key]:>15.3f}" for key in KEYS), file=sys.stderr)
    goal = {"cold_start_le_0.1": ratios["cold_start_s"] <= 0.1,
            "rtt_median_le_0.5": ratios["rtt_median_ms"] <= 0.5}
    print(json.dumps({"median": med, "ratios": ratios, "goal": goal,
                      "code": args.code, "n": args.n, "runs": args.runs}))


if __name__ == "__main__":
    main()
