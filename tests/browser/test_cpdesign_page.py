"""The cathodic-protection design page as a CP engineer on a tablet uses it: it opens with an
answer, zones are added and removed in the table and the answer follows, bad input is refused at
the field with calc's message naming it, the joint page's cathodic-protection advice opens it set
for the joint's environment, the three designs reproduce published worked examples, and it prints
a record with the data version. Every page is guarded: no request leaves 127.0.0.1, no console
error, no uncaught page error (browserkit.new_guarded_page)."""

import json
import os
import re
from urllib.parse import parse_qs, urlencode, urlparse

import pytest
from playwright.sync_api import expect

from browserkit import new_guarded_page

pytestmark = pytest.mark.browser

RUNTIME_MS = 120_000
TABLET = {"width": 768, "height": 1024}
LAPTOP = {"width": 1280, "height": 800}
PAINTED = "performance.getEntriesByName('cw-result-painted').length"
IDLE = "() => [...document.querySelectorAll('.cw-result')].every(r => !r.hasAttribute('aria-busy'))"
PAGE = "calculators/cp-design/"
NUMBER = re.compile(r"[-−]?\d+(?:\.\d+)?")


def number(text):
    return float(NUMBER.search(text).group(0).replace("−", "-"))


def stage(text, name):
    """One stage of an "initial 47.81 A · mean 25.82 A · final 36.75 A" figure."""
    return float(re.search(name + r" ([-−]?\d+(?:\.\d+)?)", text).group(1).replace("−", "-"))


@pytest.fixture
def tablet(browser):
    ctx, page, guard = new_guarded_page(browser, viewport=TABLET)
    yield page
    ctx.close()
    assert guard.outside == [] and guard.page_errors == [] and guard.console_errors == [], vars(guard)


def paints(page):
    return page.evaluate(PAINTED)


def opened(page, served, params=None, path=PAGE):
    page.goto(served.url(path + ("?" + urlencode(params, doseq=True) if params else "")))
    page.wait_for_function(PAINTED + " > 0", timeout=RUNTIME_MS)
    page.wait_for_function(IDLE, timeout=RUNTIME_MS)
    return page


def painted_again(page, before):
    page.wait_for_function(f"{PAINTED} > {before}", timeout=RUNTIME_MS)
    page.wait_for_function(IDLE, timeout=RUNTIME_MS)


def shown(page, design):
    return page.locator(f".cw-cpd-design[data-design='{design}']")


def value(page, design, key):
    return shown(page, design).locator(f".cw-result [data-cw-value='{key}']").inner_text()


def environments(built_site):
    with open(os.path.join(built_site, "assets", "data", "dataset.json"), encoding="utf-8") as fh:
        return {e["id"]: e for e in json.load(fh)["environments"]}


# ---------------------------------------------------------------- opening, zones table


def test_opens_with_an_answer_whose_mass_follows_the_offshore_equation(served, tablet):
    page = opened(tablet, served)
    assert page.locator("button[data-design='immersed']").get_attribute("aria-pressed") == "true"
    box = shown(page, "immersed")
    count = int(value(page, "immersed", "count"))
    demand = value(page, "immersed", "current_demand_A")
    mass = number(value(page, "immersed", "net_mass_kg"))
    # DNV-RP-B401 net anode mass, as restated by El-Reedy, Offshore Structures (2012) ch. 6:
    # M = I_mean·t_f·8760/(u·ε); ε and u as the result states them, I_mean as shown (4 digits)
    anode = box.locator(".cw-cpd-figures tr", has_text="A·h/kg").inner_text()
    eps, u = (float(x) for x in re.search(r"ε = ([\d.]+) A·h/kg, u = ([\d.]+)", anode).groups())
    life = float(page.input_value("#cw-i-life"))
    assert mass == pytest.approx(stage(demand, "mean") * life * 8760 / (u * eps), rel=5e-4)
    # the number of anodes reaches the net mass (each anode's mass as typed): N·m ≥ M (common practice)
    assert count * float(page.input_value("#cw-i-m")) >= mass
    governs = box.locator(".cw-cpd-governs").inner_text()
    assert "governs" in governs and "_" not in governs  # plain words, not the result's key
    # the cautions the result carries sit beside it: a qualified engineer, over-protection (hydrogen)
    cautions = box.locator(".cw-result .admonition.warning").inner_text()
    assert "qualified cathodic-protection engineer" in cautions and "hydrogen" in cautions
    # names, not ids: the zones' coatings and the anode alloy as the dataset names them
    assert "category-iii" not in box.locator(".cw-form").inner_text()
    assert "Aluminium-zinc-indium alloy" in anode


