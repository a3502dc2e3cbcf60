// The Evans diagram of a mixed-potential solution: E against log10 |I|, drawn as SVG by our own
// code (no library, works offline). Used by the mixed-potential page; any result that carries the
// same `evans` object can draw it (the joint page, for one).
//
// The input is the `evans` object of a result, as calc/evans.py evans_diagram() writes it:
//   {
//     range_V: [E_low, E_high],                      potentials drawn [V]
//     curves: [{electrode, reaction, branch,         one line per branch of a reaction;
//               points: [{E_V, log10_I_A}]}],        branch "anodic" | "cathodic"; the current is
//                                                    the branch's current density × the electrode's
//                                                    area, as log10 of amperes
//     totals: [{branch, count, points}],             Σ of every anodic (cathodic) partial current of
//                                                    all electrodes; count = branches summed
//     exchange_points: [{electrode, reaction,        where each reaction's lines start (E_eq, i0·A)
//                        E_V, log10_I_A}],
//     couple_point: {E_V, log10_I_A},                the mixed potential and the total anodic current
//     free_corrosion_points: [{electrode, E_V,       each electrode on its own (missing when it has
//                              log10_I_A}],          no free-corrosion point)
//   }
// `totals`, `exchange_points` and `log10_I_window` ([lo, hi], the decades worth drawing) are
// optional here (used when present). Potentials are on the
// scale the reactions were given on; say which with opts.potentialLabel.
//
// evansChart(evans, {title, potentialLabel, caption}) returns a <figure> holding the SVG and a key.
// It redraws itself at the width it is shown at (a ResizeObserver), so its text stays 13 px.
// Branches are told apart by line style (one dash pattern per electrode), by direct labels and by
// the key, never by colour alone; markers differ in shape; every label has a halo.
import { h } from "./site.mjs";

const NS = "http://www.w3.org/2000/svg";
const FONT = 13;                         // label size [px at 1:1]
const CHAR_W = 0.6 * FONT;               // width of one character, estimated on the safe side [px]
const LINE = FONT + 3;                   // line spacing of a two-line label [px]
const DASHES = ["none", "11 5", "2.5 4", "14 4 3 4", "7 3", "1.5 6"];
const SHAPES = ["square", "diamond", "triangle", "down", "square", "diamond"];
const SPAN_MIN = 5, SPAN_MAX = 13;       // decades drawn

function s(tag, attrs, text) {
  const el = document.createElementNS(NS, tag);
  for (const [k, v] of Object.entries(attrs || {})) el.setAttribute(k, String(v));
  if (text !== undefined) el.textContent = text;
  return el;
}

const minus = (t) => t.replace(/-/g, "\u2212");
export function potentialText(v) { return minus(v.toFixed(3)) + " V"; }

// A current from its log10: "0.80 mA", "3.2 µA".
export function currentText(log10A) {
  const v = Math.pow(10, log10A);
  for (const [f, u] of [[1, "A"], [1e-3, "mA"], [1e-6, "µA"], [1e-9, "nA"], [1e-12, "pA"]]) {
    if (v >= f * 0.9995) { const x = v / f; return (x >= 100 ? x.toFixed(0) : x >= 10 ? x.toFixed(1) : x.toFixed(2)) + " " + u; }
  }
  return minus("10^" + Math.round(log10A)) + " A";
}

// A potential step whose tick labels are exact at their decimals: 0.05, 0.1, 0.2, 0.5, ... [V]
function potentialStep(span, count) {
  const mag = Math.pow(10, Math.floor(Math.log10(span / count)));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((st) => span / st <= count + 0.5) || 10 * mag;
  return { step, decimals: Math.max(0, -Math.floor(Math.log10(step) + 1e-9)) };
}

// The decades drawn: every marked point and every exchange point, with room to the right of the
// couple point for the limited branches and the labels.
export function decadeRange(ev) {
  const keys = [ev.couple_point, ...(ev.free_corrosion_points || [])].map((p) => p.log10_I_A);
  const starts = (ev.exchange_points || []).map((p) => p.log10_I_A);
  let hi = Math.ceil(Math.max(...keys) + 1.5);
  let lo = Math.floor(Math.min(...keys, ...starts) - 0.5);
  const win = ev.log10_I_window; // the decades worth drawing, where a result gives them (the joint's)
  if (win) { lo = Math.max(lo, win[0]); hi = Math.min(hi, win[1]); }
  if (hi - lo > SPAN_MAX) lo = hi - SPAN_MAX;
  if (hi - lo < SPAN_MIN) lo = hi - SPAN_MIN;
  return [lo, hi];
}

