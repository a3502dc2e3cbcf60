"""The service-conditions section of the joint, matrix and site-readings pages, and the joint's
mixed-potential answer with its Evans diagram, as an engineer on a tablet uses them: the same joint
at 5 °C and at 40 °C, in still water and at 3 m/s, shows different answers, each the one calc
computes for those conditions; a negative velocity is refused at its field; a passive part judged
active is said in words; the matrix shows the warnings of its conditions; the measured joint takes
them. Every test runs with requests off 127.0.0.1 aborted and fails on a console error.

What the pages show is checked against calc's own answer to the same request (CPython, the engine
the page runs under Pyodide), not against recorded numbers."""

import json
import re

import pytest

from browserkit import new_guarded_page

pytestmark = pytest.mark.browser

RUNTIME_MS = 120_000
TABLET = {"width": 768, "height": 1024}
PAINTED = "performance.getEntriesByName('cw-result-painted').length"
IDLE = "() => !document.querySelector('.cw-result').hasAttribute('aria-busy')"
# the joint page's opening request (calc/spec.py OPENINGS["joint"]): a demonstration scenario of our own
JOINT = {"a": "aluminium-5083", "b": "stainless-316-passive", "env": "seawater-quiescent", "area_ratio": 0.2}


@pytest.fixture
def tablet(browser):
    ctx, pg, guard = new_guarded_page(browser, viewport=TABLET)
    yield pg
    ctx.close()
    assert guard.outside == [], f"requests to other hosts: {guard.outside}"
    assert guard.page_errors == [] and guard.console_errors == [], vars(guard)


def opened(pg, served, path, query=""):
    pg.goto(served.url(path + query))
    pg.wait_for_function(f"{PAINTED} > 0", timeout=RUNTIME_MS)
    pg.wait_for_function(IDLE, timeout=RUNTIME_MS)
    return pg


def settled(pg, before):
    """Wait for an answer after `before` painted ones, then for no further one for half a second."""
    pg.wait_for_function(f"{PAINTED} > {before}", timeout=RUNTIME_MS)
    while True:
        count = pg.evaluate(PAINTED)
        pg.wait_for_timeout(500)
        if pg.evaluate(PAINTED) == count and pg.evaluate(IDLE):
            return


def number(text):
    """The first number of a shown text, with the page's true minus sign and m × 10ⁿ form."""
    sup = str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")
    m = re.search(r"([-−]?\d+(?:\.\d+)?)(?:\s*×\s*10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+))?", text)
    value = float(m.group(1).replace("−", "-"))
    return value * 10 ** int(m.group(2).translate(sup)) if m.group(2) else value


def calc_answer(name, request):
    """calc's own answer (CPython) to a request, the one the page must show."""
    from calc.api import call

    out = call(name, json.loads(json.dumps(request)))
    assert out["ok"], out
    return out["result"]


def shown_attack(pg):
    return number(pg.locator(".cw-mix [data-cw-value=attack_mm_per_year]").inner_text())


def close(shown, computed):
    """The page shows 3 significant digits (serviceform.mjs sig())."""
    return abs(shown - computed) <= 0.006 * abs(computed)


def test_joint_at_5_and_40_C_still_and_at_3_m_s_shows_different_answers(tablet, served):
    pg = opened(tablet, served, "calculators/joint/")
    summary = pg.locator(".cw-sc-summary")
    assert "20 °C" in summary.inner_text() and "still" in summary.inner_text()  # the environment's defaults, collapsed
    assert not pg.locator("#cw-sc-t").is_visible()
    summary.click()
    answers = {}
    for label, edits, extra in (
            ("5 C", [("#cw-sc-t", "5")], {"temp_C": 5.0}),
            ("40 C", [("#cw-sc-t", "40")], {"temp_C": 40.0}),
            ("3 m/s", [("#cw-sc-t", ""), ("#cw-sc-geo", "pipe"), ("#cw-sc-D", "0.1"), ("#cw-sc-v", "3")],
             {"geometry": "pipe", "diameter_m": 0.1, "velocity_m_s": 3.0})):
        before = pg.evaluate(PAINTED)
        for sel, value in edits:
            if sel.endswith("geo"):
                pg.select_option(sel, value)
            else:
                pg.fill(sel, value)
        settled(pg, before)
        want = calc_answer("joint", {**JOINT, **extra})
        answers[label] = shown_attack(pg)
        assert close(answers[label], want["attack_mm_per_year"]), (label, answers[label], want["attack_mm_per_year"])
        screen = number(pg.locator(".cw-mix [data-cw-value=rate_mm_per_year]").inner_text())
        assert close(screen, want["rate_mm_per_year"][1]), (label, screen)
        assert "Upper-bound screen" in pg.locator(".cw-mix-screen").inner_text()
        # each value says where it came from: the user's are marked "yours"
        for key in extra:
            row = pg.locator(f".cw-sc-used tr[data-cw-key={key}]")
            assert row.get_attribute("data-cw-from") == "user", key
        assert pg.locator(".cw-sc-used tr[data-cw-key=salinity]").get_attribute("data-cw-from") == "environment"
    assert len({round(v, 6) for v in answers.values()}) == 3, answers
    assert "sc-v=3" in pg.url and "sc-geo=pipe" in pg.url  # kept in the link like the other fields
    # the series verdict stays the quick first look at the top
    assert pg.locator(".cw-result > .cw-big .cw-verdict").count() == 1