def test_a_zone_added_and_removed_changes_the_answer(served, tablet):
    page = opened(tablet, served)
    box = shown(page, "immersed")
    rows = box.locator("tr.cw-cpd-zone")
    assert rows.count() == 3
    before = value(page, "immersed", "current_demand_A")
    mean0 = stage(before, "mean")
    n = paints(page)
    box.locator(".cw-cpd-add").click()
    assert rows.count() == 4
    area = page.evaluate("document.activeElement.id")
    assert area.endswith("-area")  # the new row's area, ready to type
    page.fill("#" + area, "500")
    painted_again(page, n)
    after = value(page, "immersed", "current_demand_A")
    assert after != before
    # the new zone's demand is I = i·A·f (DNV-RP-B401 as restated by El-Reedy 2012, ch. 6): the density the
    # result shows for it, times 500 m², times its breakdown factor
    box.locator(".cw-cpd-zone-demand summary").click()
    last = box.locator(".cw-cpd-zone-demand tbody tr").nth(3).locator("td")
    i_mean, f_mean = stage(last.nth(3).text_content(), "mean"), stage(last.nth(4).text_content(), "mean")
    assert stage(after, "mean") == pytest.approx(mean0 + i_mean * 500 * f_mean, abs=0.01)
    # remove it again: the opening answer is back
    n = paints(page)
    rows.nth(3).locator(".cw-cpd-remove").click()
    painted_again(page, n)
    assert rows.count() == 3 and value(page, "immersed", "current_demand_A") == before
    # remove the first zone: the demand falls by that zone's own
    first_mean = stage(box.locator(".cw-cpd-zone-demand tbody tr").nth(0).locator("td").nth(5).text_content(), "mean")
    n = paints(page)
    rows.nth(0).locator(".cw-cpd-remove").click()
    painted_again(page, n)
    assert rows.count() == 2
    assert stage(value(page, "immersed", "current_demand_A"), "mean") == pytest.approx(mean0 - first_mean, abs=0.01)
    # the URL keeps the two zones: a reload shows them and the same answer
    assert len(parse_qs(urlparse(page.url).query)["i.z"]) == 2
    kept = value(page, "immersed", "current_demand_A")
    page.reload()
    page.wait_for_function(PAINTED + " > 0", timeout=RUNTIME_MS)
    page.wait_for_function(IDLE, timeout=RUNTIME_MS)
    assert rows.count() == 2 and value(page, "immersed", "current_demand_A") == kept


def test_the_last_zone_cannot_be_removed(served, tablet):
    page = opened(tablet, served, {"i.z": "Buoy hull|seawater|1|12|bare"})
    remove = shown(page, "immersed").locator("tr.cw-cpd-zone .cw-cpd-remove")
    assert remove.count() == 1 and remove.is_disabled()
    assert remove.bounding_box()["height"] >= 44  # a finger's target


# ---------------------------------------------------------------- bad input


@pytest.mark.parametrize("selector,typed,field", [
    ("#cw-i-rho", "-0.25", "resistivity_ohm_m"),
    ("#cw-i-life", "0", "life_years"),
])
def test_bad_input_shows_calc_message_at_the_field(served, tablet, selector, typed, field):
    page = opened(tablet, served)
    page.fill(selector, typed)
    msg = page.locator(selector + "-msg")
    expect(msg).to_contain_text(field, timeout=RUNTIME_MS)  # calc's message names the field ...
    expect(msg).to_contain_text("expected")                  # ... and says what is allowed
    assert page.get_attribute(selector, "aria-invalid") == "true"
    expect(shown(page, "immersed").locator(".cw-result")).to_have_class(re.compile("cw-stale"))


