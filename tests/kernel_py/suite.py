"""jupyter_kernel_test's protocol suite against the gaugebook kernel, every optional sample set.

Usage: python suite.py --samples fake|rhai
Prints one JSON line: {"tests": N, "failures": F, "errors": E, "skipped": S, ...}; exit code 1
when anything failed or was skipped (every attribute is set, so nothing may be skipped).
"""
import argparse
import json
import sys
import unittest

import jupyter_kernel_test as jkt

SAMPLES = {
    # Samples shared by the fake engine and Rhai (both understand these lines).
    "common": dict(
        kernel_name="gaugebook",
        language_name="rhai",
        file_extension=".rhai",
        code_hello_world='print("hello, world")',
        code_stderr='eprint("careful")',
        code_generate_error='throw "boom"',
        code_execute_result=[
            {"code": "6 * 7", "result": "42"},
            {"code": "1 + 2 + 3", "result": "6"},
        ],
        code_history_pattern="6 * 7",
        supported_history_operations=("tail", "range", "search"),
        code_clear_output="clear_output(false)",
        incomplete_code_samples=["fn f() {", 'let s = "abc', "/* a note"],
    ),
    "fake": dict(
        completion_samples=[
            {"text": "pri", "matches": ["print"]},
            {"text": "clear_o", "matches": ["clear_output"]},
        ],
        complete_code_samples=["6 * 7", "let a = 1"],
        invalid_code_samples=["let = 1", "}"],
        code_page_something="help(print)",
        code_inspect_sample="print",
        code_display_data=[
            {"code": "display(6 * 7)", "mime": "text/plain"},
            {"code": "display(6 * 7)", "mime": "text/html"},
        ],
    ),
}


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--samples", choices=["fake", "rhai"], required=True)
    ap.add_argument("--extra", default=None, help="JSON file with more sample attributes")
    args = ap.parse_args()
    attrs = dict(SAMPLES["common"])
    attrs.update(SAMPLES.get(args.samples, {}))
    if args.extra:
        with open(args.extra) as f:
            attrs.update(json.load(f))
    cls = type("GaugebookKernelTests", (jkt.KernelTests,), attrs)
    suite = unittest.defaultTestLoader.loadTestsFromTestCase(cls)
    result = unittest.TextTestRunner(stream=sys.stderr, verbosity=2).run(suite)
    report = {
        "tests": result.testsRun,
        "failures": len(result.failures),
        "errors": len(result.errors),
        "skipped": len(result.skipped),
        "failed_names": [str(t) for t, _ in result.failures + result.errors],
        "skipped_names": [str(t) for t, _ in result.skipped],
    }
    print(json.dumps(report))
    bad = report["failures"] or report["errors"] or report["skipped"]
    sys.exit(1 if bad else 0)


if __name__ == "__main__":
    main()
