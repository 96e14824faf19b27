#!/usr/bin/python3
"""Drives the explorable temperature field of an edgeflux HTML report in headless Chromium.

Usage: explorable_check.py REPORT.html RESULTS.json RESULTS.vtu ARTIFACT_FOLDER [CHROMIUM]

REPORT.html, RESULTS.json and RESULTS.vtu come from one `edgeflux solve`. With real pointer, wheel
and click events (DevTools Input domain) at page positions worked out here from section
coordinates, it checks:
  - the read-out at θsi,min and at the junction's own minimum (RESULTS.json) shows those
    temperatures: exact, the solver's own linear field at that node;
  - the read-out at a point inside the triangle with the widest temperature span (RESULTS.vtu,
    17 digits), at barycentric weights 0.6, 0.3, 0.1, shows the weighted nodal temperatures of
    the surface-temperature run (exact: the linear field there), |q| of that triangle in the
    heat-loss run and its material; reading a node instead, or the weights in another order,
    would be off by far more than the display's rounding;
  - the picture's map from section to paper agrees with its own outline drawn by the report;
  - the wheel zooms about the pointer (the view box shrinks, the point under it stays), the
    buttons zoom and reset, dragging pans; the isotherm switch hides and shows the isotherms, the
    colour switch swaps θ and |q|;
  - in print media the controls and the screen picture are hidden and the static copy shows the
    whole field.
For a report whose picture carries a raster sample (meshes over 60 000 triangles) the point inside a
mesh triangle is left out: only the surfaces read the solver's own triangles there. Saves the
zoomed picture as explore.png in ARTIFACT_FOLDER. Exit 0 when all checks pass, 1 when
one fails, 2 when the browser cannot be started or driven (a failure too).
"""
import base64
import itertools
import json
import math
import os
import re
import shutil
import sys
import tempfile
import urllib.parse
import xml.etree.ElementTree as ET

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from browser_check import Failure, first_page, run_check, start_chromium, stop_chromium  # noqa: E402

# Half a unit of the digits shown (θ 2 decimals, |q| 1 decimal), plus 0.001 for where the pointer
# lands at the largest zoom and the rounding of the embedded data (θ to 1e-5 K, points to 1 µm).
THETA_TOLERANCE = 0.005 + 0.001
Q_TOLERANCE = 0.05 + 0.001