def test_a_coating_that_does_not_exist_is_refused_at_its_cell(served, tablet):
    page = tablet
    page.goto(served.url(PAGE + "?" + urlencode({"i.z": "Deck legs|seawater|5|40|category-v"})))
    cell = shown(page, "immersed").locator("tr.cw-cpd-zone").nth(0).locator("td.cw-cpd-coating .cw-field-msg")
    expect(cell).to_contain_text("zones[0].coating", timeout=RUNTIME_MS)


def test_buried_design_refuses_a_negative_soil_resistivity(served, tablet):
    page = opened(tablet, served, {"design": "buried"})
    page.fill("#cw-b-rho", "-40")
    expect(page.locator("#cw-b-rho-msg")).to_contain_text("resistivity_ohm_m", timeout=RUNTIME_MS)


# ---------------------------------------------------------------- from the joint page


def test_the_joint_pages_cp_advice_opens_the_design_set_for_its_environment(served, tablet, built_site):
    page = opened(tablet, served, path="calculators/joint/")
    env = parse_qs(urlparse(page.url).query).get("env", ["seawater-quiescent"])[0]
    link = page.locator("a.cw-open-cp-design")
    expect(link).to_have_count(1)
    assert parse_qs(urlparse(link.get_attribute("href")).query)["env"] == [env]
    link.click()
    page.wait_for_url("**/calculators/cp-design/**")
    page.wait_for_function(PAINTED + " > 0", timeout=RUNTIME_MS)
    page.wait_for_function(IDLE, timeout=RUNTIME_MS)
    record = environments(built_site)[env]
    note = page.locator(".cw-cpd-prefill").inner_text()
    assert record["name"] in note and env not in note  # the environment by its name
    assert page.locator("button[data-design='immersed']").get_attribute("aria-pressed") == "true"
    # the resistivity is the upper end of the environment's range (data/environments.yaml): less output
    assert float(page.input_value("#cw-i-rho")) == pytest.approx(max(record["resistivity_ohm_m"]))
    assert shown(page, "immersed").locator(".cw-result .cw-big").is_visible()
    assert page.locator("a", has_text="Back to the joint").count() == 1


def test_a_buried_environment_opens_the_buried_design(served, tablet, built_site):
    page = opened(tablet, served, {"env": "buried-soil"})
    assert page.locator("button[data-design='buried']").get_attribute("aria-pressed") == "true"
    assert shown(page, "buried").is_visible() and not shown(page, "immersed").is_visible()
    assert environments(built_site)["buried-soil"]["name"] in page.locator(".cw-cpd-prefill").inner_text()


# ---------------------------------------------------------------- published worked examples


def test_buried_design_reproduces_the_handbook_pipeline(served, tablet):
    # MIL-HDBK-1004/10 (1990), worked example of a coated pipeline with 17-lb standard packaged magnesium
    # anodes (handbook page 186): 4500 Ω·cm soil, I = 0.858 A: i = 120,000 × 1.00 × 1.00/4,500 = 26.7 mA,
    # n = 858/26.7 = 32.1 (the page rounds up to whole anodes)
    page = opened(tablet, served, {"design": "buried", "b.mode": "given", "b.i": "0.858", "b.rho": "45",
                                   "b.alloy": "magnesium", "b.anode": "17-lb-packaged", "b.coat": "well-coated",
                                   "b.pot": "-0.85", "b.life": "15"})
    assert number(value(page, "buried", "anode_output_mA")) == pytest.approx(26.7, abs=0.05)
    count = int(value(page, "buried", "count"))
    assert count >= 32.1 and count - 32.1 < 1.5


