"""The mixed-potential page (Evans diagram) and the passivity page, as an engineer on a tablet uses
them: each opens with an answer, an edit changes it, bad input is refused at the field it concerns,
and the Evans chart carries its couple point and labelled branches. Every test runs with requests
off 127.0.0.1 aborted and fails on a console error."""

import json
import math
import os
import re

import pytest

from browserkit import new_guarded_page

pytestmark = pytest.mark.browser

RUNTIME_MS = 120_000
TABLET = {"width": 768, "height": 1024}
LAPTOP = {"width": 1280, "height": 800}
PAINTED = "performance.getEntriesByName('cw-result-painted').length"
IDLE = "() => !document.querySelector('.cw-result').hasAttribute('aria-busy')"
ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


@pytest.fixture(params=[TABLET, LAPTOP], ids=["tablet", "laptop"])
def page(browser, request):
    ctx, pg, guard = new_guarded_page(browser, viewport=request.param)
    yield pg
    ctx.close()
    assert guard.outside == [], f"requests to other hosts: {guard.outside}"
    assert guard.page_errors == [] and guard.console_errors == [], vars(guard)


@pytest.fixture
def tablet(browser):
    ctx, pg, guard = new_guarded_page(browser, viewport=TABLET)
    yield pg
    ctx.close()
    assert guard.outside == [] and guard.page_errors == [] and guard.console_errors == [], vars(guard)


def opened(pg, served, path, query=""):
    pg.goto(served.url(path + query))
    pg.wait_for_function(f"{PAINTED} > 0", timeout=RUNTIME_MS)
    pg.wait_for_function(IDLE, timeout=RUNTIME_MS)
    return pg


def edited(pg, action):
    """Do something to the form and wait for the runtime's answer to it: a new answer painted, then
    no further one for half a second (an answer to an earlier keystroke may land first)."""
    before = pg.evaluate(PAINTED)
    action()
    pg.wait_for_function(f"{PAINTED} > {before}", timeout=RUNTIME_MS)
    while True:
        count = pg.evaluate(PAINTED)
        pg.wait_for_timeout(500)
        if pg.evaluate(PAINTED) == count and pg.evaluate(IDLE):
            return


def number(text):
    return float(re.search(r"[-−]?\d+(?:\.\d+)?", text).group(0).replace("−", "-"))


def big_value(pg):
    return number(pg.locator(".cw-result .cw-big-value").inner_text())


def cell(pg, electrode, reaction, column):
    """The input of one reaction row: column 0 name, 1 E_eq, 2 i0, 3 b anodic, 4 b cathodic, 5 i_lim."""
    return pg.locator("fieldset.cw-mx-electrode").nth(electrode).locator("tbody tr").nth(reaction).locator("input").nth(column)


def calc_answer(name, request):
    """calc's own answer (CPython), the one the page must show."""
    from calc.api import call

    out = call(name, json.loads(json.dumps(request)))
    assert out["ok"], out
    return out["result"]


# ---------------------------------------------------------------- mixed potential


def test_mixed_opens_with_the_answer_of_its_demonstration(page, served):
    from calc.spec import OPENINGS

    opened(page, served, "calculators/mixed/")
    r = calc_answer("mixed", OPENINGS["mixed"])
    assert big_value(page) == pytest.approx(r["E_mixed_V"], abs=0.0005)
    assert "vs SHE" in page.locator(".cw-result .cw-big").inner_text()
    galvanic = page.locator("[data-cw-value=galvanic_current_A]").inner_text()
    assert number(galvanic) == pytest.approx(r["galvanic_current_A"] * 1e6, rel=0.005) and "µA" in galvanic
    assert "demonstration" in page.locator("article").inner_text()


def test_mixed_evans_chart_has_the_couple_point_labelled_branches_and_readable_text(tablet, served):
    from calc.spec import OPENINGS

    pg = opened(tablet, served, "calculators/mixed/")
    r = calc_answer("mixed", OPENINGS["mixed"])
    svg = pg.locator(".cw-result svg.cw-evans")
    assert svg.count() == 1
    assert svg.locator("circle.cw-evans-couple").count() == 1
    assert svg.locator(".cw-evans-free").count() == len(r["evans"]["free_corrosion_points"]) == 2
    assert svg.locator("path.cw-evans-line").count() == len(r["evans"]["curves"])
    labels = " | ".join(svg.locator("text.cw-evans-line-label").all_text_contents())
    for c in r["evans"]["curves"]:
        assert c["reaction"] in labels and c["electrode"] in labels, (c["reaction"], labels)
    couple = svg.locator("text.cw-evans-couple-label").text_content()
    assert number(couple.split(":", 1)[1]) == pytest.approx(r["E_mixed_V"], abs=0.0005)
    # parts told apart by line style, not colour alone (grey print, colour-blind readers)
    dashes = pg.evaluate("""() => { const m = {};
      for (const p of document.querySelectorAll('svg.cw-evans path.cw-evans-line'))
        m[p.querySelector('title').textContent.split(' on ').pop()] = p.getAttribute('stroke-dasharray');
      return m; }""")
    assert len(set(dashes.values())) == 2, dashes
    # exponents raised, with a true minus sign; text at least 12 px as shown on a tablet
    assert pg.locator("svg.cw-evans .cw-evans-axis tspan.cw-evans-exp").first.text_content().startswith("\u2212")
    smallest = pg.evaluate("""() => { const svg = document.querySelector('svg.cw-evans');
      const k = svg.getBoundingClientRect().width / svg.viewBox.baseVal.width;
      return Math.min(...[...svg.querySelectorAll('text, tspan')].map((t) => parseFloat(getComputedStyle(t).fontSize) * k)); }""")
    assert smallest >= 12.0 - 1e-6, smallest
    # the chart fits the page: no sideways scrolling on a tablet
    assert pg.evaluate("document.documentElement.scrollWidth <= document.documentElement.clientWidth")