// A polyline clipped to the box [x0, x1] × [y0, y1] (Liang–Barsky per segment): visible runs.
function clipRuns(pts, x0, x1, y0, y1) {
  const runs = [];
  let run = null;
  for (let k = 1; k < pts.length; k++) {
    const [ax, ay] = pts[k - 1], [bx, by] = pts[k];
    const dx = bx - ax, dy = by - ay;
    let t0 = 0, t1 = 1, ok = true;
    for (const [p, q] of [[-dx, ax - x0], [dx, x1 - ax], [-dy, ay - y0], [dy, y1 - ay]]) {
      if (p === 0) { if (q < 0) { ok = false; break; } continue; }
      const t = q / p;
      if (p < 0) { if (t > t1) { ok = false; break; } if (t > t0) t0 = t; } else { if (t < t0) { ok = false; break; } if (t < t1) t1 = t; }
    }
    if (!ok || !Number.isFinite(ax + ay + bx + by)) { run = null; continue; }
    const a = [ax + t0 * dx, ay + t0 * dy], b = [ax + t1 * dx, ay + t1 * dy];
    if (!run || t0 > 0) { run = [a]; runs.push(run); }
    run.push(b);
    if (t1 < 1) run = null;
  }
  return runs.filter((r) => r.length > 1);
}

function pathOf(runs) {
  return runs.map((r) => r.map((p, j) => (j ? "L" : "M") + p[0].toFixed(1) + " " + p[1].toFixed(1)).join(" ")).join(" ");
}

function marker(shape, x, y, r, cls) {
  if (shape === "square") return s("rect", { x: x - r, y: y - r, width: 2 * r, height: 2 * r, class: cls });
  const pts = { diamond: [[0, -1.3], [1.3, 0], [0, 1.3], [-1.3, 0]], triangle: [[0, -1.35], [1.25, 0.9], [-1.25, 0.9]],
    down: [[0, 1.35], [1.25, -0.9], [-1.25, -0.9]] }[shape];
  return s("polygon", { points: pts.map(([a, b]) => (x + a * r).toFixed(1) + "," + (y + b * r).toFixed(1)).join(" "), class: cls });
}

// Boxes already taken by labels and markers, and points along the lines; a new label goes where
// it covers least (its own line's points count too: a label sits beside its line, not on it).
function placer(box, obstacles) {
  const taken = [];
  const crossed = (b) => obstacles.reduce((n, o) => n + (o.x > b.x0 && o.x < b.x1 && o.y > b.y0 && o.y < b.y1 ? 40 : 0), 0);
  const overlap = (a, b) => Math.max(0, Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0)) * Math.max(0, Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0));
  const outside = (a) => (a.x0 < box.x0 || a.x1 > box.x1 || a.y0 < box.y0 || a.y1 > box.y1 ? 1e6 : 0);
  return {
    take(b) { taken.push(b); },
    best(candidates) {  // candidates: [{x, y, anchor, w, n}] (n lines, y the first baseline) -> least overlap
      let best = null;
      for (const c of candidates) {
        const x0 = c.anchor === "end" ? c.x - c.w : c.anchor === "middle" ? c.x - c.w / 2 : c.x;
        const b = { x0: x0 - 2, x1: x0 + c.w + 2, y0: c.y - FONT, y1: c.y + 4 + ((c.n || 1) - 1) * LINE };
        const cost = outside(b) + taken.reduce((sum, t) => sum + overlap(b, t), 0) + crossed(b);
        if (!best || cost < best.cost) best = { ...c, box: b, cost };
        if (cost === 0) break;
      }
      if (best) taken.push(best.box);
      return best;
    },
  };
}

