#!/usr/bin/python3
"""Opens an edgeflux HTML report in headless Chromium and checks it as a reader would see it.

Usage: browser_check.py REPORT.html RESULTS.json ARTIFACT_FOLDER [CHROMIUM]

Checks: the page loads from file:// with no console error, no uncaught exception and no request
for anything but the file itself; the key numbers of RESULTS.json (L2D, ψ per system, fRsi) appear
in the page text as the report formats them; every inline SVG shown on screen renders with a
non-zero size (explorable_check.py drives the explorable picture); the page prints to PDF. Printed at A4 and at US Letter: no element runs past the printable width, the
junction sheet (the report without its appendices) takes at most two pages, and every appendix
starts on a page of its own. Saves a full-page screenshot (report.png), the A4 print (report.pdf)
and the sheet alone (sheet-a4.pdf, sheet-letter.pdf) in ARTIFACT_FOLDER. Exit 0 when all checks pass, 1 when one fails, 2 when the browser cannot be
started or driven (a failure too: the check never passes without a browser).

Chromium is driven through its DevTools protocol over a WebSocket, written here on the standard
library (RFC 6455 client framing), so the check needs nothing beyond Debian's python3 and chromium.
"""
import base64
import json
import os
import shutil
import signal
import socket
import struct
import subprocess
import sys
import tempfile
import time
import urllib.parse
import urllib.request

TIMEOUT_S = 45


class Failure(Exception):
    pass


class BrowserTrouble(Exception):
    pass


class WebSocket:
    """A minimal RFC 6455 client: text frames, masking, fragmentation, ping/pong."""

    def __init__(self, url):
        parts = urllib.parse.urlparse(url)
        self.sock = socket.create_connection((parts.hostname, parts.port), timeout=TIMEOUT_S)
        key = base64.b64encode(os.urandom(16)).decode()
        request = (
            f"GET {parts.path} HTTP/1.1\r\nHost: {parts.hostname}:{parts.port}\r\nUpgrade: websocket\r\n"
            f"Connection: Upgrade\r\nSec-WebSocket-Key: {key}\r\nSec-WebSocket-Version: 13\r\n\r\n"
        )
        self.sock.sendall(request.encode())
        response = b""
        while b"\r\n\r\n" not in response:
            chunk = self.sock.recv(4096)
            if not chunk:
                raise BrowserTrouble("DevTools closed the connection during the WebSocket handshake")
            response += chunk
        head, self.buffer = response.split(b"\r\n\r\n", 1)
        if b" 101 " not in head.split(b"\r\n")[0]:
            raise BrowserTrouble("DevTools refused the WebSocket upgrade: " + head.decode(errors="replace"))

    def send(self, text):
        payload = text.encode()
        header = bytes([0x81])  # FIN + text
        n = len(payload)
        if n < 126:
            header += bytes([0x80 | n])
        elif n < 65536:
            header += bytes([0x80 | 126]) + struct.pack(">H", n)
        else:
            header += bytes([0x80 | 127]) + struct.pack(">Q", n)
        mask = os.urandom(4)
        self.sock.sendall(header + mask + bytes(b ^ mask[i % 4] for i, b in enumerate(payload)))

    def _read(self, n):
        while len(self.buffer) < n:
            chunk = self.sock.recv(1 << 20)
            if not chunk:
                raise BrowserTrouble("DevTools closed the connection")
            self.buffer += chunk
        data, self.buffer = self.buffer[:n], self.buffer[n:]
        return data

    def receive(self):
        message = b""
        while True:
            b0, b1 = self._read(2)
            opcode, n = b0 & 0x0F, b1 & 0x7F
            if n == 126:
                n = struct.unpack(">H", self._read(2))[0]
            elif n == 127:
                n = struct.unpack(">Q", self._read(8))[0]
            payload = self._read(n)
            if opcode == 0x9:  # ping: answer, keep reading
                self.sock.sendall(bytes([0x8A, 0x80]) + os.urandom(4))
                continue
            if opcode == 0x8:
                raise BrowserTrouble("DevTools closed the WebSocket")
            message += payload
            if b0 & 0x80:
                return message.decode()


