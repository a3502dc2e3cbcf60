// Small SVG charts drawn by our own code (no library, works offline). Text via textContent.
import { minusSigns } from "./math.mjs";

const NS = "http://www.w3.org/2000/svg";

function s(tag, attrs, text) {
  const el = document.createElementNS(NS, tag);
  for (const [k, v] of Object.entries(attrs || {})) el.setAttribute(k, String(v));
  if (text !== undefined) el.textContent = text;
  return el;
}

// A number as a label: the site's minus rule (math.mjs), and no "−0" (a tick at zero reads 0).
function minus(text) {
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : minusSigns(text);
}

function niceTicks(lo, hi, count = 5) {
  if (!(hi > lo)) { hi = lo + 1; }
  const span = hi - lo;
  const step0 = span / count;
  const mag = Math.pow(10, Math.floor(Math.log10(step0)));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((st) => span / st <= count + 0.5) || 10 * mag;
  const ticks = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) ticks.push(Number(t.toFixed(10)));
  return ticks;
}

// lineChart({title, xLabel, yLabel, series: [{name, points: [[x, y]...], dash, end: {at: [x, y], label}}],
//   marker: [x, y], hLines: [{y, label}], xRange: [x0, x1]}); a series with an end stops there with a bar.
export function lineChart(opts) {
  const W = 640, H = 340, L = 70, R = 20, T = 30, B = 50;
  const pts = opts.series.flatMap((se) => se.points);
  if (opts.marker) pts.push(opts.marker);
  for (const hl of opts.hLines || []) pts.push([pts.length ? pts[0][0] : 0, hl.y]);
  let xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
  let x0 = Math.min(...xs), x1 = Math.max(...xs), y0 = Math.min(...ys), y1 = Math.max(...ys);
  if (opts.xRange) [x0, x1] = opts.xRange;
  if (y1 - y0 < 1e-3) { y0 -= 0.01; y1 += 0.01; }
  const pad = (y1 - y0) * 0.08; y0 -= pad; y1 += pad;
  const X = (x) => L + ((x - x0) / (x1 - x0 || 1)) * (W - L - R);
  const Y = (y) => T + (1 - (y - y0) / (y1 - y0)) * (H - T - B);
  const svg = s("svg", { viewBox: `0 0 ${W} ${H}`, class: "cw-chart", role: "img" });
  svg.append(s("title", {}, opts.title || "chart"));
  if (opts.desc) svg.append(s("desc", {}, opts.desc));
  const axis = s("g", { class: "cw-axis" });
  for (const t of niceTicks(x0, x1, 6)) {
    axis.append(s("line", { x1: X(t), x2: X(t), y1: T, y2: H - B, class: "cw-grid" }));
    axis.append(s("text", { x: X(t), y: H - B + 16, "text-anchor": "middle" }, opts.xFormat ? opts.xFormat(t) : minus(String(t))));
  }
  for (const t of niceTicks(y0, y1, 6)) {
    axis.append(s("line", { x1: L, x2: W - R, y1: Y(t), y2: Y(t), class: "cw-grid" }));
    axis.append(s("text", { x: L - 6, y: Y(t) + 4, "text-anchor": "end" }, minus(t.toFixed(Math.abs(y1 - y0) < 0.2 ? 3 : 2))));
  }
  axis.append(s("rect", { x: L, y: T, width: W - L - R, height: H - T - B, class: "cw-frame" }));
  axis.append(s("text", { x: (L + W - R) / 2, y: H - 10, "text-anchor": "middle", class: "cw-axis-label" }, opts.xLabel || ""));
  axis.append(s("text", { x: 16, y: (T + H - B) / 2, "text-anchor": "middle", transform: `rotate(-90 16 ${(T + H - B) / 2})`, class: "cw-axis-label" }, opts.yLabel || ""));
  svg.append(axis);
  for (const hl of opts.hLines || []) {
    svg.append(s("line", { x1: L, x2: W - R, y1: Y(hl.y), y2: Y(hl.y), class: "cw-hline" }));
    svg.append(s("text", { x: W - R - 4, y: Y(hl.y) - 4, "text-anchor": "end", class: "cw-hline-label" }, hl.label));
  }
  opts.series.forEach((se, i) => {
    const d = se.points.map((p, j) => (j ? "L" : "M") + X(p[0]).toFixed(1) + " " + Y(p[1]).toFixed(1)).join(" ");
    svg.append(s("path", { d, class: "cw-line cw-line-" + i, "stroke-dasharray": se.dash || (i ? "6 4" : "none") }));
    if (se.end) {  // a line that stops: a bar across its end, and what takes over there
      const [ex, ey] = se.end.at;
      svg.append(s("line", { x1: X(ex), x2: X(ex), y1: Y(ey) - 8, y2: Y(ey) + 8, class: "cw-line cw-line-" + i + " cw-line-end" }));
      if (se.end.label) svg.append(s("text", { x: X(ex) + 5, y: Y(ey) - 10, class: "cw-end-label" }, se.end.label));
    }
    if (opts.series.length === 1) {
      const last = se.points[se.points.length - 1];
      if (last && se.name) svg.append(s("text", { x: X(last[0]) - 4, y: Y(last[1]) - 6, "text-anchor": "end", class: "cw-line-label" }, se.name));
    }
  });
  if (opts.series.length > 1) {  // a legend (line sample + name) instead of labels that collide
    const lg = s("g", { class: "cw-legend-box" });
    const rowH = 15, w = 150;
    const x = opts.legendRight ? W - R - w - 6 : L + 6;
    lg.append(s("rect", { x, y: T + 4, width: w, height: rowH * opts.series.length + 6, class: "cw-legend-bg" }));
    opts.series.forEach((se, i) => {
      const y = T + 4 + 6 + rowH * i + 5;
      lg.append(s("line", { x1: x + 6, x2: x + 30, y1: y, y2: y, class: "cw-line cw-line-" + i, "stroke-dasharray": se.dash || (i ? "6 4" : "none") }));
      lg.append(s("text", { x: x + 36, y: y + 4 }, se.name || ""));
    });
    svg.append(lg);
  }
  if (opts.marker) {
    const [mx, my] = opts.marker;
    svg.append(s("circle", { cx: X(mx), cy: Y(my), r: 6, class: "cw-marker" }));
    svg.append(s("text", { x: X(mx) + 9, y: Y(my) + 4, class: "cw-marker-label" }, opts.markerLabel || "your conditions"));
  }
  return svg;
}