// Points along a visible run where a label may sit (from the run's far end back), each above
// and below the line.
function labelSpots(runs, w, n = 1) {
  const out = [];
  const run = runs.reduce((a, b) => (b.length > a.length ? b : a), runs[0]);
  let total = 0;
  const seg = [];
  for (let k = 1; k < run.length; k++) { const d = Math.hypot(run[k][0] - run[k - 1][0], run[k][1] - run[k - 1][1]); seg.push(d); total += d; }
  for (const f of [0.86, 0.78, 0.7, 0.62, 0.54, 0.46, 0.38, 0.3, 0.22, 0.14, 0.94, 0.06]) {
    let want = f * total, k = 0;
    while (k < seg.length - 1 && want > seg[k]) { want -= seg[k]; k++; }
    const t = seg[k] ? want / seg[k] : 0;
    const x = run[k][0] + t * (run[k + 1][0] - run[k][0]), y = run[k][1] + t * (run[k + 1][1] - run[k][1]);
    const up = y - 6 - (n - 1) * LINE, down = y + FONT + 4;
    out.push({ x: x + 6, y: up, anchor: "start", w, n }, { x: x - 6, y: down, anchor: "end", w, n },
      { x: x - 6, y: up, anchor: "end", w, n }, { x: x + 6, y: down, anchor: "start", w, n });
  }
  return out;
}

// A label with a halo; lines after the first (the part's name) below it.
function haloText(x, y, anchor, lines, cls) {
  const [first, ...rest] = Array.isArray(lines) ? lines : [lines];
  const t = s("text", { x: x.toFixed(1), y: y.toFixed(1), "text-anchor": anchor, class: "cw-evans-label " + (cls || "") }, first);
  for (const line of rest) t.append(s("tspan", { x: x.toFixed(1), dy: LINE, class: "cw-evans-label-sub" }, line));
  return t;
}

// The lines a branch is labelled with: the reaction (its branch when it has two), then the part.
function lineName(c, twoBranches) {
  return [c.reaction + (twoBranches ? " (" + c.branch + ")" : ""), "on " + c.electrode];
}
function shortName(text, max = 30) { return text.length > max ? text.slice(0, max - 1) + "…" : text; }
const widthOf = (lines) => Math.max(...lines.map((l) => l.length)) * CHAR_W;

