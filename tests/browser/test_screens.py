"""The screens as a corrosion or CP engineer on a tablet uses them: one test per behaviour of the
home page, the joint matrix, the joint page, the couple page, the electrode page and the
reference conversion (tablet 768 × 1024 unless a test says otherwise)."""

import re
from urllib.parse import parse_qs, urlencode, urlparse

import pytest

from browserkit import new_guarded_page

pytestmark = pytest.mark.browser

RUNTIME_MS = 120_000
TABLET = {"width": 768, "height": 1024}
LAPTOP = {"width": 1280, "height": 800}
PAINTED = "performance.getEntriesByName('cw-result-painted').length > 0"
IDLE = "() => !document.querySelector('.cw-result').hasAttribute('aria-busy')"
# A matrix of materials whose verdicts differ for different reasons in quiescent seawater: ranges
# (titanium / nickel-aluminium bronze), a passive/active state (titanium / 316 passive), a
# sacrificial anode on steel (zinc / mild steel).
MATRIX = ["titanium", "stainless-316-passive", "stainless-316-active", "nickel-aluminium-bronze", "copper",
          "carbon-steel", "zinc"]


@pytest.fixture
def tablet(browser):
    ctx, page, guard = new_guarded_page(browser, viewport=TABLET)
    yield page
    ctx.close()
    assert guard.outside == [] and guard.page_errors == [] and guard.console_errors == [], vars(guard)


def opened(page, served, path, params=None):
    page.goto(served.url(path + ("?" + urlencode(params) if params else "")))
    page.wait_for_function(PAINTED, timeout=RUNTIME_MS)
    page.wait_for_function(IDLE, timeout=RUNTIME_MS)
    return page


def painted_again(page, before_count):
    page.wait_for_function(f"performance.getEntriesByName('cw-result-painted').length > {before_count}",
                           timeout=RUNTIME_MS)
    page.wait_for_function(IDLE, timeout=RUNTIME_MS)


def paints(page):
    return page.evaluate("performance.getEntriesByName('cw-result-painted').length")


def open_matrix(page, served, env="seawater-quiescent", materials=MATRIX):
    opened(page, served, "calculators/matrix/", {"env": env, "m": ",".join(materials)})
    page.locator(".cw-matrix td.cw-cell").first.wait_for(timeout=RUNTIME_MS)


def cell(page, row_name, col_name):
    """The matrix cell in the row of one material and the column of another (by their names)."""
    return page.evaluate("""([r, c]) => {
      const rows = [...document.querySelectorAll('.cw-matrix tbody tr')];
      const cols = [...document.querySelectorAll('.cw-matrix thead th[scope=col]')].map(th => th.textContent);
      const i = rows.findIndex(tr => tr.querySelector('th').textContent.includes(r));
      const j = cols.findIndex(t => t.includes(c));
      const td = rows[i].children[j + 1];
      return {text: td.innerText, cls: td.className, row: i, col: j};
    }""", [row_name, col_name])


# ---------------------------------------------------------------- home page


def test_home_page_leads_to_the_work_and_the_sections_are_in_reach(served, tablet):
    page = tablet
    page.goto(served.url(""))
    cards = page.locator("a.cw-home-card")
    hrefs = [urlparse(h).path.rstrip("/").split("/")[-1] for h in cards.evaluate_all("els => els.map(e => e.href)")]
    assert hrefs == ["joint", "matrix", "field", "survey", "convert", "couple"]
    for box in (cards.nth(k).bounding_box() for k in range(cards.count())):
        assert box["height"] >= 88 and box["width"] >= 250, box  # large targets for a finger
    # the section tabs show on a tablet (the theme hides them below 1220 px), with the breadcrumbs
    assert page.locator(".md-tabs").is_visible()
    page.click("a.md-tabs__link:has-text('Calculators')")
    page.wait_for_url("**/calculators/joint/**")
    assert "Calculators" in page.locator(".md-path").inner_text()
    assert page.locator(".md-footer__link--next").count() == 1


# ---------------------------------------------------------------- joint matrix


def test_matrix_every_cell_shows_the_part_that_corrodes(served, tablet):
    # ASTM G82 Fig. 1 (LaQue): zinc (−0.98 to −1.03 V vs SCE) is anodic to copper (−0.30 to −0.37 V)
    page = tablet
    open_matrix(page, served)
    texts = page.locator(".cw-matrix td.cw-cell").all_inner_texts()
    assert texts and all(re.search(r"[←↑=]", t) for t in texts), texts
    zinc_row = cell(page, "Zinc", "Copper")   # the row's material corrodes: ←
    copper_row = cell(page, "Copper", "Zinc")  # the column's material corrodes: ↑
    assert "←" in zinc_row["text"] and "↑" in copper_row["text"], (zinc_row, copper_row)