def test_evans_chart_on_the_joint_page_marks_the_couple_point(tablet, served):
    pg = opened(tablet, served, "calculators/joint/")
    fig = pg.locator(".cw-mix figure.cw-evans-figure")
    fig.scroll_into_view_if_needed()
    assert fig.locator("svg.cw-evans circle.cw-evans-couple").count() == 1
    want = calc_answer("joint", JOINT)["assessment"]["couple_potential_V_SCE"]
    shown = number(pg.locator(".cw-mix [data-cw-value=couple_potential_V_SCE]").inner_text())
    assert abs(shown - want) < 0.0006
    desc = fig.locator("svg.cw-evans desc").text_content()
    assert f"{want:.3f}".replace("-", "\u2212") in desc
    assert "V vs SCE" in fig.locator("svg.cw-evans").text_content()  # the scale the engine names (evans.scale)
    assert fig.locator("svg.cw-evans path.cw-evans-line").count() >= 4  # the branches of both parts


def test_negative_velocity_is_refused_at_its_field(tablet, served):
    pg = opened(tablet, served, "calculators/joint/")
    pg.locator(".cw-sc-summary").click()
    pg.select_option("#cw-sc-geo", "surface")
    pg.fill("#cw-sc-L", "2")
    pg.fill("#cw-sc-v", "-1")
    pg.wait_for_function("document.getElementById('cw-sc-v-msg').textContent.includes('velocity')", timeout=RUNTIME_MS)
    assert "0 to 30 m/s" in pg.locator("#cw-sc-v-msg").inner_text()
    assert pg.get_attribute("#cw-sc-v", "aria-invalid") == "true"
    assert "out of date" in pg.locator(".cw-stale-note").text_content().lower()
    # a value that is not a number is the page's own message, at the same field
    pg.fill("#cw-sc-v", "fast")
    pg.wait_for_function("document.getElementById('cw-sc-v-msg').textContent.includes('fast')", timeout=RUNTIME_MS)


def test_a_passive_part_judged_active_is_said_in_words(tablet, served):
    want = calc_answer("joint", {**JOINT, "temp_C": 40.0})
    judged = [p for p in want["parts"] if p["state_used"] != p["id"]]
    assert judged, "calc judges the passive grade active at 40 °C in seawater (the scenario this test needs)"
    pg = opened(tablet, served, "calculators/joint/", "?sc-t=40")
    for p in judged:
        card = pg.locator(f".cw-part[data-part='{p['id']}']")
        assert "Judged in its active state" in card.inner_text()
        assert "passivity does not hold" in card.inner_text()
    assert pg.locator(".cw-warning[data-code=judged-active]").count() == 1


def test_matrix_with_service_conditions_shows_their_warnings(tablet, served):
    from calc.spec import OPENINGS

    want = calc_answer("matrix", {**OPENINGS["matrix"], "temp_C": 40.0})
    codes = {w["code"] for w in want["service_warnings"] if w.get("code")}
    assert "series-temperature-range" in codes  # 40 °C is outside the 10-27 °C of the series (ASTM G82)
    pg = opened(tablet, served, "calculators/matrix/", "?sc-t=40")
    for code in codes:
        assert pg.locator(f".cw-result .cw-warning[data-code={code}]").count() >= 1, code
    assert pg.locator(".cw-sc-used tr[data-cw-key=temp_C]").get_attribute("data-cw-from") == "user"
    # a cell's panel gives the pair at the service conditions
    pg.locator("td.cw-cell").first.click()
    k = int(pg.locator("td.cw-cell").first.get_attribute("data-k"))
    row = dict(zip(want["service_pair_fields"], want["service_pairs"][k]))
    shown = number(pg.locator(".cw-explain [data-cw-value=anode_attack_mm_per_year]").inner_text())
    assert close(shown, row["anode_attack_mm_per_year"])
    assert "sc-t=40" in pg.locator(".cw-explain a.cw-open-joint").get_attribute("href")


def test_measured_joint_takes_service_conditions(tablet, served):
    pg = opened(tablet, served, "calculators/field/")
    pg.locator(".cw-sc-summary").first.click()
    before = pg.evaluate(PAINTED)
    pg.select_option("#cw-m-sc-geo", "surface")
    pg.fill("#cw-m-sc-L", "2")
    pg.fill("#cw-m-sc-v", "1")
    settled(pg, before)
    # the page's demonstration (field.mjs MEASURED_START, a scenario of our own) with these conditions
    want = calc_answer("measured", {
        "a_name": "sheet pile", "a_reading_V": -0.68, "b_name": "ladder", "b_reading_V": -0.12,
        "electrode": "Ag/AgCl seawater", "temp_C": 14.0, "env": "seawater-quiescent", "a_material": "carbon-steel",
        "b_material": "stainless-316-passive", "geometry": "surface", "length_m": 2.0, "velocity_m_s": 1.0})
    at = want["published"]["at_service"]
    shown = number(pg.locator(".cw-at-service [data-cw-value=attack_mm_per_year]").inner_text())
    assert close(shown, at["attack_mm_per_year"]), (shown, at)
    assert pg.locator(".cw-at-service tr[data-cw-key=velocity_m_s]").get_attribute("data-cw-from") == "user"
    assert "m.sc-v=1" in pg.url
