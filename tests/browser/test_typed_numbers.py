"""Typed numbers read exactly as a person means them, and echoes that cannot mislead, in a real
browser.

- The page's parser (docs/assets/js/numbers.mjs, used by ui.mjs readNumber) reads every case of the
  table that the command line's parser is tested against (tests/fixtures/numbers.json; the
  Python side is tests/test_numbers.py).
- Each refused form typed into a field gets a message saying what was read and what to write; a
  shared link with such a value computes nothing and says what was wrong, on every calculator.
- An echo sits in its own bidirectional isolate, shows control characters as \\uXXXX and is cut.
- An out-of-date result says so in words, and the result is described by those words.
- The survey log: a click on save and Enter just after save once and the message stays true; a
  draft typed just before a crash comes back.
"""

import json
import os
import signal
from urllib.parse import urlencode

import pytest
from playwright.sync_api import expect

from test_survey import SURVEY, check, launch, open_log, rows

pytestmark = pytest.mark.browser

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
RUNTIME_MS = 240_000
RESULT_READY = "performance.getEntriesByName('cw-result-painted').length > 0"
SETTLED = "() => !document.querySelector('.cw-result').hasAttribute('aria-busy')"
SIGNATURE = ("[...document.querySelectorAll('.cw-result .cw-big, .cw-result [data-cw-value]')]"
             ".map(e => e.innerText.trim()).join(' | ')")
with open(os.path.join(ROOT, "tests", "fixtures", "numbers.json"), encoding="utf-8") as _fh:
    TABLE_TEXT = _fh.read()
TABLE = json.loads(TABLE_TEXT)
#: the forms of the issue, each with words its message must hold
REFUSED = [("1,000", "use 1000 or 1.000"), ("12,345", "use 12345 or 12.345"), ("0x10", "hexadecimal"),
           ("0b11", "decimal"), ("0o7", "decimal"), ("Infinity", "finite"), ("NaN", "finite"),
           ("1_000", "use 1000"), ("1.000,5", "use 1000.5"), ("1..2", "more than one decimal mark"),
           ("1,2,3", "more than one decimal mark"), ("", "Enter a value")]
BIDI = "\u202e"
MESSAGE = """(id) => { const m = document.getElementById(id + '-msg');
  return { text: m.textContent, bdi: [...m.querySelectorAll('bdi')].map((b) => b.textContent),
           height: m.getBoundingClientRect().height }; }"""


def open_calc(page, served, name, query=None):
    page.goto(served.url(f"calculators/{name}/" + ("?" + urlencode(query) if query else "")))


def converted(page, served):
    """The conversion page with 0.1 V vs SCE to SHE at 25 °C, answered; its headline numbers."""
    open_calc(page, served, "convert", {"v": "0.1", "from": "SCE", "to": "SHE", "t": "25"})
    page.wait_for_function(RESULT_READY, timeout=RUNTIME_MS)
    page.wait_for_function(SETTLED)
    return page.evaluate(SIGNATURE)


def test_the_page_reads_every_case_of_the_table(served, guarded):
    page, guard = guarded
    open_calc(page, served, "convert")
    page.locator(".cw-form").wait_for(timeout=RUNTIME_MS)
    got = page.evaluate("""async ([table, numbersUrl, uiUrl]) => {
      const { readDecimal, problemText, visible } = await import(numbersUrl);
      const { readNumber } = await import(uiUrl);
      const doc = JSON.parse(table);
      const message = (text) => { const r = readNumber({ value: text }, "a test value");
        if (r.error === undefined) return null;
        const box = document.createElement("div"); box.append(...[r.error].flat()); return box.textContent; };
      return {
        accepted: doc.accepted.map((c) => { const r = readDecimal(c.text);
          return { value: r.value, negative: Object.is(r.value, -0) || r.value < 0, kind: r.kind || null,
                   viaField: readNumber({ value: c.text }, "x").value }; }),
        refused: doc.refused.map((c) => { const r = readDecimal(c.text);
          return { kind: r.kind || null, words: r.kind ? problemText(r) : "", message: message(c.text) }; }),
        echo: doc.echo.map((c) => visible(c.text)),
      };
    }""", [TABLE_TEXT, served.url("assets/js/numbers.mjs"), served.url("assets/js/ui.mjs")])
    for case, r in zip(TABLE["accepted"], got["accepted"]):
        assert r["kind"] is None and r["value"] == case["value"] == r["viaField"], (case, r)
        assert r["negative"] == (str(case["value"]).startswith("-")), (case, r)
    for case, r in zip(TABLE["refused"], got["refused"]):
        assert r["kind"] == case["kind"], (case, r)
        assert all(w in r["words"] or w in r["message"] for w in case["says"]), (case, r)
        assert r["message"] and "\n" not in r["message"] and len(r["message"]) < 300, (case, r)
        assert BIDI not in r["message"], (case, r)
    for case, r in zip(TABLE["echo"], got["echo"]):
        assert r == {"shown": case["shown"], "cut": case["cut"], "count": case["count"]}, (case, r)