def test_matrix_column_headers_are_names(served, tablet):
    page = tablet
    open_matrix(page, served)
    cols = page.locator(".cw-matrix thead th[scope=col]").all_inner_texts()
    assert "Zinc, wrought or plated" in cols and "Mild (carbon) steel" in cols, cols
    assert not any(c.strip() in MATRIX for c in cols), cols


def test_matrix_tap_explains_the_verdict_and_opens_the_joint(served, tablet):
    page = tablet
    open_matrix(page, served)
    at = cell(page, "Zinc", "Copper")
    page.locator(".cw-matrix tbody tr").nth(at["row"]).locator("td").nth(at["col"]).click()
    panel = page.locator(".cw-explain")
    text = panel.inner_text()
    assert "Zinc, wrought or plated corrodes" in text and "unsuited" in text and "allowable 0.25 V" in text, text
    link = panel.locator("a.cw-open-joint")
    query = parse_qs(urlparse(link.get_attribute("href")).query)
    assert query == {"a": ["copper"], "b": ["zinc"], "env": ["seawater-quiescent"]}, query
    link.click()
    page.wait_for_url("**/calculators/joint/**")
    page.locator(".cw-result .cw-big").wait_for(timeout=RUNTIME_MS)
    assert page.input_value("#cw-a") == "copper" and page.input_value("#cw-b") == "zinc"
    assert page.input_value("#cw-env") == "seawater-quiescent"


def test_matrix_says_why_close_differences_get_different_verdicts(served, tablet):
    # Titanium with 316 passive: 0.06 V, but 316 turning active gives 0.405 V (state); titanium with
    # nickel-aluminium bronze: 0.19 V, within 0.25 V, but the ranges reach 0.28 V (range); copper with
    # nickel-aluminium bronze, a close difference with no such reason, is plainly compatible.
    page = tablet
    open_matrix(page, served)
    state = cell(page, "Titanium", "passive")
    rng = cell(page, "Titanium", "Nickel-aluminium bronze")
    plain = cell(page, "Copper", "Nickel-aluminium bronze")
    assert "state" in state["text"] and "cw-v-guarded" in state["cls"], state
    assert "range" in rng["text"] and "cw-v-guarded" in rng["cls"], rng
    assert not re.search(r"range|state", plain["text"]), plain
    at = cell(page, "Titanium", "passive")
    page.locator(".cw-matrix tbody tr").nth(at["row"]).locator("td").nth(at["col"]).click()
    assert "another passive/active state" in page.locator(".cw-explain").inner_text()


def test_matrix_knows_sacrificial_anodes_on_steel(served, tablet):
    page = tablet
    open_matrix(page, served)
    zn = cell(page, "Mild (carbon) steel", "Zinc")
    assert "CP" in zn["text"] and "cw-by-design" in zn["cls"] and "cw-v-unsuited" in zn["cls"], zn
    assert "CP" not in cell(page, "Copper", "Zinc")["text"]  # zinc on copper is no protection of steel
    page.locator(".cw-matrix tbody tr").nth(zn["row"]).locator("td").nth(zn["col"]).click()
    assert "sacrificial by design" in page.locator(".cw-explain").inner_text()


def test_matrix_picker_is_a_search_with_chips(served, tablet):
    page = tablet
    open_matrix(page, served, materials=["zinc", "copper"])
    assert page.locator("select[multiple]").count() == 0
    assert page.locator(".cw-chip").count() == 2
    n = paints(page)
    page.fill("#cw-m", "S31600")  # a UNS number finds the stainless grade
    page.locator(".cw-match", has_text="316/317 (passive)").click()
    painted_again(page, n)
    assert page.locator(".cw-chip").count() == 3
    assert "stainless-316-passive" in parse_qs(urlparse(page.url).query)["m"][0]
    assert page.locator(".cw-matrix th[scope=row]").count() == 3
    n = paints(page)
    page.locator(".cw-chip", has_text="Copper").click()  # a tap on a chip removes it
    painted_again(page, n)
    assert page.locator(".cw-matrix th[scope=row]").count() == 2
    for box in (page.locator(".cw-chip").nth(k).bounding_box() for k in range(2)):
        assert box["height"] >= 44


