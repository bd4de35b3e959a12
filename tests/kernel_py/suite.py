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
    "rhai": dict(
        completion_samples=[
            {"text": "clear_outp", "matches": ["clear_output"]},
            {"text": "update_disp", "matches": ["update_display"]},
        ],
        complete_code_samples=["6 * 7", "let a = 1;", "fn twice(x) { 2 * x }"],
        invalid_code_samples=["let = ;", "1 + * 2"],
        code_page_something='help("q")',
        code_inspect_sample="q",
        code_display_data=[
            {"code": 'display(q("2 mV/V"))', "mime": "text/plain"},
            {"code": 'display("loading", "progress")', "mime": "text/plain"},
        ],
    ),
}


def test_update_display_data(self):
    """display(x, id) then update_display(y, id): display_data, then update_display_data with
    the same transient display_id (an addition to jupyter_kernel_test's list)."""
    self.flush_channels()
    reply, outs = self.execute_helper('display(0, "count"); update_display(1, "count")')
    self.assertEqual(reply["content"]["status"], "ok")
    kinds = [m["msg_type"] for m in outs]
    self.assertEqual(kinds, ["display_data", "update_display_data"])
    for m in outs:
        self.assertEqual(m["content"]["transient"]["display_id"], "count")
    self.assertEqual(outs[1]["content"]["data"]["text/plain"], "1")


def test_error_traceback_has_caret(self):
    """A unit mismatch renders as ename, evalue and a traceback with the source line and caret."""
    self.flush_channels()
    reply, outs = self.execute_helper('let r = q("350 ohm");\nr + q("5 V")')
    self.assertEqual(reply["content"]["status"], "error")
    self.assertEqual(reply["content"]["ename"], "UnitError")
    tb = "\n".join(reply["content"]["traceback"])
    self.assertIn("^", tb)
    self.assertIn('r + q("5 V")', tb)


def test_state_survives_a_failed_cell(self):
    self.flush_channels()
    self.execute_helper("let kept = 20;")
    reply, _ = self.execute_helper('throw "fails"')
    self.assertEqual(reply["content"]["status"], "error")
    reply, outs = self.execute_helper("kept + 1")
    results = [m for m in outs if m["msg_type"] == "execute_result"]
    self.assertEqual(results[0]["content"]["data"]["text/plain"], "21")


RHAI_EXTRA_TESTS = {
    "test_update_display_data": test_update_display_data,
    "test_error_traceback_has_caret": test_error_traceback_has_caret,
    "test_state_survives_a_failed_cell": test_state_survives_a_failed_cell,
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
    if args.samples == "rhai":
        attrs.update(RHAI_EXTRA_TESTS)
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