class DevTools:
    def __init__(self, ws):
        self.ws, self.next_id, self.events = ws, 0, []

    def call(self, method, **params):
        self.next_id += 1
        my_id = self.next_id
        self.ws.send(json.dumps({"id": my_id, "method": method, "params": params}))
        deadline = time.time() + TIMEOUT_S
        while time.time() < deadline:
            message = json.loads(self.ws.receive())
            if message.get("id") == my_id:
                if "error" in message:
                    raise BrowserTrouble(f"{method} failed: {message['error']}")
                return message.get("result", {})
            self.events.append(message)
        raise BrowserTrouble(f"no answer to {method} within {TIMEOUT_S} s")

    def wait_for(self, method):
        for e in self.events:
            if e.get("method") == method:
                return e
        deadline = time.time() + TIMEOUT_S
        while time.time() < deadline:
            message = json.loads(self.ws.receive())
            self.events.append(message)
            if message.get("method") == method:
                return message
        raise BrowserTrouble(f"{method} did not arrive within {TIMEOUT_S} s")


def start_chromium(chromium, profile):
    if not (os.path.isfile(chromium) and os.access(chromium, os.X_OK)):
        raise BrowserTrouble(f"{chromium} does not exist or is not executable (Debian package: chromium; scripts/install-deps installs it)")
    args = [chromium, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
            "--disable-background-networking", "--disable-component-update", "--disable-sync",
            "--disable-extensions", "--disable-dev-shm-usage", "--hide-scrollbars", "--mute-audio",
            f"--user-data-dir={profile}", "--remote-debugging-address=127.0.0.1", "--remote-debugging-port=0",
            "--window-size=1100,1400", "about:blank"]
    log = open(os.path.join(profile, "chromium.log"), "w")
    proc = subprocess.Popen(args, stdout=log, stderr=subprocess.STDOUT, start_new_session=True)
    port_file = os.path.join(profile, "DevToolsActivePort")
    deadline = time.time() + TIMEOUT_S
    while time.time() < deadline:
        if proc.poll() is not None:
            log.close()
            with open(os.path.join(profile, "chromium.log")) as f:
                raise BrowserTrouble(f"chromium exited with code {proc.returncode} at start:\n{f.read()[-3000:]}")
        if os.path.exists(port_file):
            with open(port_file) as f:
                lines = f.read().split("\n")
            if lines and lines[0].strip().isdigit():
                return proc, int(lines[0])
        time.sleep(0.05)
    raise BrowserTrouble(f"chromium did not open its DevTools port within {TIMEOUT_S} s")


def stop_chromium(proc):
    if proc and proc.poll() is None:
        try:
            os.killpg(proc.pid, signal.SIGTERM)  # the process group this script started
            proc.wait(timeout=10)
        except (ProcessLookupError, subprocess.TimeoutExpired):
            try:
                os.killpg(proc.pid, signal.SIGKILL)
            except ProcessLookupError:
                pass


# Paper sizes in mm; the report's @page rule sets 13 mm side margins and leaves the size to the printer.
PAPERS = {"A4": (210.0, 297.0), "Letter": (215.9, 279.4)}
SIDE_MARGINS_MM = 2 * 13.0
MAX_SHEET_PAGES = 2
PX_PER_MM = 96 / 25.4


def count_pages(pdf):
    """Pages of a PDF as Chromium writes it (one uncompressed /Type /Page dictionary per page)."""
    import re
    return len(re.findall(rb"/Type\s*/Page\b", pdf))


def print_pdf(dt, width_mm, height_mm):
    result = dt.call("Page.printToPDF", preferCSSPageSize=False, printBackground=True,
                     paperWidth=width_mm / 25.4, paperHeight=height_mm / 25.4)
    return base64.b64decode(result["data"])