def test_a_comma_or_a_point_gives_the_same_answer(served, guarded):
    page, guard = guarded
    point = converted(page, served)
    assert "+0.3412" in point  # SCE +0.2412 V vs SHE at 25 °C (Sawyer, Sobkowiak & Roberts 1995)
    for text in ("0,1", "0,100", "1e-1", "1E\u22121", " 0.1 "):
        page.fill("#cw-v", "0.2")
        page.wait_for_function(f"({SIGNATURE}) !== {point!r}", timeout=60_000)
        page.fill("#cw-v", text)
        page.wait_for_function(f"({SIGNATURE}) === {point!r}", timeout=60_000)
        assert page.inner_text("#cw-v-msg") == "", text
    page.fill("#cw-v", "\u22120,1")  # true minus and a decimal comma
    page.wait_for_function(f"({SIGNATURE}).includes('+0.1412')", timeout=60_000)
    assert guard.console_errors == [], guard.console_errors


def test_each_refused_form_says_what_was_read_and_marks_the_result_out_of_date(served, guarded):
    page, guard = guarded
    before = converted(page, served)
    for text, words in REFUSED:
        page.fill("#cw-v", text)
        expect(page.locator("#cw-v-msg")).to_contain_text(words, timeout=10_000)
        m = page.evaluate(MESSAGE, "cw-v")
        if text:
            assert m["text"].startswith("“" + text + "”") and m["bdi"] == [text], (text, m)
        assert "Allowed:" in m["text"] or "Enter a value:" in m["text"], m
        assert page.get_attribute("#cw-v", "aria-invalid") == "true"
        # the old result: greyed, and said in words to be out of date; the result is described by them
        result = page.locator(".cw-result")
        expect(result).to_have_class("cw-result cw-stale")
        note_id = result.get_attribute("aria-describedby")
        assert note_id, text
        note = page.locator(f'[id="{note_id}"]')
        expect(note).to_contain_text("not for the current inputs")
        expect(note).to_contain_text("correct Reading (V) above")
        assert note.get_attribute("aria-live") == "polite"
        assert page.evaluate(SIGNATURE) == before  # nothing was calculated for it
    page.fill("#cw-v", "0.1")
    page.wait_for_function("!document.querySelector('.cw-result').classList.contains('cw-stale')", timeout=60_000)
    assert page.get_attribute(".cw-result", "aria-describedby") is None
    assert page.locator(".cw-stale-note").inner_text().strip() == ""
    assert page.evaluate(SIGNATURE) == before
    assert guard.console_errors == [], guard.console_errors


#: a shared link with a refused value: (page, query, the field's label, words of the message)
LINKS = [
    ("couple", {"t": "0x10"}, "Temperature (°C)", "hexadecimal"),
    ("joint", {"a": "zinc", "b": "copper", "env": "seawater-flowing", "ar": "1,000"},
     "Wetted area ratio", "use 1000 or 1.000"),
    ("convert", {"v": "Infinity", "from": "SCE", "to": "SHE", "t": "25"}, "Reading (V)", "finite"),
    ("electrode", {"id": "Zn2+/Zn", "t": "1_000"}, "Temperature (°C)", "use 1000"),
    ("activity", {"sp": "Cl-", "I": "0b11"}, "Ionic strength", "decimal"),
    ("field", {"c.v": "1.000,5", "m.av": "0o7"}, "Reading (V)", "use 1000.5"),
]