// scaleChart({title, desc, axisLabel, anodicEnd: "low" | "high", rows: [{label, low, high, mid, role}],
//   allowable, context: [values], contextLabel}): where two parts sit on one scale (a galvanic
// series in volts, or the anodic index), the more anodic end on the left either way; each part a
// bar over its published range with a dot at its nominal value, the gap between the nominal
// values, and the band the environment allows measured from the cathode.
export function scaleChart(o) {
  const W = 640, L = 20, R = 20, T = 34, ROW = 46;
  const rows = o.rows || [];
  const H = T + ROW * rows.length + 106;
  const vals = rows.flatMap((r) => [r.low, r.high]).concat(o.context || []);
  const cat = rows.find((r) => r.role === "cathode"), an = rows.find((r) => r.role === "anode");
  const left = o.anodicEnd === "high";  // the index: the larger value is the more anodic one
  if (cat && o.allowable) vals.push(cat.mid + (left ? o.allowable : -o.allowable));
  let lo = Math.min(...vals), hi = Math.max(...vals);
  const pad = Math.max(0.05, (hi - lo) * 0.08);
  lo -= pad; hi += pad;
  const X = (v) => L + (left ? (hi - v) / (hi - lo) : (v - lo) / (hi - lo)) * (W - L - R);
  const svg = s("svg", { viewBox: `0 0 ${W} ${H}`, class: "cw-chart cw-scale", role: "img" });
  svg.append(s("title", {}, o.title || "scale"));
  if (o.desc) svg.append(s("desc", {}, o.desc));
  const axisY = T + ROW * rows.length + 26;
  const g = s("g", { class: "cw-axis" });
  for (const t of niceTicks(lo, hi, 7)) {
    g.append(s("line", { x1: X(t), x2: X(t), y1: T - 6, y2: axisY, class: "cw-grid" }));
    g.append(s("text", { x: X(t), y: axisY + 16, "text-anchor": "middle" }, minus(t.toFixed(2))));
  }
  g.append(s("line", { x1: L, x2: W - R, y1: axisY, y2: axisY, class: "cw-frame" }));
  g.append(s("text", { x: L, y: axisY + 34, "text-anchor": "start", class: "cw-axis-label" }, "← more anodic"));
  g.append(s("text", { x: W - R, y: axisY + 34, "text-anchor": "end", class: "cw-axis-label" }, "more noble →"));
  g.append(s("text", { x: W / 2, y: axisY + 54, "text-anchor": "middle", class: "cw-axis-label" }, o.axisLabel || ""));
  svg.append(g);
  for (const v of o.context || []) svg.append(s("line", { x1: X(v), x2: X(v), y1: axisY - 7, y2: axisY + 1, class: "cw-context" }));
  if (cat && o.allowable) {  // the allowed band: from the cathode towards the anodic end
    const x1 = X(cat.mid), x2 = X(cat.mid + (left ? o.allowable : -o.allowable));
    svg.append(s("rect", { x: Math.min(x1, x2), y: T - 6, width: Math.abs(x2 - x1), height: axisY - T + 6, class: "cw-allow-band" }));
    svg.append(s("text", { x: Math.min(x1, x2) + 4, y: T - 12, class: "cw-allow-label" }, "allowed: " + o.allowable.toFixed(2) + " V from the cathode"));
  }
  rows.forEach((r, i) => {
    const y = T + ROW * i + 22;
    const xa = X(r.low), xb = X(r.high);
    svg.append(s("rect", { x: Math.min(xa, xb), y: y - 7, width: Math.max(3, Math.abs(xb - xa)), height: 14, class: "cw-range cw-range-" + (r.role || "part") }));
    svg.append(s("circle", { cx: X(r.mid), cy: y, r: 5, class: "cw-marker" }));
    const right = X(r.mid) < W / 2;
    svg.append(s("text", { x: X(r.mid) + (right ? 10 : -10), y: y - 12, "text-anchor": right ? "start" : "end", class: "cw-row-label" }, r.label));
  });
  if (cat && an) {
    const y = T + ROW * rows.length + 8, xa = X(an.mid), xc = X(cat.mid);
    svg.append(s("line", { x1: xa, x2: xc, y1: y, y2: y, class: "cw-gap" }));
    for (const x of [xa, xc]) svg.append(s("line", { x1: x, x2: x, y1: y - 5, y2: y + 5, class: "cw-gap" }));
    svg.append(s("text", { x: (xa + xc) / 2, y: y - 6, "text-anchor": "middle", class: "cw-gap-label" }, o.gapLabel || ""));
  }
  return svg;
}