def overflowing_elements(dt, paper, width_mm):
    """Elements whose box runs past the printable width when laid out for print on this paper."""
    width_px = int((width_mm - SIDE_MARGINS_MM) * PX_PER_MM)
    dt.call("Emulation.setEmulatedMedia", media="print")
    dt.call("Emulation.setDeviceMetricsOverride", width=width_px, height=1200, deviceScaleFactor=1, mobile=False)
    found = dt.call("Runtime.evaluate", returnByValue=True, expression="""(() => {
        const limit = document.documentElement.clientWidth + 0.5, out = [];
        for (const e of document.body.querySelectorAll('*')) {
          if (e.closest('svg') && e.tagName.toLowerCase() !== 'svg') continue;
          const r = e.getBoundingClientRect();
          const wide = e.scrollWidth > e.clientWidth + 1 && getComputedStyle(e).overflowX !== 'visible';
          if ((r.width > 0 && (r.right > limit || r.left < -0.5)) || wide)
            out.push(`<${e.tagName.toLowerCase()} class="${e.className.baseVal ?? e.className}"> ${e.textContent.trim().slice(0, 40)}… ` +
                     `spans ${Math.round(r.left)}–${Math.round(r.right)} px of ${Math.round(limit)}`);
        }
        return out; })()""")["result"]["value"]
    dt.call("Emulation.setEmulatedMedia", media="")
    dt.call("Emulation.clearDeviceMetricsOverride")
    return [f"at {paper} width: {o}" for o in found[:8]] + ([f"… and {len(found) - 8} more"] if len(found) > 8 else [])


def expected_numbers(results):
    """The key numbers as the report prints them (html_report.cpp: L2D 4 decimals, ψ and fRsi 3)."""
    numbers = {}
    if results.get("coupling_coefficient_2d_w_per_mk") is not None:
        numbers["L2D"] = "%.4f" % results["coupling_coefficient_2d_w_per_mk"]
    for system, value in results.get("psi_w_per_mk", {}).items():
        numbers["psi " + system] = "%.3f" % value
    if results.get("temperature_factor_frsi") is not None:
        numbers["fRsi"] = "%.3f" % results["temperature_factor_frsi"]
    if not numbers:
        raise Failure("the results JSON holds none of L2D, ψ, fRsi: nothing to look for")
    return numbers


def first_page(port, domains):
    """The DevTools session of chromium's first page, with these protocol domains enabled."""
    with urllib.request.urlopen(f"http://127.0.0.1:{port}/json/list", timeout=TIMEOUT_S) as r:
        pages = [t for t in json.load(r) if t.get("type") == "page"]
    if not pages:
        raise BrowserTrouble("chromium shows no page target")
    dt = DevTools(WebSocket(pages[0]["webSocketDebuggerUrl"]))
    for domain in domains:
        dt.call(domain + ".enable")
    return dt