@pytest.mark.parametrize("name,query,label,words", LINKS, ids=[x[0] for x in LINKS])
def test_a_shared_link_with_a_refused_value_computes_nothing_and_says_what_was_wrong(served, guarded, name, query,
                                                                                       label, words):
    page, guard = guarded
    open_calc(page, served, name, query)
    pending = page.locator(".cw-result ul.cw-pending li")
    expect(pending.first).to_be_visible(timeout=RUNTIME_MS)
    text = " ".join(page.locator(".cw-result").all_inner_texts())
    assert "No result yet" in text and label in text and words in text, text
    page.wait_for_timeout(1500)  # time for a calculation that must not happen
    assert page.locator(".cw-result [data-cw-value], .cw-result .cw-big").count() == 0
    assert page.locator(".cw-result .cw-echo").count() >= 1  # the echo is isolated there too
    if name == "field":  # both calculators of the page say what was wrong
        assert page.locator(".cw-result ul.cw-pending").count() == 2
    assert guard.console_errors == [], guard.console_errors


def test_an_echo_cannot_turn_the_message_around_nor_grow_it(served, guarded):
    page, guard = guarded
    open_calc(page, served, "couple")
    page.wait_for_function(RESULT_READY, timeout=RUNTIME_MS)
    # a right-to-left override: shown as \u202E, isolated; the page's own words stay in order
    page.fill("#cw-t", "25" + BIDI + " degrees")
    expect(page.locator("#cw-t-msg")).to_contain_text("is not a number")
    m = page.evaluate(MESSAGE, "cw-t")
    assert BIDI not in m["text"] and "25\\u202E degrees" in m["text"] and m["bdi"] == ["25\\u202E degrees"], m
    order = page.evaluate("""() => { const msg = document.getElementById('cw-t-msg');
      const at = (word) => { const walker = document.createTreeWalker(msg, NodeFilter.SHOW_TEXT);
        for (let n = walker.nextNode(); n; n = walker.nextNode()) { const i = n.textContent.indexOf(word);
          if (i >= 0) { const r = document.createRange(); r.setStart(n, i); r.setEnd(n, i + word.length);
            return r.getClientRects()[0]; } } return null; };
      const a = at('is not'), b = at('write digits');
      return { sameLine: Math.abs(a.top - b.top) < 2, leftToRight: a.left < b.left, aTop: a.top, bTop: b.top }; }""")
    assert order["leftToRight"] or not order["sameLine"], order
    # right-to-left text is isolated (its own <bdi>), so it cannot take the quotes or words with it
    page.fill("#cw-t", "\u05e9\u05dc\u05d5\u05dd 5")
    expect(page.locator("#cw-t-msg")).to_contain_text("is not a number")
    assert page.evaluate(MESSAGE, "cw-t")["bdi"] == ["\u05e9\u05dc\u05d5\u05dd 5"]
    # a 100 kB value: cut, with its length; the message stays one short box
    page.evaluate("""() => { const i = document.getElementById('cw-t'); i.value = '7'.repeat(100000) + 'x';
      i.dispatchEvent(new Event('input', { bubbles: true })); }""")
    expect(page.locator("#cw-t-msg")).to_contain_text("(100001 characters)")
    m = page.evaluate(MESSAGE, "cw-t")
    assert len(m["text"]) < 300 and m["height"] < 200, m
    assert page.evaluate("(m => m.scrollWidth <= m.clientWidth)(document.getElementById('cw-t-msg'))")  # it wraps
    # the result area's list of what is wrong repeats the cut echo, never the whole value
    assert len(page.locator(".cw-stale-note").inner_text()) < 300
    assert guard.console_errors == [], guard.console_errors


# ---------------------------------------------------------------- the survey log

