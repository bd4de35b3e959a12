"""JupyterLab in headless Chromium: start JupyterLab on loopback, open a notebook that uses the
gaugebook kernel, run its cells from the keyboard, wait for the outputs and save a screenshot.

Usage: python browser.py --out DIR [--chromium /usr/bin/chromium] [--driver /usr/bin/chromedriver]
Needs jupyterlab and selenium (PyPI) and the Debian packages chromium and chromium-driver.
Prints one JSON line; exit code 1 when the outputs did not appear.
"""
import argparse
import json
import os
import secrets
import socket
import subprocess
import sys
import tempfile
import time
import urllib.request

import nbformat
from selenium import webdriver
from selenium.webdriver.chrome.service import Service
from selenium.webdriver.common.by import By
from selenium.webdriver.common.action_chains import ActionChains
from selenium.webdriver.common.keys import Keys

CELLS = [
    'let r = q("350 ohm");\nprint(`bridge arm: ${r}`);\ndisplay(q("2 mV/V"));\n'
    'display(plot(column([0.0, 1.0, 2.0, 3.0], "s"), column([0.0, 1.0, 4.0, 9.0], "N"),\n'
    '    #{ title: "inline figure" }));\nr.to("kohm")',
]


def free_port():
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--out", required=True)
    ap.add_argument("--chromium", default="/usr/bin/chromium")
    ap.add_argument("--driver", default="/usr/bin/chromedriver")
    args = ap.parse_args()
    os.makedirs(args.out, exist_ok=True)
    root = tempfile.mkdtemp(prefix="gb-lab-")
    nb = nbformat.v4.new_notebook()
    nb.metadata["kernelspec"] = {"name": "gaugebook", "display_name": "Gaugebook (Rhai)",
                                 "language": "rhai"}
    nb.cells = [nbformat.v4.new_code_cell(c) for c in CELLS]
    nbformat.write(nb, os.path.join(root, "demo.ipynb"))

    token, port = secrets.token_hex(16), free_port()
    lab = subprocess.Popen(
        [sys.executable, "-m", "jupyterlab", "--no-browser", f"--port={port}",
         "--ServerApp.ip=127.0.0.1", f"--IdentityProvider.token={token}", "--allow-root",
         f"--ServerApp.root_dir={root}", "--ServerApp.disable_check_xsrf=True"],
        stdout=subprocess.DEVNULL, stderr=open(os.path.join(args.out, "jupyterlab.log"), "w"))
    report = {"ok": False}
    driver = None
    try:
        base = f"http://127.0.0.1:{port}"
        for _ in range(120):
            try:
                urllib.request.urlopen(f"{base}/api/status?token={token}", timeout=1)
                break
            except Exception:
                time.sleep(0.5)
        opts = webdriver.ChromeOptions()
        opts.binary_location = args.chromium
        for a in ["--headless=new", "--no-sandbox", "--disable-gpu", "--window-size=1280,900",
                  "--disable-dev-shm-usage"]:
            opts.add_argument(a)
        driver = webdriver.Chrome(service=Service(args.driver), options=opts)
        driver.get(f"{base}/lab/tree/demo.ipynb?token={token}")
        deadline = time.monotonic() + 90
        # Wait for the editor, then for the kernel to be idle (status bar text).
        while time.monotonic() < deadline:
            editors = driver.find_elements(By.CSS_SELECTOR, ".jp-Notebook .jp-Cell .cm-content")
            if editors:
                break
            time.sleep(0.5)
        time.sleep(3)
        # Close any dialog (kernel choice, news prompt) with Escape, select the first cell by its
        # prompt (command mode), then Shift+Enter runs it.
        ActionChains(driver).send_keys(Keys.ESCAPE).perform()
        prompt = driver.find_elements(By.CSS_SELECTOR, ".jp-Notebook .jp-Cell .jp-InputPrompt")
        driver.execute_script("arguments[0].scrollIntoView(); arguments[0].click();", prompt[0])
        ActionChains(driver).key_down(Keys.SHIFT).send_keys(Keys.ENTER).key_up(Keys.SHIFT).perform()
        text = ""
        while time.monotonic() < deadline:
            outs = driver.find_elements(By.CSS_SELECTOR, ".jp-OutputArea-output")
            text = "\n".join(o.text for o in outs)
            # JupyterLab renders image/svg+xml as an <img> (or inline <svg>) in the output area.
            figures = driver.find_elements(
                By.CSS_SELECTOR, ".jp-OutputArea-output img, .jp-OutputArea-output svg")
            if "0.35 kΩ" in text and "mV/V" in text and figures:
                break
            time.sleep(0.5)
        time.sleep(0.5)
        shot = os.path.join(args.out, "jupyterlab.png")
        driver.save_screenshot(shot)
        figures = driver.find_elements(
            By.CSS_SELECTOR, ".jp-OutputArea-output img, .jp-OutputArea-output svg")
        report = {"screenshot": shot, "outputs": text, "figures": len(figures),
                  "ok": "0.35 kΩ" in text and "mV/V" in text and "bridge arm" in text
                  and len(figures) > 0}
    finally:
        if driver is not None:
            if not report.get("ok"):
                driver.save_screenshot(os.path.join(args.out, "jupyterlab-failed.png"))
            driver.quit()
        lab.terminate()
        try:
            lab.wait(timeout=20)
        except subprocess.TimeoutExpired:
            lab.kill()
    print(json.dumps(report))
    sys.exit(0 if report["ok"] else 1)


if __name__ == "__main__":
    main()
