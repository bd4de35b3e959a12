"""Malformed frames, bad JSON under a valid signature, and SIGINT while idle must not kill the
kernel; kernel_info is answered on both shell and control; the heartbeat answers.

Prints one JSON line; exit code 1 on failure.
"""
import json
import os
import signal
import sys
import time

import zmq

import kutil


def kernel_info_on(kc, channel):
    msg = kc.session.msg("kernel_info_request", {})
    kc.session.send(channel.socket, msg)
    deadline = time.monotonic() + 10
    while time.monotonic() < deadline:
        reply = channel.get_msg(timeout=10)
        if reply["parent_header"].get("msg_id") == msg["header"]["msg_id"]:
            return reply
    raise TimeoutError("no kernel_info_reply")


def main():
    km, kc = kutil.start()
    report = {}
    try:
        info = km.get_connection_info()
        ctx = zmq.Context.instance()
        raw = ctx.socket(zmq.DEALER)
        raw.connect(f"tcp://{info['ip']}:{info['shell_port']}")
        raw.send(b"garbage")
        raw.send_multipart([b"<IDS|MSG>", b"", b"{"])
        raw.send_multipart([b"<IDS|MSG>", b"deadbeef", b"{}", b"{}", b"{}", b"{}"])
        # Valid signature over frames that are not JSON objects.
        parts = [b"[1, 2]", b"{}", b"{}", b"not json"]
        sig = kc.session.sign(parts)
        raw.send_multipart([b"<IDS|MSG>", sig] + parts)
        raw.send_multipart([b"\xff\xfe"] * 9)
        time.sleep(0.5)
        os.kill(kutil.pid(km), signal.SIGINT)  # idle: must be survived and ignored
        time.sleep(0.3)

        shell = kernel_info_on(kc, kc.shell_channel)
        control = kernel_info_on(kc, kc.control_channel)
        r, outs = kutil.run(kc, "6 * 7")
        report = {
            "shell_kernel_info": shell["content"]["status"],
            "control_kernel_info": control["content"]["status"],
            "protocol_version": shell["content"]["protocol_version"],
            "header_version": shell["header"]["version"],
            "heartbeat": kc.hb_channel.is_beating() if kc.hb_channel.is_alive() else None,
            "after": kutil.plain(outs),
            "process_alive": km.is_alive(),
        }
        report["alive"] = (report["after"] == "42" and report["process_alive"]
                           and report["shell_kernel_info"] == "ok"
                           and report["control_kernel_info"] == "ok")
        raw.close(linger=0)
    finally:
        kutil.stop(km, kc)
    print(json.dumps(report))
    sys.exit(0 if report.get("alive") else 1)


if __name__ == "__main__":
    main()
