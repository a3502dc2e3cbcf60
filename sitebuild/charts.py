"""Charts drawn at build time as SVG (no script, no external resource).

:func:`galvanic_series_svg` draws each material's corrosion-potential range in flowing seawater as
a horizontal bar on one potential axis (V vs SCE), most noble at the top. Passive and active
states differ by fill pattern and outline, not by colour alone, so the chart reads in grey and in
print. Every text is a ``<text>`` element and every data string is escaped.
"""

import html
import math
import re

#: where the hook puts the chart inside the docs (the galvanic-series page links to it)
CHART_PATH = "reference/galvanic-series.svg"

#: the conditions the series holds for (ASTM G82-98, Fig. 1 caption, after F. L. LaQue, Marine
#: Corrosion: Causes and Prevention, Wiley 1975; conditions from memory)
SERIES_NOTE = ("Corrosion potentials of metals and alloys in flowing natural seawater, "
               "2.4 to 4 m/s, 10 to 27 °C, in volts against the saturated calomel electrode (SCE), "
               "as in the galvanic series of ASTM G82 (after LaQue). Each bar spans the range "
               "observed for that material.")

SERIES_FIELD = "seawater_range_V_SCE"

# layout [px in the viewBox]
WIDTH = 960
LABEL_RIGHT = 362      # labels end here (right-aligned)
PLOT_LEFT = 374
PLOT_RIGHT = 936
ROW_H = 20
BAR_H = 12
TOP = 96               # first row
FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, Helvetica, Arial, sans-serif"
MAX_LABEL = 56

# our own palette: dark slate for single-state alloys, pale with heavy outline for passive
# states, hatching with a dashed outline for active states
INK = "#1d2b36"
PLAIN_FILL = "#46627a"
PASSIVE_FILL = "#cfe0ea"
ACTIVE_LINE = "#2e3f4d"
STRIPE = "#f1f4f6"
HIGHLIGHT_BAND = "#ffe3a3"


def _x(text):
    """Escape text for XML content or attributes; drop characters XML 1.0 forbids."""
    text = re.sub(r"[\x00-\x08\x0b\x0c\x0e-\x1f\ufffe\uffff]", "\ufffd", str(text))
    return html.escape(re.sub(r"\s+", " ", text).strip(), quote=True)


def _v(value):
    """A potential as shown on the axis: one decimal, a true minus sign."""
    text = f"{value:.1f}"
    if text in ("-0.0", "0.0"):
        return "0.0"
    return text.replace("-", "\u2212")


def _short(text, limit=MAX_LABEL):
    return text if len(text) <= limit else text[: limit - 1].rstrip() + "…"


def _rows(bundle):
    rows = []
    for m in bundle.get("materials", []) or []:
        if not isinstance(m, dict):
            continue
        rng = m.get(SERIES_FIELD)
        if not (isinstance(rng, list) and len(rng) == 2
                and all(isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v) for v in rng)):
            continue
        lo, hi = sorted(rng)
        rows.append((m, lo, hi))
    rows.sort(key=lambda r: (-r[2], -r[1], str(r[0].get("name"))))
    return rows