function draw(ev, opts, W) {
  const H = Math.round(Math.min(560, Math.max(400, W * 0.74)));
  const L = 62, R = 28, T = 14, B = 58;
  const [x0, x1] = decadeRange(ev);
  const [y0, y1] = ev.range_V;
  const X = (v) => L + ((v - x0) / (x1 - x0)) * (W - L - R);
  const Y = (e) => T + (1 - (e - y0) / (y1 - y0)) * (H - T - B);
  const px = (p) => [X(p.log10_I_A), Y(p.E_V)];
  const box = { x0: L, x1: W - R, y0: T, y1: H - B };
  const svg = s("svg", { viewBox: `0 0 ${W} ${H}`, width: W, height: H, class: "cw-evans", role: "img" });
  svg.append(s("title", {}, opts.title || "Evans diagram"));
  const cp = ev.couple_point;
  svg.append(s("desc", {}, "Potential against the logarithm of current, every branch multiplied by its electrode's area. " +
    "Couple point at " + potentialText(cp.E_V) + " and " + currentText(cp.log10_I_A) + ". " +
    (ev.free_corrosion_points || []).map((p) => p.electrode + " alone: " + potentialText(p.E_V) + ", " + currentText(p.log10_I_A) + ".").join(" ")));
  // axes: a decade grid, 10^n labels with the exponent raised and a true minus sign
  const axis = s("g", { class: "cw-evans-axis" });
  const every = x1 - x0 > 9 ? 2 : 1;
  for (let d = Math.ceil(x0); d <= x1; d++) {
    if ((d - Math.ceil(x0)) % every) continue;
    axis.append(s("line", { x1: X(d), x2: X(d), y1: T, y2: H - B, class: "cw-evans-grid" }));
    const t = s("text", { x: X(d), y: H - B + 20, "text-anchor": "middle" }, "10");
    t.append(s("tspan", { dy: -6, class: "cw-evans-exp" }, minus(String(d))));
    axis.append(t);
  }
  const { step, decimals } = potentialStep(y1 - y0, 9);
  for (let j = Math.ceil(y0 / step - 1e-9); j * step <= y1 + 1e-9; j++) {
    const v = j * step;
    axis.append(s("line", { x1: L, x2: W - R, y1: Y(v), y2: Y(v), class: "cw-evans-grid" }));
    axis.append(s("text", { x: L - 6, y: Y(v) + 4, "text-anchor": "end" }, minus((j === 0 ? 0 : v).toFixed(decimals))));
  }
  axis.append(s("rect", { x: L, y: T, width: W - L - R, height: H - T - B, class: "cw-evans-frame" }));
  axis.append(s("text", { x: (L + W - R) / 2, y: H - 12, "text-anchor": "middle", class: "cw-evans-axis-label" },
    "current |I| (A), log scale: each branch × its electrode's area"));
  const midY = (T + H - B) / 2;
  axis.append(s("text", { x: 15, y: midY, "text-anchor": "middle", transform: `rotate(-90 15 ${midY})`, class: "cw-evans-axis-label" },
    opts.potentialLabel || "E (V)"));
  svg.append(axis);
  const curveRuns = ev.curves.map((c) => clipRuns(c.points.map(px), box.x0, box.x1, box.y0, box.y1));
  const obstacles = [];
  curveRuns.forEach((runs) => {
    for (const run of runs) {
      for (let k = 1; k < run.length; k++) {
        const [ax, ay] = run[k - 1], [bx, by] = run[k];
        const n = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / 6));
        for (let j = 0; j < n; j++) obstacles.push({ x: ax + ((bx - ax) * j) / n, y: ay + ((by - ay) * j) / n });
      }
    }
  });
  const place = placer(box, obstacles);
  const labels = s("g", {});
  // the sums: wide pale bands under the branches (drawn only when they add something)
  for (const t of ev.totals || []) {
    if (t.count < 2) continue;
    const runs = clipRuns(t.points.map(px), box.x0, box.x1, box.y0, box.y1);
    if (!runs.length) continue;
    svg.append(s("path", { d: pathOf(runs), class: "cw-evans-total" }));
    const name = "Σ " + t.branch;
    const at = place.best(labelSpots(runs, name.length * CHAR_W));
    if (at) labels.append(haloText(at.x, at.y, at.anchor, name, "cw-evans-total-label"));
  }
  // the couple potential across the plot, and the markers (their labels placed first)
  svg.append(s("line", { x1: L, x2: W - R, y1: Y(cp.E_V), y2: Y(cp.E_V), class: "cw-evans-eline" }));
  const styleOf = new Map();
  for (const c of [...ev.curves, ...(ev.free_corrosion_points || [])]) if (!styleOf.has(c.electrode)) styleOf.set(c.electrode, styleOf.size % DASHES.length);
  const marks = s("g", {});
  const [cx, cy] = px(cp);
  const coupleText = "couple: " + potentialText(cp.E_V) + ", " + currentText(cp.log10_I_A);
  place.take({ x0: cx - 9, x1: cx + 9, y0: cy - 9, y1: cy + 9 });
  for (const p of ev.free_corrosion_points || []) {
    const [fx, fy] = px(p);
    if (fx < box.x0 || fx > box.x1 || fy < box.y0 || fy > box.y1) continue;
    place.take({ x0: fx - 8, x1: fx + 8, y0: fy - 8, y1: fy + 8 });
  }
  const cw = coupleText.length * CHAR_W;
  const at = place.best([{ x: cx + 12, y: cy - 10, anchor: "start", w: cw }, { x: cx - 12, y: cy - 10, anchor: "end", w: cw },
    { x: cx + 12, y: cy + FONT + 8, anchor: "start", w: cw }, { x: cx - 12, y: cy + FONT + 8, anchor: "end", w: cw }]);
  labels.append(haloText(at.x, at.y, at.anchor, coupleText, "cw-evans-couple-label"));
  for (const p of ev.free_corrosion_points || []) {
    const [fx, fy] = px(p);
    if (fx < box.x0 || fx > box.x1 || fy < box.y0 || fy > box.y1) continue;
    const k = styleOf.get(p.electrode) || 0;
    marks.append(marker(SHAPES[k], fx, fy, 6, "cw-evans-free cw-evans-s" + k));
    const text = shortName(p.electrode, 24) + " alone: " + potentialText(p.E_V);
    const w = text.length * CHAR_W;
    const spot = place.best([{ x: fx + 10, y: fy + 4, anchor: "start", w }, { x: fx - 10, y: fy + 4, anchor: "end", w },
      { x: fx, y: fy - 12, anchor: "middle", w }, { x: fx, y: fy + FONT + 10, anchor: "middle", w }]);
    labels.append(haloText(spot.x, spot.y, spot.anchor, text, "cw-evans-free-label"));
  }
  marks.append(s("circle", { cx, cy, r: 7, class: "cw-evans-couple" }));
  // every branch: its electrode's dash pattern and colour class, a direct label where it fits
  const lines = s("g", {});
  const twoBranches = new Set(ev.curves.filter((c) => c.branch === "anodic").map((c) => c.electrode + "\u0000" + c.reaction)
    .filter((key) => ev.curves.some((c) => c.branch === "cathodic" && c.electrode + "\u0000" + c.reaction === key)));
  const shown = [];
  ev.curves.forEach((c, owner) => {
    const k = styleOf.get(c.electrode);
    const runs = curveRuns[owner];
    const name = lineName(c, twoBranches.has(c.electrode + "\u0000" + c.reaction));
    shown.push({ curve: c, name, style: k, visible: runs.length > 0 });
    if (!runs.length) return;
    const path = s("path", { d: pathOf(runs), class: "cw-evans-line cw-evans-s" + k, "stroke-dasharray": DASHES[k], "data-branch": c.branch });
    path.append(s("title", {}, name.join(" ")));
    lines.append(path);
    const text = name.map((l) => shortName(l));
    const spot = place.best(labelSpots(runs, widthOf(text), text.length));
    if (spot) labels.append(haloText(spot.x, spot.y, spot.anchor, text, "cw-evans-line-label"));
  });
  svg.append(lines, marks, labels);
  return { svg, shown, styleOf };
}