def test_matrix_uses_the_full_width_on_a_laptop(served, browser):
    ctx, page, guard = new_guarded_page(browser, viewport=LAPTOP)
    try:
        open_matrix(page, served, materials=[])  # every material with data
        width = page.locator(".cw-matrix-wrap").bounding_box()["width"]
        assert width > 950, width  # the theme's text column is about 740 px at this size
        assert not page.locator(".md-sidebar--secondary").is_visible()
        assert page.evaluate("document.documentElement.scrollWidth") <= LAPTOP["width"]
    finally:
        ctx.close()
    assert guard.outside == [] and guard.page_errors == []


# ---------------------------------------------------------------- joint page


def test_joint_states_table_names_the_materials(served, tablet):
    page = opened(tablet, served, "calculators/joint/",
                  {"a": "titanium", "b": "stainless-316-passive", "env": "seawater-flowing", "ar": "1"})
    text = page.locator(".cw-states").inner_text()
    assert "Austenitic stainless steel 316/317 (active)" in text and "Titanium, commercially pure" in text, text
    assert "stainless-316-active" not in text and "titanium\t" not in text


def test_joint_anodic_index_case_is_labelled_and_charted_as_an_index(served, tablet):
    # The legacy anodic-index table: zinc 1.25 V, plain carbon steel 0.85 V, difference 0.40 V
    # (values of the dataset's anodic-index-legacy source, recalled).
    page = opened(tablet, served, "calculators/joint/", {"a": "zinc", "b": "carbon-steel", "env": "marine-atmosphere"})
    table = page.locator(".cw-compare").inner_text()
    assert "Anodic-index difference" in table and "0.400 V" in table, table
    assert "Potential difference" not in table
    chart = page.locator("svg.cw-scale")
    assert "anodic-index" in chart.locator("title").text_content()
    assert "anodic index" in chart.text_content()
    assert page.locator(".cw-series-inline").count() == 0  # not the seawater series


def test_joint_rate_is_worded_as_an_upper_bound_screen(served, tablet):
    page = opened(tablet, served, "calculators/joint/",
                  {"a": "carbon-steel", "b": "stainless-316-passive", "env": "seawater-flowing", "ar": "10"})
    row = page.locator(".cw-compare tr", has_text="upper-bound screen").inner_text()
    assert "upper bound" in row and "mm/year" in row and "not a prediction" in row, row


@pytest.mark.parametrize("path,params", [
    ("calculators/joint/", {"a": "titanium", "b": "stainless-316-passive", "env": "seawater-flowing"}),
    ("calculators/joint/", {"a": "zinc", "b": "carbon-steel", "env": "marine-atmosphere"}),
    ("calculators/couple/", {}),
    ("calculators/electrode/", {}),
    ("calculators/activity/", {}),
], ids=["joint-series", "joint-index", "couple", "electrode", "activity"])
def test_chart_text_is_at_least_12_px_on_a_tablet(served, tablet, path, params):
    page = opened(tablet, served, path, params)
    page.locator(".cw-result svg.cw-chart").first.wait_for(timeout=RUNTIME_MS)
    sizes = page.evaluate("""() => [...document.querySelectorAll('.cw-result svg.cw-chart')].flatMap(svg => {
      const scale = svg.getBoundingClientRect().width / svg.viewBox.baseVal.width;
      return [...svg.querySelectorAll('text')].filter(t => t.textContent.trim())
        .map(t => [t.textContent, parseFloat(getComputedStyle(t).fontSize) * scale]);
    })""")
    assert sizes, "no chart text"
    small = [s for s in sizes if s[1] < 12 - 1e-6]
    assert small == [], small


# ---------------------------------------------------------------- couple page


def test_couple_clears_the_activities_of_the_previous_pair(served, tablet):
    # The opening pair is Zn2+/Zn with Cu2+/Cu at a(Zn2+) = 1e-5, a(Cu2+) = 1e-6 (calc.spec).
    page = opened(tablet, served, "calculators/couple/")
    assert page.input_value("#cw-sp-Cu2_") == "1e-6"
    n = paints(page)
    page.select_option("#cw-b", "Ag+/Ag")
    painted_again(page, n)
    assert page.input_value("#cw-sp-Zn2_") == "1e-5"  # Zn2+/Zn is still in the pair: its value stays
    assert page.input_value("#cw-sp-Ag_") == "1"
    n = paints(page)
    page.select_option("#cw-a", "Cu2+/Cu")
    painted_again(page, n)
    assert page.input_value("#cw-sp-Cu2_") == "1"  # not the opening pair's 1e-6
    assert page.locator("#cw-sp-Zn2_").count() == 0
    assert "a.Cu2+=1" in page.url.replace("%2B", "+")


