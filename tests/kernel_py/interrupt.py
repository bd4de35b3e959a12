"""An interrupt (interrupt_request on control, then SIGINT) stops a runaway cell within 0.5 s and
the session keeps its variables.

Prints one JSON line; exit code 1 on failure.
"""
import argparse
import json
import os
import signal
import sys
import time

import kutil

LIMIT_S = 0.5  # issue 4: "an interrupt stops a runaway cell within half a second"


def runaway(kc, km, how):
    msg_id = kc.execute("loop {}")
    time.sleep(0.5)  # let it spin
    t0 = time.monotonic()
    if how == "message":
        km.interrupt_kernel()  # interrupt_mode "message": an interrupt_request on control
    else:
        os.kill(kutil.pid(km), signal.SIGINT)
    reply = kutil.shell_reply(kc, msg_id, timeout=10)
    dt = time.monotonic() - t0
    kutil.collect(kc, msg_id, timeout=10)
    return reply["content"], dt


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--code", default="rhai")
    ap.parse_args()
    km, kc = kutil.start()
    report = {}
    try:
        r, _ = kutil.run(kc, "let keep = 41")
        assert r["status"] == "ok", r
        reply, dt_msg = runaway(kc, km, "message")
        reply2, dt_sig = runaway(kc, km, "signal")
        r, outs = kutil.run(kc, "keep + 1")
        report = {
            "message_interrupt_s": round(dt_msg, 4),
            "sigint_interrupt_s": round(dt_sig, 4),
            "runaway_status": [reply["status"], reply2["status"]],
            "ename": reply.get("ename"),
            "after": kutil.plain(outs),
            "kept": kutil.plain(outs) == "42",
        }
        report["ok"] = (report["kept"] and dt_msg <= LIMIT_S and dt_sig <= LIMIT_S
                        and reply["status"] == "error" and reply2["status"] == "error")
    finally:
        kutil.stop(km, kc)
    print(json.dumps(report))
    sys.exit(0 if report.get("ok") else 1)


if __name__ == "__main__":
    main()
