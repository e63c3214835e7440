#!/usr/bin/python3
"""Opens an HTML page in headless Chromium (Debian's chromium package) and
reports what a reader's browser would do with it: console messages and the
network requests the page itself made.

Usage: report_browser_check.py PAGE.html SCREENSHOT.png WORKDIR

Prints one line per finding, "console: ..." or "request: URL", and then
"ok" when Chromium ran. Chromium's own background traffic (update checks and
the like) is told apart from the page's requests by the network isolation
key Chromium logs with each request: the page's requests carry the page's
file:// origin (Chromium's NetLog format, URL_REQUEST_START_JOB events).
"""
import json
import os
import subprocess
import sys


def main():
    page, shot, work = sys.argv[1], sys.argv[2], sys.argv[3]
    netlog = os.path.join(work, "netlog.json")
    profile = os.path.join(work, "profile")
    cmd = [
        "chromium", "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run",
        "--disable-background-networking", "--hide-scrollbars",
        "--user-data-dir=" + profile, "--enable-logging=stderr", "--v=0",
        "--log-net-log=" + netlog, "--window-size=1200,3000",
        "--screenshot=" + shot, "file://" + os.path.abspath(page),
    ]
    run = subprocess.run(cmd, stdout=subprocess.PIPE, stderr=subprocess.PIPE, timeout=120,
                         env=dict(os.environ, HOME=work))
    err = run.stderr.decode("utf-8", "replace")
    for line in err.splitlines():
        if ":CONSOLE(" in line or "INFO:CONSOLE" in line:
            print("console: " + line.strip())
    if not os.path.exists(netlog):
        print("no netlog written")
        return 1
    with open(netlog, encoding="utf-8") as f:
        text = f.read()
    # Chromium may leave the log's closing bracket off when it exits.
    try:
        log = json.loads(text)
    except ValueError:
        log = json.loads(text.rstrip().rstrip(",") + "]}")
    seen = set()
    for event in log.get("events", []):
        params = event.get("params")
        if not isinstance(params, dict) or "url" not in params:
            continue
        key = str(params.get("network_isolation_key", ""))
        url = str(params["url"])
        if key.startswith("file://") and not url.startswith("file:") and url not in seen:
            seen.add(url)
            print("request: " + url)
    if not os.path.exists(shot):
        print("no screenshot written")
        return 1
    print("ok")
    return 0


if __name__ == "__main__":
    sys.exit(main())