def fill_reading(page, loc, value):
    page.select_option("#cw-s-st", "carbon-steel")
    page.select_option("#cw-s-set", "soil-aerobic")
    page.select_option("#cw-s-el", "CSE")
    page.fill("#cw-s-loc", loc)
    page.fill("#cw-s-off", value)  # the instant-off reading of the test post
    page.fill("#cw-s-t", "14")


def stored_count(page):
    return page.evaluate("""() => new Promise((resolve) => {
        const req = indexedDB.open('couplewise-survey');
        req.onsuccess = () => { const tx = req.result.transaction('readings');
          const c = tx.objectStore('readings').count(); c.onsuccess = () => resolve(c.result); };
    })""")


def test_survey_click_then_enter_saves_once_and_the_message_stays_true(browser, served, tmp_path):
    ctx, page, guard = launch(browser, tmp_path / "profile-twice")
    try:
        open_log(page, served.url(SURVEY))
        expect(page.locator(".cw-runtime")).to_have_attribute("data-stage", "ready", timeout=RUNTIME_MS)
        # -0.912 V CSE instant-off on buried steel: protected (ISO 15589-1:2015 Table 1)
        fill_reading(page, "TP 4 " + BIDI + "gate", "\u22120,912")
        page.click("button.cw-add")
        page.wait_for_timeout(150)
        page.keyboard.press("Enter")
        expect(page.locator(".cw-saved")).to_contain_text("Saved:", timeout=RUNTIME_MS)
        page.wait_for_timeout(1500)
        expect(page.locator(".cw-saved")).to_contain_text("Saved:")
        assert page.inner_text(".cw-form-msg").strip() == ""
        assert page.inner_text("#cw-s-loc-msg") == "" and page.inner_text("#cw-s-off-msg") == ""
        assert len(rows(page)) == 1 and stored_count(page) == 1
        # the location in the message: isolated, its override shown, not acting on the message
        saved = page.locator(".cw-saved")
        assert BIDI not in saved.inner_text() and saved.locator("bdi").inner_text() == "TP 4 \\u202Egate"
        assert rows(page)[0]["reading"].startswith("instant-off −0.912 V vs CSE")
        # pressing save again on the emptied form: still one reading, the message still true
        page.locator("#cw-s-loc").press("Enter")
        page.wait_for_timeout(500)
        expect(page.locator(".cw-saved")).to_contain_text("Saved:")
        assert page.inner_text(".cw-form-msg").strip() == "" and len(rows(page)) == 1
        # typing again starts a new reading, checked as usual
        page.fill("#cw-s-off", "1,000")
        page.click("button.cw-add")
        expect(page.locator("#cw-s-off-msg")).to_contain_text("use 1000 or 1.000")
        expect(page.locator(".cw-form-msg")).to_contain_text("Not saved")
        fill_reading(page, "TP 5", "0x10")
        page.click("button.cw-add")
        expect(page.locator("#cw-s-off-msg")).to_contain_text("hexadecimal")
        assert stored_count(page) == 1
        assert guard.console_errors == [], guard.console_errors
    finally:
        ctx.close()
    check(guard)


def _pids_of(profile):
    """The processes of the browser running on this profile (it was started by this test)."""
    flag = f"--user-data-dir={profile}".encode()
    pids = []
    for name in os.listdir("/proc"):
        if name.isdigit():
            try:
                with open(f"/proc/{name}/cmdline", "rb") as fh:
                    if flag in fh.read().split(b"\0"):
                        pids.append(int(name))
            except OSError:
                continue
    return pids


def test_survey_draft_typed_just_before_a_crash_comes_back(browser, served, tmp_path):
    profile = tmp_path / "profile-crash"
    ctx, page, guard = launch(browser, profile)
    try:
        open_log(page, served.url(SURVEY))
        expect(page.locator(".cw-draft-note")).to_contain_text("only once it is saved")
        fill_reading(page, "TP 8, by the culvert", "-0.874")
        page.fill("#cw-s-notes", "typed just before the crash")
        page.wait_for_timeout(1000)  # the draft is written a moment after the last change
        pids = _pids_of(profile)
        assert pids, "the browser of this test was not found"
        for pid in pids:  # the crash: the browser is killed, nothing is shut down in order
            try:
                os.kill(pid, signal.SIGKILL)
            except ProcessLookupError:
                pass
    finally:
        try:
            ctx.close()
        except Exception:  # noqa: BLE001 -- the browser is gone
            pass
    ctx, page, guard = launch(browser, profile)
    try:
        open_log(page, served.url(SURVEY))
        assert page.input_value("#cw-s-loc") == "TP 8, by the culvert"
        assert page.input_value("#cw-s-off") == "-0.874"
        assert page.input_value("#cw-s-notes") == "typed just before the crash"
        expect(page.locator(".cw-log-count")).to_have_text("No readings yet.")
    finally:
        ctx.close()
    check(guard)