// The key under the chart: each part's line style and marker, the sums and the couple point.
function sample(k, kind) {
  const el = s("svg", { viewBox: "0 0 34 14", width: 34, height: 14, class: "cw-evans-sample", "aria-hidden": "true" });
  if (kind === "line") el.append(s("line", { x1: 1, x2: 33, y1: 7, y2: 7, class: "cw-evans-line cw-evans-s" + k, "stroke-dasharray": DASHES[k] }));
  else if (kind === "total") el.append(s("line", { x1: 1, x2: 33, y1: 7, y2: 7, class: "cw-evans-total" }));
  else if (kind === "couple") el.append(s("circle", { cx: 17, cy: 7, r: 5.5, class: "cw-evans-couple" }));
  else el.append(marker(SHAPES[k], 17, 7, 4.5, "cw-evans-free cw-evans-s" + k));
  return el;
}

function key(ev, shown, styleOf) {
  const items = [];
  for (const [name, k] of styleOf) {
    const mine = shown.filter((x) => x.curve.electrode === name);
    const hasFree = (ev.free_corrosion_points || []).some((p) => p.electrode === name);
    items.push(h("li", {}, sample(k, "line"), " ", h("strong", { text: name }), ": " +
      mine.map((x) => x.curve.reaction + " (" + x.curve.branch + ")" + (x.visible ? "" : ", outside the drawn range")).join("; "),
      hasFree ? h("span", { class: "cw-evans-key-free" }, " ", sample(k, "free"), " its free-corrosion point (on its own)") : null));
  }
  if ((ev.totals || []).some((t) => t.count > 1)) {
    items.push(h("li", {}, sample(0, "total"), " Σ anodic, Σ cathodic: the sums over every part; they cross at the couple point"));
  }
  items.push(h("li", {}, sample(0, "couple"), " couple point: the mixed potential and the total anodic (= cathodic) current; the dotted line marks its potential"));
  return h("ul", { class: "cw-evans-key" }, items);
}

// The observers of the charts drawn so far: one whose chart has left the page is let go when the
// next chart is made (a page redraws its chart with every result).
const observed = new Set();

export function evansChart(ev, opts = {}) {
  for (const o of observed) if (!o.fig.isConnected && o.placed) { o.ro.disconnect(); observed.delete(o); }
  const fig = h("figure", { class: "cw-evans-figure" });
  if (!ev || !ev.curves || !ev.couple_point || !ev.range_V) {
    fig.append(h("p", { class: "cw-pending", text: "No Evans diagram in this result." }));
    return fig;
  }
  let drawnAt = 0;
  const render = (width) => {
    const W = Math.round(Math.max(340, Math.min(900, width || 720)));
    if (Math.abs(W - drawnAt) < 12) return;
    drawnAt = W;
    const { svg, shown, styleOf } = draw(ev, opts, W);
    fig.replaceChildren(svg, key(ev, shown, styleOf));
    if (opts.caption) fig.append(h("figcaption", { text: opts.caption }));
    fig.dataset.width = String(W);
  };
  render(720);
  if (typeof ResizeObserver === "function") {
    const entry = { fig, placed: false, ro: null };
    entry.ro = new ResizeObserver((entries) => {
      if (!fig.isConnected) return;
      entry.placed = true;
      for (const en of entries) render(en.contentRect.width);
    });
    entry.ro.observe(fig);
    observed.add(entry);
  }
  return fig;
}
