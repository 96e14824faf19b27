// The explorable field's style and page script. The script only reads the JSON block: every number
// it shows comes from the solver's data there, interpolated linearly (barycentric) in a triangle.
#include "report/explorable_field_script.h"

namespace edgeflux {

const char* const explorable_field_css = R"CSS(
#explore .xf-controls { display: flex; flex-wrap: wrap; gap: 1mm 5mm; align-items: center; font-size: 8.5pt; margin: 0 0 1mm; }
#explore .xf-controls label { white-space: nowrap; }
#explore button { font: inherit; min-width: 8mm; padding: 0.3mm 2mm; }
#explore .xf-readout { min-height: 6.5mm; font-size: 8.5pt; padding: 1mm 2mm; border: 0.3mm solid var(--rule); border-bottom: none;
                       background: var(--soft); font-variant-numeric: tabular-nums; }
#explore .xf-hint { color: var(--muted); }
#explore svg.xf-svg { width: 100%; height: auto; max-height: 85vh; border: 0.3mm solid var(--rule); cursor: crosshair; touch-action: none; }
#explore svg.xf-print { display: none; }
#xf-outline path { vector-effect: non-scaling-stroke; stroke-width: 0.8px; }
#xf-outline path:last-child { stroke-width: 1.6px; }
@media print {
  #explore .xf-controls, #explore .xf-readout, #explore .xf-stage, .xf-heading { display: none; }  /* the caption names the figure */
  #explore svg.xf-print { display: block; }
}
)CSS";