def test_editing_the_reactions_gives_zinc_in_acid_callister_example_16_2(page, served):
    # W. D. Callister and D. G. Rethwisch, Fundamentals of Materials Science and Engineering, 3rd ed.
    # (Wiley 2008), Example Problem 16.2, p. 677 (read in a public copy): Zn V = -0.763 V,
    # i0 = 1e-7 A/cm², β = +0.09; H2 V = 0, i0 = 1e-10 A/cm², β = -0.08; V_C = -0.486 V as printed for
    # the same data on Princeton MAE 324 "Corrosion & Environmental Degradation", page corro_24.
    opened(page, served, "calculators/mixed/")
    before = big_value(page)
    edited(page, lambda: page.locator("fieldset.cw-mx-electrode").nth(1).locator("button", has_text="Remove this electrode").click())
    assert big_value(page) != before  # one electrode left: the answer changed
    zinc = ["Zn", "-0.763", "1e-7", "0.09", "", ""]
    hydrogen = ["H2", "0", "1e-10", "", "0.08", ""]
    for k, row in enumerate((zinc, hydrogen)):
        for j, text in enumerate(row):
            box = cell(page, 0, k, j)
            if j == len(row) - 1 and k == 1:
                edited(page, lambda box=box, text=text: box.fill(text))
            else:
                box.fill(text)
    assert big_value(page) == pytest.approx(-0.486, abs=0.0005)
    assert "one electrode" in page.locator(".cw-result .cw-direction").inner_text()
    assert page.locator("fieldset.cw-mx-electrode").nth(0).locator("button", has_text="Remove this electrode").is_disabled()
    # the link keeps the edited table: opened again, the same answer
    url = page.url
    page.goto("about:blank")
    opened(page, served, "calculators/mixed/", "?" + url.split("?", 1)[1])
    assert cell(page, 0, 0, 1).input_value() == "-0.763"
    assert big_value(page) == pytest.approx(-0.486, abs=0.0005)


def test_a_reaction_without_slopes_is_refused_naming_the_field(tablet, served):
    pg = opened(tablet, served, "calculators/mixed/")
    slope = cell(pg, 0, 0, 3)  # the steel's Fe → Fe2+ has only an anodic slope
    slope.fill("")
    msg = pg.locator("#" + slope.get_attribute("id") + "-msg")
    msg.wait_for(timeout=RUNTIME_MS)
    pg.wait_for_function("(id) => document.getElementById(id).textContent.includes('slope')",
                         arg=slope.get_attribute("id") + "-msg", timeout=RUNTIME_MS)
    text = msg.inner_text()
    assert "electrodes[0].reactions[0].b_anodic_V" in text and "b_cathodic_V" in text, text
    assert slope.get_attribute("aria-invalid") == "true"
    note = pg.locator(".cw-stale-note").inner_text()
    assert "anodic Tafel slope" in note and "Steel coupon" in note, note
    # a number that is not one is refused at its field before calc is asked
    i0 = cell(pg, 1, 1, 2)
    i0.fill("1e-1o")
    assert "not a number" in pg.locator("#" + i0.get_attribute("id") + "-msg").inner_text()


def test_reactions_and_electrodes_can_be_added_and_removed(tablet, served):
    pg = opened(tablet, served, "calculators/mixed/")
    first = pg.locator("fieldset.cw-mx-electrode").nth(0)
    first.locator("button", has_text="Add a reaction").click()
    assert first.locator("tbody tr").count() == 3
    assert cell(pg, 0, 2, 0).evaluate("(el) => el === document.activeElement")
    # the empty new row is asked for, field by field, and the result says it is out of date
    assert "Enter a value" in pg.locator("#" + cell(pg, 0, 2, 1).get_attribute("id") + "-msg").inner_text()
    assert pg.locator(".cw-result.cw-stale").count() == 1
    edited(pg, lambda: first.locator("tbody tr").nth(2).locator("button").click())
    assert first.locator("tbody tr").count() == 2 and pg.locator(".cw-result.cw-stale").count() == 0
    pg.locator("button", has_text="Add an electrode").click()
    assert pg.locator("fieldset.cw-mx-electrode").count() == 3
    assert pg.locator("fieldset.cw-mx-electrode legend").nth(2).inner_text() == "Electrode 3"
    # every button is large enough for a finger (44 px, WCAG 2.5.5 target size, common practice)
    for box in pg.locator("button.cw-mx-btn").evaluate_all("els => els.map(e => e.getBoundingClientRect().height)"):
        assert box >= 44