def galvanic_series_svg(bundle, highlight=()):
    """The galvanic series in flowing seawater as an SVG document.

    Args:
        bundle: the dataset bundle (its ``materials`` with ``seawater_range_V_SCE``) [unitless]
        highlight: material ids to emphasise (e.g. the two materials of a joint) [unitless]

    Returns:
        the SVG text (UTF-8, standalone, scales by its viewBox)

    >>> svg = galvanic_series_svg({"materials": [{"id": "zinc", "name": "Zinc",
    ...     "seawater_range_V_SCE": [-1.03, -0.98]}]})
    >>> svg.startswith("<svg") and "Zinc" in svg
    True
    """
    highlight = {h for h in (highlight or ()) if isinstance(h, str)}
    rows = _rows(bundle)
    if rows:
        # axis ends on labelled gridlines (labels every 0.2 V)
        vmin = math.floor(min(r[1] for r in rows) * 5 + 1e-9) / 5
        vmax = math.ceil(max(r[2] for r in rows) * 5 - 1e-9) / 5
    else:
        vmin, vmax = -1.0, 0.0
    if vmax - vmin < 0.2:
        vmin, vmax = vmin - 0.1, vmax + 0.1

    def px(v):
        return PLOT_LEFT + (v - vmin) / (vmax - vmin) * (PLOT_RIGHT - PLOT_LEFT)

    n = len(rows)
    plot_bottom = TOP + max(n, 1) * ROW_H
    height = plot_bottom + 118
    version = _x(bundle.get("version", ""))
    title = "Galvanic series in flowing seawater"
    desc = (f"{SERIES_NOTE} {n} materials, most noble at the top. Solid dark bars: alloys with one state; "
            "pale bars with a heavy outline: passive state; hatched bars with a dashed outline: active state.")
    if highlight:
        names = [r[0].get("name") or r[0].get("id") for r in rows if r[0].get("id") in highlight]
        desc += " Highlighted: " + ", ".join(str(x) for x in names) + "."
    out = [
        f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 {WIDTH} {height}" width="{WIDTH}" '
        f'height="{height}" role="img" aria-labelledby="cwgs-title cwgs-desc" '
        f'font-family="{_x(FONT)}" font-size="12" class="cw-galvanic-series">',
        f'<title id="cwgs-title">{_x(title)}</title>',
        f'<desc id="cwgs-desc">{_x(desc)}</desc>',
        "<defs>",
        '<pattern id="cwgs-hatch" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">'
        f'<rect width="6" height="6" fill="#ffffff"/><line x1="0" y1="0" x2="0" y2="6" stroke="{ACTIVE_LINE}" '
        'stroke-width="2.4"/></pattern>',
        "</defs>",
        f'<rect x="0" y="0" width="{WIDTH}" height="{height}" fill="#ffffff"/>',
        f'<text x="{WIDTH / 2:.0f}" y="24" text-anchor="middle" font-size="17" font-weight="700" fill="{INK}">'
        f'{_x(title)}</text>',
        f'<text x="{WIDTH / 2:.0f}" y="43" text-anchor="middle" font-size="12" fill="{INK}">'
        "Corrosion potential, V vs SCE (flowing natural seawater, 2.4 to 4 m/s, 10 to 27 °C)</text>",
    ]
    # legend
    lx, ly = PLOT_LEFT, 58
    out += [
        f'<rect x="{lx}" y="{ly}" width="26" height="{BAR_H}" fill="{PLAIN_FILL}" stroke="{INK}" stroke-width="0.8"/>',
        f'<text x="{lx + 32}" y="{ly + 10}" fill="{INK}">one state</text>',
        f'<rect x="{lx + 112}" y="{ly}" width="26" height="{BAR_H}" fill="{PASSIVE_FILL}" stroke="{INK}" '
        'stroke-width="2"/>',
        f'<text x="{lx + 144}" y="{ly + 10}" fill="{INK}">passive state</text>',
        f'<rect x="{lx + 246}" y="{ly}" width="26" height="{BAR_H}" fill="url(#cwgs-hatch)" stroke="{INK}" '
        'stroke-width="1.2" stroke-dasharray="3 2"/>',
        f'<text x="{lx + 278}" y="{ly + 10}" fill="{INK}">active state</text>',
    ]
    # row stripes and highlight bands
    for i, (m, lo, hi) in enumerate(rows):
        y = TOP + i * ROW_H
        if m.get("id") in highlight:
            out.append(f'<rect x="4" y="{y}" width="{WIDTH - 8}" height="{ROW_H}" fill="{HIGHLIGHT_BAND}"/>')
        elif i % 2 == 0:
            out.append(f'<rect x="4" y="{y}" width="{WIDTH - 8}" height="{ROW_H}" fill="{STRIPE}"/>')
    # grid and ticks every 0.1 V
    steps = int(round((vmax - vmin) * 10))
    for k in range(steps + 1):
        v = vmin + k / 10
        x = px(v)
        major = abs(v) < 1e-9
        out.append(f'<line class="cw-gs-grid" x1="{x:.1f}" y1="{TOP - 4}" x2="{x:.1f}" y2="{plot_bottom + 4}" '
                   'stroke="#8c99a4" '
                   f'stroke-width="{1.2 if major else 0.5}"' + ('' if major else ' stroke-dasharray="2 3"') + '/>')
        if k % 2 == 0:  # grid every 0.1 V, labels every 0.2 V from the axis ends
            for ty in (TOP - 8, plot_bottom + 18):
                out.append(f'<text x="{x:.1f}" y="{ty}" text-anchor="middle" font-size="11" fill="{INK}">'
                           f'{_v(v)}</text>')
    out.append(f'<line x1="{PLOT_LEFT}" y1="{plot_bottom + 4}" x2="{PLOT_RIGHT}" y2="{plot_bottom + 4}" '
               f'stroke="{INK}" stroke-width="1"/>')
    # bars and labels
    for i, (m, lo, hi) in enumerate(rows):
        y = TOP + i * ROW_H
        name = str(m.get("name") or m.get("id") or "")
        state = m.get("state")
        hl = m.get("id") in highlight
        dim = ' opacity="0.45"' if highlight and not hl else ""
        x0, x1 = px(lo), px(hi)
        w = max(x1 - x0, 3.0)
        if state == "active":
            style = f'fill="url(#cwgs-hatch)" stroke="{INK}" stroke-width="{2.2 if hl else 1.2}" stroke-dasharray="3 2"'
        elif state == "passive":
            style = f'fill="{PASSIVE_FILL}" stroke="{INK}" stroke-width="{3 if hl else 2}"'
        else:
            style = f'fill="{PLAIN_FILL}" stroke="{INK}" stroke-width="{2.2 if hl else 0.8}"'
        tip = f"{name}: {_v(lo)} to {_v(hi)} V vs SCE" + (f" ({state})" if state else "")
        mid = _x(str(m.get("id") or ""))
        out.append(f'<g class="cw-bar" data-material="{mid}"{dim}><title>{_x(tip)}</title>'
                   f'<rect x="{x0:.1f}" y="{y + (ROW_H - BAR_H) / 2:.1f}" width="{w:.1f}" height="{BAR_H}" '
                   f'{style}/></g>')
        weight = ' font-weight="700"' if hl else ""
        out.append(f'<text x="{LABEL_RIGHT}" y="{y + ROW_H / 2 + 4:.1f}" text-anchor="end" fill="{INK}"'
                   f' data-material="{mid}"{weight}{dim}>'
                   f'{_x(_short(name))}</text>')
    # direction words and axis title
    yb = plot_bottom + 40
    out += [
        f'<text x="{PLOT_LEFT}" y="{yb}" text-anchor="start" fill="{INK}" font-weight="600">'
        "\u2190 more active (anodic)</text>",
        f'<text x="{PLOT_RIGHT}" y="{yb}" text-anchor="end" fill="{INK}" font-weight="600">'
        "more noble (cathodic) \u2192</text>",
        f'<text x="{(PLOT_LEFT + PLOT_RIGHT) / 2:.0f}" y="{yb}" text-anchor="middle" fill="{INK}">'
        "potential, V vs SCE</text>",
    ]
    notes = [
        "Ranges after the seawater galvanic series of ASTM G82 (after LaQue); "
        "the reference pages give each value's source.",
        "Stainless steels and nickel-chromium alloys can turn active in crevices "
        "and in stagnant or poorly aerated water.",
        "A galvanic series holds only for the electrolyte it was measured in. Gridlines every 0.1 V.",
    ]
    if version:
        notes.append(f"Couplewise data version {version}.")
    for j, line in enumerate(notes):
        out.append(f'<text x="16" y="{yb + 22 + j * 15}" font-size="11" fill="{INK}">{_x(line)}</text>')
    if not rows:
        out.append(f'<text x="{WIDTH / 2:.0f}" y="{TOP + 14}" text-anchor="middle" fill="{INK}">'
                   "no material carries a seawater range</text>")
    out.append("</svg>")
    return "\n".join(out) + "\n"