def test_couple_eph_lines_stop_where_a_solid_is_stable(served, tablet):
    # Zn2+/Zn at a(Zn2+) = 1e-5: ZnO/Zn (CRC −1.260 V, recalled) lies below it above about pH 8
    page = opened(tablet, served, "calculators/couple/")
    fig = page.locator("figure.cw-eph")
    caption = fig.locator("figcaption").inner_text()
    assert "ZnO" in caption and "Zn2+/Zn line is not drawn" in caption, caption
    ends = fig.locator(".cw-line-end")
    assert ends.count() >= 1
    frame = fig.locator("rect.cw-frame").bounding_box()
    zn_end = ends.first.bounding_box()
    assert frame["x"] + 0.45 * frame["width"] < zn_end["x"] < frame["x"] + 0.7 * frame["width"], (frame, zn_end)


# ---------------------------------------------------------------- electrode page


def test_electrode_result_on_the_field_scales(served, tablet):
    # The hydrogen electrode at pH 0 and p(H2) = 1 bar is 0 V vs SHE; against SCE it is −0.2412 V at
    # 25 °C (Sawyer, Sobkowiak & Roberts, Electrochemistry for Chemists, 2nd ed. 1995: SCE 0.2412 V
    # vs SHE), against CSE −0.316 V (Szabó & Bakos, Int. J. Corros. 2010, 756950, Table 2: 0.316 V).
    page = opened(tablet, served, "calculators/electrode/", {"id": "H+/H2", "t": "25", "pH": "0", "p.H2": "0.986923"})
    shown = dict(page.evaluate("[...document.querySelectorAll('[data-cw-scale]')].map(e => [e.dataset.cwScale, e.innerText])"))
    assert set(shown) == {"CSE", "SCE", "Ag/AgCl sat. KCl", "Ag/AgCl seawater"}, shown
    assert float(shown["SCE"].replace("−", "-")) == pytest.approx(-0.2412, abs=5e-5)
    assert float(shown["CSE"].replace("−", "-")) == pytest.approx(-0.316, abs=5e-5)


# ---------------------------------------------------------------- reference conversion


def test_convert_reads_and_writes_millivolts(served, tablet):
    # 0 V vs SCE is +0.2412 V vs SHE at 25 °C (Sawyer et al. 1995): +241.2 mV
    page = opened(tablet, served, "calculators/convert/", {"v": "0", "from": "SCE", "to": "SHE", "t": "25"})
    n = paints(page)
    page.select_option("#cw-unit", "mV")
    painted_again(page, n)
    assert page.locator("label[for=cw-v]").inner_text() == "Reading (mV)"
    assert page.locator(".cw-big").inner_text().replace("\n", " ").strip() == "+241.2 mV vs SHE"
    n = paints(page)
    page.fill("#cw-v", "-850")
    page.locator("#cw-v").dispatch_event("change")
    painted_again(page, n)
    assert "u=mV" in page.url and "−608.8 mV vs SHE" in page.locator(".cw-big").inner_text()


def test_convert_offers_volts_for_a_millivolt_number(served, tablet):
    page = opened(tablet, served, "calculators/convert/", {"v": "0", "from": "CSE", "to": "Ag/AgCl seawater", "t": "25"})
    page.fill("#cw-v", "-850")
    page.locator("#cw-v").dispatch_event("change")
    offer = page.locator(".cw-suggest-button")
    offer.wait_for(timeout=30_000)
    assert offer.inner_text() == "Did you mean −0.850 V?"
    n = paints(page)
    offer.click()
    painted_again(page, n)
    assert page.input_value("#cw-v") == "-0.850" and page.locator(".cw-suggest-button").count() == 0
    assert page.locator("#cw-v-msg").inner_text() == ""


def test_convert_notes_the_trade_equivalent_with_the_computed_gap(served, tablet):
    # −0.85 V vs CSE at 25 °C: −0.85 + 0.316 (CSE, Szabó & Bakos 2010) − 0.25 (Ag/AgCl seawater, EN 12473,
    # recalled) = −0.784 V vs Ag/AgCl seawater, 16 mV less negative than the working −0.80 V (common practice)
    page = opened(tablet, served, "calculators/convert/")
    note = page.locator(".cw-working-note")
    note.wait_for(timeout=30_000)
    text = note.inner_text()
    assert "−0.784 V vs Ag/AgCl seawater" in text and "16 mV less negative" in text, text