def read_vtu(path):
    """Points, triangles, θ of the surface-temperature run, q of the heat-loss run and the material
    names of an edgeflux .vtu (ASCII), with the standard library's XML reader."""
    with open(path, encoding="utf-8") as f:
        text = f.read()
    arrays = {a.get("Name"): a.text.split() for a in ET.fromstring(text).iter("DataArray")}
    points = [(float(arrays["Points"][3 * i]), float(arrays["Points"][3 * i + 1])) for i in range(len(arrays["Points"]) // 3)]
    connectivity = [int(v) for v in arrays["connectivity"]]
    triangles = [connectivity[3 * t:3 * t + 3] for t in range(len(connectivity) // 3)]
    flux = arrays["heat_flux_w_per_m2"]
    names = dict(re.findall(r"(\d+)=(\S+)", re.search(r"<!-- material_id:(.*?)-->", text).group(1)))
    return {"points": points, "triangles": triangles, "theta": [float(v) for v in arrays["temperature_surface_run_c"]],
            "q": [math.hypot(float(flux[3 * t]), float(flux[3 * t + 1])) for t in range(len(triangles))],
            "material": [names[v] for v in arrays["material_id"]]}


def evaluate(dt, expression):
    result = dt.call("Runtime.evaluate", expression=expression, returnByValue=True, awaitPromise=True)
    if "exceptionDetails" in result:
        raise Failure("page script failed: " + json.dumps(result["exceptionDetails"])[:400])
    return result["result"].get("value")


def client_of(dt, x_m, y_m):
    """The viewport position of a section point in the screen picture, by the data's map and the
    picture's current screen transform."""
    return evaluate(dt, f"""(() => {{
        const m = JSON.parse(document.getElementById('xf-data').textContent).map, svg = document.getElementById('xf-svg');
        const p = new DOMPoint(m[0] * {x_m!r} + m[1], m[2] * {y_m!r} + m[3]).matrixTransform(svg.getScreenCTM());
        return [p.x, p.y]; }})()""")


def section_of(dt, x, y):
    """The section point (m) under a viewport position of the screen picture."""
    return evaluate(dt, f"""(() => {{
        const m = JSON.parse(document.getElementById('xf-data').textContent).map, svg = document.getElementById('xf-svg');
        const p = new DOMPoint({x!r}, {y!r}).matrixTransform(svg.getScreenCTM().inverse());
        return [(p.x - m[1]) / m[0], (p.y - m[3]) / m[2]]; }})()""")


def view_box(dt):
    return [float(v) for v in evaluate(dt, "document.getElementById('xf-svg').getAttribute('viewBox')").split()]


def move(dt, x, y, buttons=0):
    dt.call("Input.dispatchMouseEvent", type="mouseMoved", x=x, y=y, buttons=buttons, button="left" if buttons else "none")


def click(dt, selector):
    x, y = evaluate(dt, f"(() => {{ const r = document.querySelector({selector!r}).getBoundingClientRect(); "
                        "return [r.left + r.width / 2, r.top + r.height / 2]; })()")
    for kind in ("mousePressed", "mouseReleased"):
        dt.call("Input.dispatchMouseEvent", type=kind, x=x, y=y, button="left", buttons=1 if kind == "mousePressed" else 0, clickCount=1)


def read_out(dt):
    return evaluate(dt, """(() => { const f = document.getElementById('explore'), v = f.querySelector('.xf-values');
        return v.hidden ? null : {theta: f.querySelector('[data-xf="theta"]').textContent, q: f.querySelector('[data-xf="q"]').textContent,
                                  material: f.querySelector('[data-xf="material"]').textContent}; })()""")


def probe(dt, name, x_m, y_m, problems, home):
    """Zooms in fully with the wheel about the point, points at it and returns the read-out."""
    click(dt, "#xf-reset")
    # Mouse events arrive at whole pixels: the wheel zooms about the section point under that pixel,
    # and the point asked for drifts away from it by up to 64 × its fraction of a pixel. Taking
    # the pixel on the outer side of the point lets it drift towards the middle of the picture.
    xt, yt = client_of(dt, x_m, y_m)
    middle_x, middle_y = evaluate(dt, "(() => { const r = document.getElementById('xf-svg').getBoundingClientRect(); "
                                      "return [r.left + r.width / 2, r.top + r.height / 2]; })()")
    x = math.floor(xt) if xt < middle_x else math.ceil(xt)
    y = math.floor(yt) if yt < middle_y else math.ceil(yt)
    under = section_of(dt, x, y)
    for _ in range(20):
        dt.call("Input.dispatchMouseEvent", type="mouseWheel", x=x, y=y, deltaX=0, deltaY=-100)
    box = view_box(dt)
    if not abs(box[2] - home[2] / 64) < 1e-6 * home[2]:
        problems.append(f"{name}: 20 wheel notches give a view {box[2]:.4f} mm wide, expected the largest zoom, {home[2] / 64:.4f} mm")
    still = client_of(dt, *under)
    if math.hypot(still[0] - x, still[1] - y) > 0.5:
        problems.append(f"{name}: the point under the pointer at ({x}, {y}) px moved to ({still[0]:.1f}, {still[1]:.1f}) px while zooming")
    after = client_of(dt, x_m, y_m)
    move(dt, *after)
    shown = read_out(dt)
    if shown is None:
        problems.append(f"{name}: no read-out at ({after[0]:.1f}, {after[1]:.1f}) px, section point ({x_m}, {y_m}) m")
    return shown


def check(report, results_file, vtu_file, artifacts, chromium):
    with open(results_file) as f:
        results = json.load(f)
    vtu = read_vtu(vtu_file)
    os.makedirs(artifacts, exist_ok=True)
    profile = tempfile.mkdtemp(prefix="edgeflux-chromium-")
    proc = None
    try:
        proc, port = start_chromium(chromium, profile)
        dt = first_page(port, ("Page", "Runtime"))
        dt.call("Emulation.setDeviceMetricsOverride", width=1000, height=1300, deviceScaleFactor=1, mobile=False)
        dt.call("Page.navigate", url="file://" + urllib.parse.quote(os.path.abspath(report)))
        dt.wait_for("Page.loadEventFired")
        if not evaluate(dt, "!!document.getElementById('xf-svg')"):
            raise Failure("the report has no explorable picture (#xf-svg)")
        evaluate(dt, "document.getElementById('xf-svg').scrollIntoView({block: 'center'}); true")
        problems = []
        home = view_box(dt)

        # The map from section to paper against the outline the report drew (path_d, 0.01 mm).
        outline = evaluate(dt, "(() => { const b = document.querySelector('#xf-outline path:last-child').getBBox(); "
                               "return [b.x, b.y, b.width, b.height]; })()")
        m = evaluate(dt, "JSON.parse(document.getElementById('xf-data').textContent).map")
        xs, ys = [p[0] for p in vtu["points"]], [p[1] for p in vtu["points"]]
        mapped = [m[0] * min(xs) + m[1], m[2] * max(ys) + m[3], m[0] * (max(xs) - min(xs)), -m[2] * (max(ys) - min(ys))]
        if any(abs(a - b) > 0.011 for a, b in zip(mapped, outline)):
            problems.append(f"the data's map puts the section at {mapped} mm, the outline is drawn at {outline} mm")

        # θsi,min and the junction's own minimum: nodes of the mesh.
        for key in ("min_interior_surface", "junction_min_interior_surface"):
            point = results.get(key)
            if not point:
                continue
            shown = probe(dt, key, point["x_m"], point["y_m"], problems, home)
            if shown is not None:
                exact = point["temperature_c"]  # exact: the solver's own linear field at that node
                if abs(float(shown["theta"]) - exact) > THETA_TOLERANCE:
                    problems.append(f"{key}: the read-out shows θ = {shown['theta']} °C, the solver {exact:.5f} °C")
                print(f"{key}: ({point['x_m']}, {point['y_m']}) m, read-out θ = {shown['theta']} °C, solver {exact:.5f} °C")

        raster = evaluate(dt, "JSON.parse(document.getElementById('xf-data').textContent).raster_step_m")
        if raster:
            print(f"the picture carries a raster sample every {raster * 1000:.1f} mm inside: reading the solver's linear field "
                  "inside a mesh triangle is not checked")
        # A point inside the triangle with the widest temperature span, at barycentric weights
        # 0.6, 0.3, 0.1: reading a node, or the weights in another order, would be far off.
        weights = (0.6, 0.3, 0.1)
        span = lambda t: max(vtu["theta"][v] for v in vtu["triangles"][t]) - min(vtu["theta"][v] for v in vtu["triangles"][t])
        t = max(range(len(vtu["triangles"])), key=span)
        corners = vtu["triangles"][t]
        nodal = [vtu["theta"][v] for v in corners]
        px = sum(w * vtu["points"][v][0] for w, v in zip(weights, corners))
        py = sum(w * vtu["points"][v][1] for w, v in zip(weights, corners))
        exact = sum(w * theta for w, theta in zip(weights, nodal))  # exact: the solver's linear field at that point
        wrong = nodal + [sum(w * theta for w, theta in zip(order, nodal)) for order in itertools.permutations(weights) if order != weights]
        if min(abs(v - exact) for v in wrong) < 10 * THETA_TOLERANCE:
            problems.append(f"triangle {t} spans only {span(t):.4f} K: the point would not tell interpolation from a wrong one")
        shown = probe(dt, "inner point", px, py, problems, home) if not raster else None
        if shown is not None:
            if abs(float(shown["theta"]) - exact) > THETA_TOLERANCE:
                problems.append(f"inner point of triangle {t}: the read-out shows θ = {shown['theta']} °C, the solver's linear field {exact:.5f} °C")
            if abs(float(shown["q"]) - vtu["q"][t]) > Q_TOLERANCE:  # exact: |q| of that triangle, heat-loss run
                problems.append(f"inner point of triangle {t}: the read-out shows |q| = {shown['q']} W/m², the solver {vtu['q'][t]:.4f} W/m²")
            if shown["material"] != vtu["material"][t]:
                problems.append(f"inner point of triangle {t}: the read-out names {shown['material']!r}, the mesh {vtu['material'][t]!r}")
            print(f"inner point of triangle {t} at ({px:.6f}, {py:.6f}) m, nodal θ {', '.join('%.4f' % v for v in nodal)} °C, "
                  f"weights {weights}: read-out θ = {shown['theta']} °C (solver {exact:.5f}), |q| = {shown['q']} W/m² "
                  f"(solver {vtu['q'][t]:.4f}), {shown['material']}")
        shot = dt.call("Page.captureScreenshot", format="png", clip=dict(zip(("x", "y", "width", "height"), evaluate(
            dt, "(() => { const r = document.getElementById('explore').getBoundingClientRect(); "
                "return [r.left + scrollX, r.top + scrollY, r.width, Math.min(r.height, 1300)]; })()")), scale=1))
        with open(os.path.join(artifacts, "explore.png"), "wb") as f:
            f.write(base64.b64decode(shot["data"]))

        # Buttons and dragging.
        click(dt, "#xf-reset")
        if view_box(dt) != home:
            problems.append(f"reset gives the view box {view_box(dt)}, not the whole picture {home}")
        click(dt, "#xf-zoom-in")
        zoomed = view_box(dt)
        if not abs(zoomed[2] - home[2] / 1.5) < 1e-6 * home[2]:
            problems.append(f"the + button gives a view {zoomed[2]} mm wide, expected {home[2] / 1.5}")
        x, y = client_of(dt, (min(xs) + max(xs)) / 2, (min(ys) + max(ys)) / 2)
        dt.call("Input.dispatchMouseEvent", type="mousePressed", x=x, y=y, button="left", buttons=1, clickCount=1)
        for k in range(1, 6):
            move(dt, x - 8 * k, y - 6 * k, buttons=1)
        dt.call("Input.dispatchMouseEvent", type="mouseReleased", x=x - 40, y=y - 30, button="left", buttons=0, clickCount=1)
        dragged = view_box(dt)
        if not (dragged[0] > zoomed[0] and dragged[1] > zoomed[1] and dragged[2] == zoomed[2]):
            problems.append(f"dragging up and left moved the view box from {zoomed} to {dragged}")
        click(dt, "#xf-zoom-out")
        if view_box(dt)[2] != home[2]:
            problems.append(f"the − button does not return to the whole width: {view_box(dt)}")

        # The switches.
        shown_iso = "(() => { const g = document.getElementById('xf-iso'); return getComputedStyle(g).display !== 'none' && g.getBoundingClientRect().width > 0; })()"
        if not evaluate(dt, shown_iso):
            problems.append("the isotherms are not shown at first")
        click(dt, "#xf-isotherms")
        if evaluate(dt, shown_iso):
            problems.append("the isotherm switch does not hide the isotherms")
        click(dt, "#xf-isotherms")
        if not evaluate(dt, shown_iso):
            problems.append("the isotherm switch does not show the isotherms again")
        layer = "(id => { const g = document.getElementById(id); return getComputedStyle(g).display !== 'none' && g.getBoundingClientRect().width > 0; })"
        if evaluate(dt, "!!document.getElementById('xf-q')"):
            click(dt, "input[name='xf-colour'][value='q']")
            if not (evaluate(dt, layer + "('xf-q')") and not evaluate(dt, layer + "('xf-theta')")):
                problems.append("the |q| colour switch does not swap the temperature bands for the flux classes")
            click(dt, "input[name='xf-colour'][value='theta']")
            if not (evaluate(dt, layer + "('xf-theta')") and not evaluate(dt, layer + "('xf-q')")):
                problems.append("the θ colour switch does not bring the temperature bands back")

        # Print: no controls, no screen picture; the static copy at the whole view.
        click(dt, "#xf-zoom-in")
        dt.call("Emulation.setEmulatedMedia", media="print")
        printed = evaluate(dt, """(() => {
            const size = e => { const r = e.getBoundingClientRect(); return r.width * r.height; };
            const copy = document.querySelector('#explore svg.xf-print');
            return {controls: size(document.querySelector('#explore .xf-controls')), readout: size(document.querySelector('#explore .xf-readout')),
                    screen: size(document.getElementById('xf-svg')), copy: size(copy), view: copy.getAttribute('viewBox'),
                    bands: copy.querySelector('use').getBBox().width}; })()""")
        dt.call("Emulation.setEmulatedMedia", media="")
        if printed["controls"] or printed["readout"] or printed["screen"]:
            problems.append(f"in print the controls, read-out or screen picture still take room: {printed}")
        if not (printed["copy"] > 0 and printed["bands"] > 0) or [float(v) for v in printed["view"].split()] != home:
            problems.append(f"in print the static copy is missing, empty or not the whole field: {printed}")

        for e in dt.events:
            if e.get("method") == "Runtime.exceptionThrown":
                problems.append("uncaught exception: " + json.dumps(e["params"].get("exceptionDetails"))[:300])
            if e.get("method") == "Runtime.consoleAPICalled" and e["params"].get("type") in ("error", "assert"):
                problems.append("console error: " + json.dumps(e["params"].get("args"))[:300])
        if problems:
            raise Failure("\n".join(problems))
        print(f"explorable check passed: view box {home}, zoom ×64 about the pointer, buttons, drag, isotherm and colour switches, "
              f"print copy; picture saved as {os.path.join(artifacts, 'explore.png')}")
    finally:
        stop_chromium(proc)
        shutil.rmtree(profile, ignore_errors=True)


def main():
    return run_check("explorable check", __doc__, check, 4)


if __name__ == "__main__":
    sys.exit(main())