def test_groundbed_design_reproduces_the_etl_example_and_the_wenner_helper_feeds_it(served, tablet):
    # USACE ETL 1110-9-10 (1991) example 2-3, pp. 35-36: nine anodes 5 ft long, 2 in across, 10 ft apart in
    # 4500 Ω·cm soil: R_N = 21.06/9 + 4500 × 0.00212/10 = 3.29 Ω
    page = opened(tablet, served, {"design": "groundbed", "g.rho": "45", "g.L": "1.524", "g.d": "0.0508",
                                   "g.n": "9", "g.s": "3.048", "g.par": "table", "g.i": "8.2", "g.ra": "1",
                                   "g.cl": "", "g.mg": "", "g.be": "", "g.mat": "-", "g.life": ""})
    assert number(value(page, "groundbed", "resistance_ohm")) == pytest.approx(3.29, abs=0.005)
    # ASTM G57-95a (2001) Sec. 3.2, feet form: 10 ft spacing and 2 Ω give 191.5 × 10 × 2 = 3830 Ω·cm = 38.30 Ω·m
    box = shown(page, "groundbed")
    box.locator(".cw-cpd-wenner summary").click()
    page.fill("#cw-gw-a", "3.048")
    page.fill("#cw-gw-r", "2")
    rho = box.locator(".cw-cpd-wenner [data-cw-value='resistivity_ohm_m']")
    expect(rho).to_contain_text("38.3", timeout=RUNTIME_MS)
    assert number(rho.inner_text().split("=")[1]) == pytest.approx(38.30, abs=0.01)
    n = paints(page)
    box.locator(".cw-cpd-use").click()
    painted_again(page, n)
    assert float(page.input_value("#cw-g-rho")) == pytest.approx(38.30, abs=0.01)
    # R_N scales with ρ (both terms of R_N = R_V/N + ρ·P/S are proportional to it)
    assert number(value(page, "groundbed", "resistance_ohm")) == pytest.approx(3.29 * 38.30 / 45, abs=0.01)


# ---------------------------------------------------------------- screens and the record


@pytest.mark.parametrize("viewport", [TABLET, LAPTOP], ids=["tablet", "laptop"])
@pytest.mark.parametrize("scheme", ["light", "dark"])
def test_every_design_fits_labels_and_touch_targets(served, browser, viewport, scheme):
    ctx, page, guard = new_guarded_page(browser, viewport=viewport, color_scheme=scheme)
    try:
        opened(page, served)
        for design in ("immersed", "buried", "groundbed"):
            n = paints(page)
            page.click(f"button[data-design='{design}']")
            if design != "immersed":
                painted_again(page, n)
            assert page.evaluate("document.documentElement.scrollWidth") <= viewport["width"], design
            missing = page.evaluate(
                "[...document.querySelectorAll('.cw-cpd-design:not([hidden]) .cw-form :is(input, select)')]"
                ".filter(e => !e.closest('[hidden]') && !document.querySelector(`label[for='${e.id}']`)).map(e => e.id)")
            assert missing == [], design
            small = page.evaluate(
                "[...document.querySelectorAll('.cw-cpd-design:not([hidden]) .cw-form :is(input, select, button)')]"
                ".filter(e => e.offsetParent && e.getBoundingClientRect().height < 44).map(e => e.id || e.className)")
            assert small == [], design
            assert page.locator(f"button[data-design='{design}']").bounding_box()["height"] >= 44
            assert "design=" + design in page.url
    finally:
        ctx.close()
    assert guard.outside == [] and guard.page_errors == [] and guard.console_errors == [], vars(guard)


def test_print_record_carries_the_design_the_data_version_and_every_step(served, tablet):
    page = opened(tablet, served)
    page.evaluate("window.dispatchEvent(new Event('beforeprint'))")
    page.emulate_media(media="print")
    box = shown(page, "immersed")
    head = box.locator(".cw-print-head")
    assert head.is_visible()
    text = head.inner_text()
    assert "Couplewise record: Cathodic-protection design: immersed galvanic anodes" in text
    assert "Data version" in text and "Reproduce it at" in text
    assert box.locator(".cw-derivation").get_attribute("open") is not None
    assert not page.locator(".cw-cpd-choose").is_visible() and not box.locator(".cw-cpd-add").is_visible()
    assert page.pdf(format="A4").startswith(b"%PDF")
