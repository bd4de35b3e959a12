"""Helpers shared by the kernel test scripts: start the gaugebook kernel, run a cell, read RSS."""
import os
import time

from jupyter_client.manager import start_new_kernel

TIMEOUT = 20


def start():
    km, kc = start_new_kernel(kernel_name="gaugebook", startup_timeout=60)
    return km, kc


def stop(km, kc):
    kc.stop_channels()
    km.shutdown_kernel(now=False)


def pid(km):
    return km.provisioner.pid


def rss_kib(p):
    """Resident set size of process p in KiB (Linux /proc; None elsewhere)."""
    try:
        with open(f"/proc/{p}/status") as f:
            for line in f:
                if line.startswith("VmRSS:"):
                    return int(line.split()[1])
    except OSError:
        return None
    return None


def run(kc, code, timeout=TIMEOUT, **kw):
    """Executes code; returns (reply content, [iopub messages with this parent until idle])."""
    msg_id = kc.execute(code, **kw)
    outputs = collect(kc, msg_id, timeout)
    reply = shell_reply(kc, msg_id, timeout)
    return reply["content"], outputs


def shell_reply(kc, msg_id, timeout=TIMEOUT):
    deadline = time.monotonic() + timeout
    while True:
        left = deadline - time.monotonic()
        if left <= 0:
            raise TimeoutError(f"no shell reply to {msg_id}")
        msg = kc.get_shell_msg(timeout=left)
        if msg["parent_header"].get("msg_id") == msg_id:
            return msg


def collect(kc, msg_id, timeout=TIMEOUT):
    out = []
    deadline = time.monotonic() + timeout
    while True:
        left = deadline - time.monotonic()
        if left <= 0:
            raise TimeoutError(f"no idle status for {msg_id}")
        msg = kc.get_iopub_msg(timeout=left)
        if msg["parent_header"].get("msg_id") != msg_id:
            continue
        if msg["msg_type"] == "status" and msg["content"]["execution_state"] == "idle":
            return out
        out.append(msg)


def plain(outputs):
    """The text/plain of the execute_result among outputs, or None."""
    for m in outputs:
        if m["msg_type"] == "execute_result":
            return m["content"]["data"].get("text/plain")
    return None


def drain_iopub(kc, wait=0.2):
    msgs = []
    while True:
        try:
            msgs.append(kc.get_iopub_msg(timeout=wait))
        except Exception:
            return msgs