const char* const explorable_field_script = R"JS(
(() => {
  'use strict';
  const data = JSON.parse(document.getElementById('xf-data').textContent);
  const svg = document.getElementById('xf-svg');
  const figure = document.getElementById('explore');
  const hint = figure.querySelector('.xf-hint'), values = figure.querySelector('.xf-values');
  const shown = name => figure.querySelector(`[data-xf="${name}"]`);
  const cursor = document.getElementById('xf-cursor');
  const [ax, bx, ay, by] = data.map;  // paper mm = a · section m + b, per axis

  // The mesh in metres, and a uniform grid of about one cell per triangle; each triangle is listed
  // in every cell its bounding box touches, so a point finds it among its own cell's few.
  const n = data.theta.length, tri = Int32Array.from(data.triangles), nt = tri.length / 3;
  const X = new Float64Array(n), Y = new Float64Array(n);
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (let i = 0; i < n; ++i) {
    X[i] = data.x_um[i] * 1e-6, Y[i] = data.y_um[i] * 1e-6;
    x0 = Math.min(x0, X[i]), x1 = Math.max(x1, X[i]), y0 = Math.min(y0, Y[i]), y1 = Math.max(y1, Y[i]);
  }
  const width = Math.max(x1 - x0, 1e-9), height = Math.max(y1 - y0, 1e-9), side = Math.sqrt(width * height / Math.max(nt, 1));
  const nx = Math.min(2048, Math.max(1, Math.ceil(width / side))), ny = Math.min(2048, Math.max(1, Math.ceil(height / side)));
  const col = x => Math.min(nx - 1, Math.max(0, Math.floor((x - x0) / width * nx)));
  const row = y => Math.min(ny - 1, Math.max(0, Math.floor((y - y0) / height * ny)));
  const span = t => {
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    return [col(Math.min(X[a], X[b], X[c])), col(Math.max(X[a], X[b], X[c])), row(Math.min(Y[a], Y[b], Y[c])), row(Math.max(Y[a], Y[b], Y[c]))];
  };
  const start = new Uint32Array(nx * ny + 1);
  for (let t = 0; t < nt; ++t) {
    const [i0, i1, j0, j1] = span(t);
    for (let j = j0; j <= j1; ++j) for (let i = i0; i <= i1; ++i) ++start[j * nx + i + 1];
  }
  for (let c = 0; c < nx * ny; ++c) start[c + 1] += start[c];
  const listed = new Int32Array(start[nx * ny]), next = start.slice(0, nx * ny);
  for (let t = 0; t < nt; ++t) {
    const [i0, i1, j0, j1] = span(t);
    for (let j = j0; j <= j1; ++j) for (let i = i0; i <= i1; ++i) listed[next[j * nx + i]++] = t;
  }

  const barycentric = (t, px, py) => {
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const d = (Y[b] - Y[c]) * (X[a] - X[c]) + (X[c] - X[b]) * (Y[a] - Y[c]);
    const l0 = ((Y[b] - Y[c]) * (px - X[c]) + (X[c] - X[b]) * (py - Y[c])) / d;
    const l1 = ((Y[c] - Y[a]) * (px - X[c]) + (X[a] - X[c]) * (py - Y[c])) / d;
    return [l0, l1, 1 - l0 - l1];
  };
  // The triangle holding (px, py); outside the section, the nearest point of an edge within
  // `reach` metres, so a pointer on the outline reads the surface.
  const locate = (px, py, reach) => {
    if (px >= x0 && px <= x1 && py >= y0 && py <= y1) {
      const c = row(py) * nx + col(px);
      for (let k = start[c]; k < start[c + 1]; ++k) {
        const l = barycentric(listed[k], px, py);
        if (l[0] >= -1e-9 && l[1] >= -1e-9 && l[2] >= -1e-9) return {t: listed[k], l, x: px, y: py};
      }
    }
    let best = null, nearest = reach;
    for (let j = row(py - reach); j <= row(py + reach); ++j)
      for (let i = col(px - reach); i <= col(px + reach); ++i)
        for (let k = start[j * nx + i]; k < start[j * nx + i + 1]; ++k) {
          const t = listed[k];
          for (let e = 0; e < 3; ++e) {
            const a = tri[3 * t + e], b = tri[3 * t + (e + 1) % 3], ex = X[b] - X[a], ey = Y[b] - Y[a], length2 = ex * ex + ey * ey;
            const s = length2 > 0 ? Math.min(1, Math.max(0, ((px - X[a]) * ex + (py - Y[a]) * ey) / length2)) : 0;
            const qx = X[a] + s * ex, qy = Y[a] + s * ey, d = Math.hypot(px - qx, py - qy);
            if (d <= nearest) {
              const l = [0, 0, 0];
              l[e] = 1 - s, l[(e + 1) % 3] = s;
              nearest = d, best = {t, l, x: qx, y: qy};
            }
          }
        }
    return best;
  };
  // As the report's tables write numbers (number_format.h): fixed decimals, no sign on a zero.
  const fixed = (v, decimals) => (Math.abs(v) < 0.5 * 10 ** -decimals ? 0 : v).toFixed(decimals);

  const paperAt = (clientX, clientY) => new DOMPoint(clientX, clientY).matrixTransform(svg.getScreenCTM().inverse());
  const hintText = hint.textContent;
  const show = ev => {
    const p = paperAt(ev.clientX, ev.clientY), pixel = 1 / svg.getScreenCTM().a;  // mm of paper per screen pixel
    // Up to 4 pixels off the section, and across the strip a raster sample leaves at the outline.
    const at = locate((p.x - bx) / ax, (p.y - by) / ay, Math.max(4 * pixel / Math.abs(ax), data.raster_step_m));
    if (!at) {
      values.hidden = true, hint.hidden = false, hint.textContent = 'Outside the section.';
      cursor.setAttribute('display', 'none');
      return;
    }
    const a = tri[3 * at.t], b = tri[3 * at.t + 1], c = tri[3 * at.t + 2];
    const theta = at.l[0] * data.theta[a] + at.l[1] * data.theta[b] + at.l[2] * data.theta[c];
    shown('theta').textContent = fixed(theta, data.theta_decimals);
    shown('q').textContent = fixed(data.q[at.t], data.q_decimals);
    shown('material').textContent = data.materials[data.material[at.t]] ?? '';
    values.hidden = false, hint.hidden = true;
    cursor.setAttribute('cx', ax * at.x + bx), cursor.setAttribute('cy', ay * at.y + by), cursor.setAttribute('r', 5 * pixel);
    cursor.setAttribute('display', 'inline');
  };

  // Zoom and pan change the view box only, within the whole picture; the fills' seam strokes
  // shrink with the zoom so they stay hairlines.
  const home = data.viewbox.slice(), maxZoom = 64, rings = Array.from(svg.querySelectorAll('.xf-ring'));
  for (const ring of rings) ring.dataset.r = ring.getAttribute('r');
  let view = home.slice();
  // In the live view of `edgeflux watch` (which reloads the page every two seconds) the view
  // survives the reload while the picture's extent is the same.
  const live = document.querySelector('.live-banner') !== null, viewKey = 'xf-view:' + location.pathname;
  try {
    const saved = live ? JSON.parse(sessionStorage.getItem(viewKey) || 'null') : null;
    if (saved && saved.home.join(' ') === home.join(' ')) view = saved.view;
  } catch (e) {}
  const apply = () => {
    view[0] = Math.min(Math.max(view[0], home[0]), home[0] + home[2] - view[2]);
    view[1] = Math.min(Math.max(view[1], home[1]), home[1] + home[3] - view[3]);
    svg.setAttribute('viewBox', view.join(' '));
    if (live) try { sessionStorage.setItem(viewKey, JSON.stringify({home, view})); } catch (e) {}
    for (const fill of svg.querySelectorAll('.xf-fill')) fill.setAttribute('stroke-width', data.seam * view[2] / home[2]);
    for (const ring of rings) ring.setAttribute('r', ring.dataset.r * view[2] / home[2]);
    if (cursor.getAttribute('display') !== 'none') cursor.setAttribute('r', 5 / svg.getScreenCTM().a);
  };
  const zoomAt = (px, py, factor) => {
    const w = Math.min(home[2], Math.max(home[2] / maxZoom, view[2] / factor)), k = w / view[2];
    view = [px - (px - view[0]) * k, py - (py - view[1]) * k, w, home[3] * w / home[2]];
    apply();
  };
  svg.addEventListener('wheel', ev => {
    ev.preventDefault();
    const p = paperAt(ev.clientX, ev.clientY);
    zoomAt(p.x, p.y, ev.deltaY < 0 ? 1.25 : 1 / 1.25);
  }, {passive: false});
  const centre = () => [view[0] + view[2] / 2, view[1] + view[3] / 2];
  document.getElementById('xf-zoom-in').addEventListener('click', () => zoomAt(...centre(), 1.5));
  document.getElementById('xf-zoom-out').addEventListener('click', () => zoomAt(...centre(), 1 / 1.5));
  document.getElementById('xf-reset').addEventListener('click', () => { view = home.slice(); apply(); });

  let drag = null;
  svg.addEventListener('pointerdown', ev => {
    if (ev.button !== 0) return;
    drag = {id: ev.pointerId, x: ev.clientX, y: ev.clientY, view: view.slice(), scale: svg.getScreenCTM().a, moved: false};
    svg.setPointerCapture(ev.pointerId);
    show(ev);  // a tap reads the point
  });
  svg.addEventListener('pointermove', ev => {
    if (drag && ev.pointerId === drag.id && (ev.buttons & 1)) {
      const dx = ev.clientX - drag.x, dy = ev.clientY - drag.y;
      if (drag.moved || Math.hypot(dx, dy) >= 3) {
        drag.moved = true;
        view[0] = drag.view[0] - dx / drag.scale, view[1] = drag.view[1] - dy / drag.scale;
        apply();
        return;
      }
    }
    show(ev);
  });
  const release = ev => { if (drag && ev.pointerId === drag.id) drag = null; };
  svg.addEventListener('pointerup', release);
  svg.addEventListener('pointercancel', release);

  // The switches (also as the browser restores them on reload).
  const isotherms = document.getElementById('xf-isotherms');
  const showIsotherms = () => document.getElementById('xf-iso').setAttribute('display', isotherms.checked ? 'inline' : 'none');
  isotherms.addEventListener('change', showIsotherms);
  showIsotherms();
  const colours = Array.from(figure.querySelectorAll('input[name="xf-colour"]'));
  const showColour = () => {
    const q = colours.some(r => r.checked && r.value === 'q');
    document.getElementById('xf-theta').setAttribute('display', q ? 'none' : 'inline');
    document.getElementById('xf-q')?.setAttribute('display', q ? 'inline' : 'none');
  };
  for (const r of colours) r.addEventListener('change', showColour);
  showColour();
  if (live) apply();
})();
)JS";

}  // namespace edgeflux
