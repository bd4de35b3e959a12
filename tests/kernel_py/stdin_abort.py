"""Input requests on the stdin channel, and stop_on_error aborting queued cells.

1. `input(prompt)` in a cell run with allow_stdin=True sends an input_request with the prompt
   (and `password` for input_password); the client's input_reply becomes the string the
   script gets.
2. With allow_stdin=False (what nbclient sends), `input` raises an InputError at once.
3. An interrupt while a cell waits for input ends the wait and keeps the session.
4. A failing cell with stop_on_error (the specification's default) aborts the execute_requests
   already queued behind it: they reply status "aborted" and do not run; with
   stop_on_error=False the next cell runs.

Prints one JSON line; exit code 1 on failure.
"""
import json
import sys
import time

import kutil


def answer_input(kc, text, timeout=10):
    msg = kc.get_stdin_msg(timeout=timeout)
    assert msg["msg_type"] == "input_request", msg
    kc.input(text)
    return msg["content"]


def main():
    km, kc = kutil.start()
    report = {}
    try:
        # 1. An answered input.
        msg_id = kc.execute('let who = input("operator? "); print("operator: " + who); who.len',
                            allow_stdin=True)
        req = answer_input(kc, "R. Lindqvist")
        outs = kutil.collect(kc, msg_id)
        reply = kutil.shell_reply(kc, msg_id)["content"]
        printed = "".join(m["content"]["text"] for m in outs if m["msg_type"] == "stream")
        report["prompt"] = req["prompt"]
        report["password_flag"] = req["password"]
        report["answered"] = reply["status"] == "ok" and printed == "operator: R. Lindqvist\n"
        report["length"] = kutil.plain(outs)

        msg_id = kc.execute('input_password("code? ").len', allow_stdin=True)
        req = answer_input(kc, "4711")
        outs = kutil.collect(kc, msg_id)
        kutil.shell_reply(kc, msg_id)
        report["password_request"] = req["password"] is True and kutil.plain(outs) == "4"

        # 2. No stdin allowed.
        r, _ = kutil.run(kc, 'input("x? ")', allow_stdin=False)
        report["no_stdin"] = [r["status"], r.get("ename"), r.get("evalue", "")]

        # 3. Interrupted while waiting.
        msg_id = kc.execute('let late = input("never answered? ");', allow_stdin=True)
        kc.get_stdin_msg(timeout=10)
        t0 = time.monotonic()
        km.interrupt_kernel()
        reply = kutil.shell_reply(kc, msg_id)["content"]
        report["interrupt_s"] = round(time.monotonic() - t0, 3)
        kutil.collect(kc, msg_id)
        r, outs = kutil.run(kc, "who.len")
        report["interrupt_ename"] = reply.get("ename")
        report["interrupt_kept"] = reply["status"] == "error" and kutil.plain(outs) == "12"

        # 4. stop_on_error: queue three cells behind a failing one, without waiting.
        kc.execute('let marker = 0;')
        time.sleep(0.3)
        kutil.drain_iopub(kc, wait=0.1)
        while True:
            try:
                kc.get_shell_msg(timeout=0.2)
            except Exception:
                break
        failing = kc.execute('let t = 0; while t < 300000 { t += 1; } throw "the rig stopped"')
        queued = [kc.execute(f"marker = {i};") for i in (1, 2, 3)]
        statuses = {}
        deadline = time.monotonic() + 20
        while len(statuses) < 4 and time.monotonic() < deadline:
            m = kc.get_shell_msg(timeout=20)
            statuses[m["parent_header"]["msg_id"]] = m["content"]["status"]
        report["failing_status"] = statuses.get(failing)
        report["queued_status"] = [statuses.get(q) for q in queued]
        time.sleep(0.2)
        kutil.drain_iopub(kc, wait=0.1)
        r, outs = kutil.run(kc, "marker")
        report["marker_after_abort"] = kutil.plain(outs)

        # stop_on_error=False: the next cell runs.
        failing = kc.execute('throw "tolerated"', stop_on_error=False)
        after = kc.execute("marker = 9;")
        got = {}
        while len(got) < 2:
            m = kc.get_shell_msg(timeout=20)
            got[m["parent_header"]["msg_id"]] = m["content"]["status"]
        time.sleep(0.2)
        kutil.drain_iopub(kc, wait=0.1)
        r, outs = kutil.run(kc, "marker")
        report["tolerated"] = [got.get(failing), got.get(after), kutil.plain(outs)]
    finally:
        kutil.stop(km, kc)
    ok = (report.get("prompt") == "operator? " and report.get("password_flag") is False
          and report.get("answered") and report.get("length") == "12"
          and report.get("password_request")
          and report.get("no_stdin", [None])[0] == "error"
          and report["no_stdin"][1] == "InputError"
          and report.get("interrupt_kept") and report.get("interrupt_s", 9) <= 0.5
          and report.get("failing_status") == "error"
          and report.get("queued_status") == ["aborted"] * 3
          and report.get("marker_after_abort") == "0"
          and report.get("tolerated") == ["error", "ok", "9"])
    report["ok"] = bool(ok)
    print(json.dumps(report))
    sys.exit(0 if ok else 1)


if __name__ == "__main__":
    main()