CSV_HEAD = ("id;time;location;reading_V;electrode;reading_kind;temp_C;structure;setting;polarisation_mV;"
            "salinity_g_per_kg;verdict;conclusive;verdict_text;notes;data_version;saved_at")


def csv_row(rid, loc, reading, notes=""):
    return ";".join([rid, "2024-05-01T14:30", loc, reading, "CSE", "instant-off", "14", "carbon-steel", "soil-aerobic",
                     "", "", "protected", "true", "as exported", notes, "x", "2024-05-01T12:31:00.000Z"])


def test_survey_csv_import_reads_numbers_by_the_rule_and_round_trips(browser, served, tmp_path):
    ctx, page, guard = launch(browser, tmp_path / "profile-csv")
    try:
        open_log(page, served.url(SURVEY))
        expect(page.locator(".cw-runtime")).to_have_attribute("data-stage", "ready", timeout=RUNTIME_MS)
        # a log re-saved by a spreadsheet with ";" between the cells and decimal commas
        sheet = tmp_path / "resaved.csv"
        sheet.write_text("\ufeff# Couplewise survey log; exported 2024-05-01T12:40:00Z; data version x\r\n" +
                         CSV_HEAD + "\r\n" +
                         csv_row("a1b2c3d4-0001", "TP 1", "\u22120,912", "'=sum(a1)") + "\r\n" +
                         csv_row("a1b2c3d4-0002", "TP 2", "1,000") + "\r\n" +
                         csv_row("a1b2c3d4-0003", "TP 3", "0x10") + "\r\n", encoding="utf-8")
        page.set_input_files("#cw-s-import", str(sheet))
        # a file of the older format (one reading per row): imported and judged again
        expect(page.locator(".cw-tools-msg")).to_contain_text("Imported 1 reading;", timeout=RUNTIME_MS)
        expect(page.locator(".cw-tools-msg")).to_contain_text("2 not valid")
        expect(page.locator("#cw-s-import-msg")).to_contain_text("row 2: reading_V: “1,000” is ambiguous")
        expect(page.locator("#cw-s-import-msg")).to_contain_text("use 1000 or 1.000")
        # judged again here: -0.912 V CSE instant-off on buried steel is protected (ISO 15589-1:2015 Table 1)
        expect(page.locator(".cw-survey-log tbody tr .cw-verdict")).to_have_attribute("data-verdict", "protected",
                                                                                      timeout=RUNTIME_MS)
        first = rows(page)
        assert len(first) == 1 and first[0]["reading"].startswith("instant-off −0.912 V vs CSE") and first[0]["notes"] == "=sum(a1)"
        # the page's own CSV export comes back as the same log
        with page.expect_download() as dl:
            page.click("button.cw-export-csv")
        exported = tmp_path / "log.csv"
        dl.value.save_as(exported)
        page.click("button.cw-clear")
        page.click("button.cw-confirm-yes")
        expect(page.locator(".cw-log-count")).to_have_text("No readings yet.")
        page.set_input_files("#cw-s-import", str(exported))
        expect(page.locator(".cw-tools-msg")).to_contain_text("Imported 1 reading")
        expect(page.locator(".cw-survey-log tbody tr .cw-verdict")).to_have_attribute("data-verdict", "protected",
                                                                                      timeout=RUNTIME_MS)
        assert rows(page) == first
        assert guard.console_errors == [], guard.console_errors
    finally:
        ctx.close()
    check(guard)
