"""A forged, an unsigned and a replayed message must execute nothing.

Prints one JSON line; exit code 1 when a forged message had any effect.
"""
import json
import sys
import time

from jupyter_client.session import Session

import kutil


def main():
    km, kc = kutil.start()
    report = {}
    try:
        kutil.run(kc, "let base = 1")
        before, _ = kutil.run(kc, "base")
        count0 = before["execution_count"]

        forger = Session(key=b"not-the-right-key", username="mallory")
        forged = forger.send(kc.shell_channel.socket, "execute_request",
                             {"code": 'let forged = 5; print("FORGED")', "silent": False,
                              "store_history": True, "user_expressions": {},
                              "allow_stdin": False, "stop_on_error": True})
        unsigned = Session(key=b"", username="mallory")
        nosig = unsigned.send(kc.shell_channel.socket, "execute_request",
                              {"code": 'let unsigned = 6; print("UNSIGNED")', "silent": False,
                               "store_history": True, "user_expressions": {},
                               "allow_stdin": False, "stop_on_error": True})
        # A genuine message sent twice: the second copy is a replay and must be dropped.
        real = kc.session.msg("execute_request",
                              {"code": 'print("ONCE")', "silent": False, "store_history": True,
                               "user_expressions": {}, "allow_stdin": False,
                               "stop_on_error": True})
        frames = kc.session.serialize(real)
        kc.shell_channel.socket.send_multipart(frames)
        kc.shell_channel.socket.send_multipart(frames)
        time.sleep(1.0)

        iopub = kutil.drain_iopub(kc, 0.5)
        bad_ids = {forged["header"]["msg_id"], nosig["header"]["msg_id"]}
        effects = [m for m in iopub if m["parent_header"].get("msg_id") in bad_ids]
        texts = "".join(m["content"].get("text", "") for m in iopub if m["msg_type"] == "stream")
        replies = []
        while True:
            try:
                replies.append(kc.get_shell_msg(timeout=0.3))
            except Exception:
                break
        real_replies = [r for r in replies if r["parent_header"].get("msg_id") == real["header"]["msg_id"]]
        bad_replies = [r for r in replies if r["parent_header"].get("msg_id") in bad_ids]

        after, outs = kutil.run(kc, "forged")
        unsigned_after, _ = kutil.run(kc, "unsigned")
        report = {
            "forged_executed": bool(effects or bad_replies or "FORGED" in texts
                                    or "UNSIGNED" in texts or after["status"] == "ok"
                                    or unsigned_after["status"] == "ok"),
            "replay_runs": texts.count("ONCE"),
            "genuine_replies": len(real_replies),
            "execution_count_before": count0,
            "execution_count_after": after["execution_count"],
        }
        ok = (not report["forged_executed"] and report["replay_runs"] == 1
              and report["genuine_replies"] == 1
              # after `base`: the genuine ONCE, then `forged` itself
              and report["execution_count_after"] == count0 + 2)
        report["ok"] = ok
    finally:
        kutil.stop(km, kc)
    print(json.dumps(report))
    sys.exit(0 if report.get("ok") else 1)


if __name__ == "__main__":
    main()