# ---------------------------------------------------------------- passivity


def pren_formula(cr, mo, n, w=None):
    # PREN = Cr + 3.3·Mo + 16·N; with tungsten Cr + 3.3·(Mo + 0.5·W) + 16·N (ISO 15156-3, as restated
    # in the reference notes and by steel suppliers)
    return cr + 3.3 * (mo + 0.5 * (w or 0.0)) + 16.0 * n


def pv_value(pg, key):
    return number(pg.locator(f"[data-cw-value={key}]").inner_text())


def test_passivity_opens_with_an_answer(page, served):
    from calc.spec import OPENINGS

    opened(page, served, "calculators/passivity/")
    o = OPENINGS["passivity"]
    assert pv_value(page, "pren") == pytest.approx(pren_formula(o["cr"], o["mo"], o["n"]), abs=0.005)
    r = calc_answer("passivity", o)
    verdict = page.locator("[data-cw-value=holds]").inner_text()
    assert ("Judged passive" if r["holds"] else "Judged not passive") in verdict
    assert ("not passive" in verdict) is (not r["holds"])  # said in words, not by colour alone
    text = page.locator(".cw-result").inner_text()
    assert "ASTM G48" in text and "screening estimates" in text and "qualify" in text
    assert page.locator(".cw-pv-checks tbody tr").count() == len(r["checks"])


def test_passivity_edits_change_the_answer_standard_grades(page, served):
    opened(page, served, "calculators/passivity/")
    # UNS S32205 minimum composition Cr 22.0, Mo 3.0, N 0.14 (ASTM A240 Table 1, from memory)
    for key, text in (("cr", "22.0"), ("mo", "3.0")):
        page.fill("#cw-pv-" + key, text)
    edited(page, lambda: page.fill("#cw-pv-n", "0.14"))
    assert pv_value(page, "pren") == pytest.approx(pren_formula(22.0, 3.0, 0.14), abs=0.005)
    # UNS S32760 minimum composition Cr 24.0, Mo 3.0, W 0.5, N 0.20 (ASTM A240 Table 1, from memory)
    page.fill("#cw-pv-cr", "24.0")
    page.fill("#cw-pv-n", "0.20")
    edited(page, lambda: page.fill("#cw-pv-w", "0.5"))
    assert pv_value(page, "pren") == pytest.approx(pren_formula(24.0, 3.0, 0.20, 0.5), abs=0.006)
    assert "PREN_W" in page.locator(".cw-pv-out").inner_text()
    # a hotter service: the result follows calc's judgement at 60 °C
    edited(page, lambda: page.fill("#cw-pv-t", "60"))
    r = calc_answer("passivity", {"cr": 24.0, "mo": 3.0, "n": 0.2, "w": 0.5, "temp_C": 60.0, "salinity": 35.0})
    met = page.locator(".cw-pv-checks tbody td.cw-pv-met").all_inner_texts()
    assert [cell.strip() == "met" for cell in met] == [c["passed"] for c in r["checks"]]
    assert "60" in page.locator(".cw-pv-out").inner_text()


def test_passivity_refuses_bad_input_at_its_field(tablet, served):
    pg = opened(tablet, served, "calculators/passivity/")
    pg.fill("#cw-pv-cr", "60")
    pg.wait_for_function("() => document.getElementById('cw-pv-cr-msg').textContent.length > 0", timeout=RUNTIME_MS)
    assert "cr = 60" in pg.locator("#cw-pv-cr-msg").inner_text() and "wt %" in pg.locator("#cw-pv-cr-msg").inner_text()
    pg.fill("#cw-pv-cr", "22")
    pg.select_option("#cw-pv-water", "chloride")
    pg.fill("#cw-pv-wv", "90000")
    pg.wait_for_function("() => document.getElementById('cw-pv-wv-msg').textContent.includes('chloride')", timeout=RUNTIME_MS)
    assert pg.locator("label[for=cw-pv-wv]").inner_text() == "Chloride (mg/L)"


def test_passivity_fills_a_grade_from_the_dataset(tablet, served):
    with open(os.path.join(ROOT, "calc", "dataset.json"), encoding="utf-8") as fh:
        materials = json.load(fh)["materials"]
    c276 = next(m for m in materials if m["id"] == "alloy-c276")
    pg = opened(tablet, served, "calculators/passivity/")
    edited(pg, lambda: pg.select_option("#cw-pv-grade", "alloy-c276"))
    comp = c276["composition_wt_pct"]
    assert float(pg.input_value("#cw-pv-cr")) == comp["Cr"] and float(pg.input_value("#cw-pv-w")) == comp["W"]
    note = pg.locator(".cw-pv-grade-note").inner_text()
    assert "nominal" in note and c276["composition_confidence"] in note and "certificate" in note
    assert pv_value(pg, "pren") == pytest.approx(pren_formula(comp["Cr"], comp["Mo"], comp.get("N", 0.0), comp["W"]), abs=0.006)
    assert math.isfinite(pv_value(pg, "cpt_C"))