def check(report, results_file, artifacts, chromium):
    with open(results_file) as f:
        numbers = expected_numbers(json.load(f))
    os.makedirs(artifacts, exist_ok=True)
    profile = tempfile.mkdtemp(prefix="edgeflux-chromium-")
    proc = None
    try:
        proc, port = start_chromium(chromium, profile)
        dt = first_page(port, ("Page", "Runtime", "Log", "Network"))
        url = "file://" + urllib.parse.quote(os.path.abspath(report))
        dt.call("Page.navigate", url=url)
        dt.wait_for("Page.loadEventFired")
        page = dt.call("Runtime.evaluate", returnByValue=True, expression="""(() => ({
            text: document.body.innerText,
            svgs: Array.from(document.querySelectorAll('svg:not(.xf-print)')).map(s => {  // the explorable picture's copy shows in print only
              const r = s.getBoundingClientRect(); return {w: r.width, h: r.height, children: s.childElementCount}; }),
            height: document.documentElement.scrollHeight }))()""")["result"]["value"]
        problems = []
        for e in dt.events:
            m, p = e.get("method"), e.get("params", {})
            if m == "Runtime.consoleAPICalled" and p.get("type") in ("error", "assert"):
                problems.append("console error: " + json.dumps(p.get("args"))[:300])
            if m == "Runtime.exceptionThrown":
                problems.append("uncaught exception: " + json.dumps(p.get("exceptionDetails"))[:300])
            if m == "Log.entryAdded" and p.get("entry", {}).get("level") == "error":
                problems.append("browser log error: " + p["entry"].get("text", "")[:300])
            if m == "Network.requestWillBeSent":
                requested = p.get("request", {}).get("url", "")
                if requested != url and not requested.startswith("data:"):
                    problems.append("the report requested " + requested[:200])
        for name, text in numbers.items():
            if text not in page["text"]:
                problems.append(f"{name} {text} (from the JSON) is not in the page text")
        if len(page["svgs"]) != 6:
            problems.append(f"expected 5 drawings and the explorable picture, the page shows {len(page['svgs'])} SVG elements")
        for i, s in enumerate(page["svgs"]):
            if not (s["w"] > 10 and s["h"] > 10 and s["children"] > 0):
                problems.append(f"SVG {i + 1} renders at {s['w']}×{s['h']} px with {s['children']} children")
        for caution in ("Results are only as reliable", "qualified professional"):
            if caution not in page["text"]:
                problems.append(f"the cautions ('{caution}') are not shown")

        # A full-page screenshot at a desk-screen width, and the A4 print.
        dt.call("Emulation.setDeviceMetricsOverride", width=1000, height=min(int(page["height"]), 16000), deviceScaleFactor=1, mobile=False)
        shot = dt.call("Page.captureScreenshot", format="png", captureBeyondViewport=True)
        with open(os.path.join(artifacts, "report.png"), "wb") as f:
            f.write(base64.b64decode(shot["data"]))
        pages_printed = {}
        for paper, (width_mm, height_mm) in PAPERS.items():
            problems += overflowing_elements(dt, paper, width_mm)
            full = print_pdf(dt, width_mm, height_mm)
            if paper == "A4":
                with open(os.path.join(artifacts, "report.pdf"), "wb") as f:
                    f.write(full)
            if not full.startswith(b"%PDF"):
                problems.append(f"printing to PDF at {paper} gave no PDF")
            # The sheet alone: the same page without its appendices.
            dt.call("Runtime.evaluate", expression="window.__appendices = Array.from(document.querySelectorAll('.appendix'));"
                                                   "window.__appendices.forEach(e => e.style.display = 'none');")
            sheet = print_pdf(dt, width_mm, height_mm)
            dt.call("Runtime.evaluate", expression="window.__appendices.forEach(e => e.style.display = '');")
            with open(os.path.join(artifacts, f"sheet-{paper.lower()}.pdf"), "wb") as f:
                f.write(sheet)
            pages_printed[paper] = (count_pages(sheet), count_pages(full))
            if count_pages(sheet) > MAX_SHEET_PAGES:
                problems.append(f"the junction sheet prints on {count_pages(sheet)} {paper} pages; it must fit on {MAX_SHEET_PAGES}")
        if problems:
            raise Failure("\n".join(problems))
        print(f"browser check passed: {', '.join(f'{k} {v}' for k, v in numbers.items())}; "
              f"{len(page['svgs'])} drawings rendered; printed pages (sheet, whole report): "
              f"{', '.join(f'{p} {s}, {w}' for p, (s, w) in pages_printed.items())}; screenshot {os.path.join(artifacts, 'report.png')}")
    finally:
        stop_chromium(proc)
        shutil.rmtree(profile, ignore_errors=True)


def run_check(name, usage, check_function, n_arguments):
    """Runs check_function(*arguments, chromium) from the command line: exit 0 passed, 1 failed, 2
    the browser could not be started or driven (also a failure); the last argument may name chromium."""
    if len(sys.argv) not in (n_arguments + 1, n_arguments + 2):
        print(usage)
        return 2
    chromium = sys.argv[n_arguments + 1] if len(sys.argv) == n_arguments + 2 else "/usr/bin/chromium"
    try:
        check_function(*sys.argv[1:n_arguments + 1], chromium)
    except Failure as e:
        print(f"{name} FAILED:\n" + str(e))
        return 1
    except (BrowserTrouble, OSError, socket.timeout) as e:
        print(f"{name} FAILED: the browser could not be started or driven: " + str(e))
        return 2
    return 0


def main():
    return run_check("browser check", __doc__, check, 3)


if __name__ == "__main__":
    sys.exit(main())
