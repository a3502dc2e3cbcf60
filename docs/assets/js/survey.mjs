// Survey log: cathodic-protection readings recorded test post after test post on site, each
// judged as it is entered (entry "cp" of calc) and kept in this browser's IndexedDB.
//
// One record is one test post at one time: the on reading (current flowing) and the instant-off
// reading, either or both, and the native (depolarised) potential when known; calc computes the
// polarisation shift (instant-off minus native) and the IR drop (on minus instant-off). The page
// works in one unit, V or mV, the user's choice; records are stored in V. Times are ISO 8601 with
// the device's offset from UTC.
//
// Rules: a reading is checked first (the form, then calc); only a complete, valid record is
// written; it is shown as saved only after the write has completed (durable transaction). So a
// closed tab, a crash, a reload or a flat battery loses nothing that was shown as saved. Nothing
// leaves the device unless the user exports it (CSV or JSON); either export imports again, also
// the files of the format before (surveyfile.mjs), merged by the records' ids. A second press of
// save on the form just emptied by a save saves nothing. The form's draft (the unit with it) is
// written to IndexedDB a moment after each change.
import {
  AGAGCL_SW, NOT_CONSIDERED, UNIT_OPTIONS, cpResultNodes, electrodeOptions, fillSelect, irOptions, irSubtracts,
  onCriterion, settingOptions, structureOptions, toVolts,
} from "./cpview.mjs";
import { calculate } from "./site.mjs";
import { download, exportCsv, exportJson, parseCsvImport, parseImport, readRecord, stamp } from "./surveyfile.mjs";
import {
  TIME_RE, allRecords, clearRecords, judgementOf, localNow, mergeRecords, newId, openDb, openDraft, putRecord,
  readDraft, recordProblem, requestOf, sortLog, withOffset, withinBound, writeDraft,
} from "./surveylog.mjs";
import { LOG_HEAD, logRow } from "./surveyview.mjs";
import { allowed, begin, echo, field, fieldMap, fieldText, fill, h, hint, isolated, known, numberInput, readNumber, select } from "./ui.mjs";

const DRAFT_DELAY_MS = 300; // the draft is written this long after the last change
const SURVEY_START = { el: "CSE", t: "15", st: "carbon-steel", set: "soil-aerobic", u: "V", ir: NOT_CONSIDERED };
// the potential fields: id, label, draft key
const POTENTIALS = [["on", "On reading", "current flowing"], ["off", "Instant-off reading", "just after the current is interrupted"],
  ["nat", "Native potential", "depolarised (or before CP), optional: for the polarisation shift"]];

export async function survey(root) {
  const { ui, ds, sp } = await begin(root, "Survey log", "survey");
  const bounds = sp.bounds || {};
  const draftDb = await openDraft();
  const draft = await readDraft(draftDb);
  const d = (k, dflt) => (typeof draft[k] === "string" ? draft[k] : dflt);
  const elIds = new Set(ds.reference_electrodes.map((r) => r.id));
  const stOpts = structureOptions(ds);
  const irOpts = irOptions(ds);
  const irNames = Object.fromEntries(irOpts.map((o) => [o.value, o.label]));

  const locField = field("cw-s-loc", "Location", h("input", { type: "text", autocomplete: "off", maxlength: "200", value: d("loc", "") }), "test post, pile or chainage, e.g. TP 14");
  const timeField = field("cw-s-time", "Date and time", h("input", { type: "datetime-local", value: d("time", localNow()) }), "local time, now by default");
  // the time as it will be kept and shown: ISO 8601 with this device's offset from UTC
  const timeIso = h("div", { class: "cw-field-help cw-time-iso", "aria-live": "polite" });
  timeField.control.after(timeIso);
  const showIso = () => { const v = timeField.control.value; timeIso.textContent = v ? "kept as " + withOffset(v) + " (ISO 8601)" : ""; };
  timeField.control.addEventListener("input", showIso);
  timeField.control.addEventListener("change", showIso);
  showIso();
  const unitField = field("cw-s-unit", "Unit of the potentials", select(UNIT_OPTIONS, known(new Set(["V", "mV"]), d("u"), SURVEY_START.u)), "the whole page: readings, shifts, the log");
  const unit = () => unitField.control.value;
  const pot = Object.fromEntries(POTENTIALS.map(([k, label, help]) => [k, field("cw-s-" + k, label, numberInput(d(k, "")), help)]));
  const elField = field("cw-s-el", "Reference electrode", select(electrodeOptions(ds), known(elIds, d("el"), SURVEY_START.el)));
  const tField = field("cw-s-t", "Electrode temperature (°C)", numberInput(d("t", SURVEY_START.t)), hint(sp, "temp_C"));
  const stField = field("cw-s-st", "Structure", select(stOpts, known(new Set(stOpts.map((o) => o.value)), d("st"), SURVEY_START.st)));
  const setField = field("cw-s-set", "Setting", select([], ""));
  fillSelect(setField.control, settingOptions(ds, stField.control.value), d("set", SURVEY_START.set));
  const irField = field("cw-s-ir", "IR drop of the on reading", select(irOpts, known(new Set(irOpts.map((o) => o.value)), d("ir"), SURVEY_START.ir)),
    "with no instant-off reading: how it was considered");
  const irvField = field("cw-s-irv", "IR drop subtracted", numberInput(d("irv", "")), "its size, measured or calculated");
  const sField = field("cw-s-s", "Salinity (g/kg, optional)", numberInput(d("s", "")), "Ag/AgCl seawater electrode in brackish water");
  const notesField = field("cw-s-notes", "Notes", h("textarea", { rows: "2", maxlength: "2000" }), "anything worth keeping: coating, access, weather");
  notesField.control.value = d("notes", "");
  const addBtn = h("button", { type: "submit", class: "md-button md-button--primary cw-touch cw-add", text: "Check and save reading" });
  ui.formBox.append(
    h("div", { class: "cw-row" }, locField.el, timeField.el, unitField.el),
    h("div", { class: "cw-row" }, pot.on.el, pot.off.el, pot.nat.el),
    h("div", { class: "cw-row" }, irField.el, irvField.el),
    h("div", { class: "cw-row" }, elField.el, tField.el, sField.el),
    h("div", { class: "cw-row" }, stField.el, setField.el),
    notesField.el, h("div", { class: "cw-actions-row" }, addBtn),
    h("p", { class: "cw-field-help cw-draft-note", text: "A reading is in the log only once it is saved. Until then the form is kept " +
      "on this device as a draft, written a moment after each change and shown again when the page opens; what was typed in " +
      "the last moment before a crash can be lost." }));
  const saved = h("p", { class: "cw-saved", role: "status", "aria-live": "polite" });
  ui.formMsg.after(saved);

  // the labels carry the unit; a switch converts what is typed
  function relabel() {
    for (const [k, label] of POTENTIALS) pot[k].el.querySelector("label").textContent = label + " (" + unit() + ")";
    irvField.el.querySelector("label").textContent = "IR drop subtracted (" + unit() + ")";
  }
  let lastUnit = unit();
  unitField.control.addEventListener("change", () => {
    const f = unit() === "mV" ? 1000 : 0.001;
    for (const c of [...Object.values(pot), irvField].map((x) => x.control)) {
      const r = readNumber(c, "");
      if (r.value !== undefined && lastUnit !== unit()) c.value = fieldText(Number((r.value * f).toPrecision(12)));
    }
    lastUnit = unit();
    relabel();
    renderLog();
  });
  relabel();
  // the IR-drop choice: an on reading without an instant-off one, where a criterion admits on readings
  function showIr() {
    irField.el.hidden = pot.on.control.value.trim() === "" || pot.off.control.value.trim() !== "" ||
      !onCriterion(ds, stField.control.value, setField.control.value);
    irvField.el.hidden = irField.el.hidden || !irSubtracts(ds, irField.control.value);
    sField.el.hidden = elField.control.value !== AGAGCL_SW;
  }

  // the log and its tools
  const count = h("p", { class: "cw-log-count", "aria-live": "polite" });
  const logBody = h("tbody", {});
  const logTable = h("div", { class: "cw-matrix-wrap" }, h("table", { class: "cw-compare cw-survey-log" },
    h("thead", {}, h("tr", {}, LOG_HEAD.map((t) => h("th", { scope: "col", text: t })))), logBody));
  const exportCsvBtn = h("button", { type: "button", class: "md-button cw-touch cw-export-csv", text: "Export CSV" });
  const exportJsonBtn = h("button", { type: "button", class: "md-button cw-touch cw-export-json", text: "Export JSON" });
  const importInput = h("input", { type: "file", accept: ".json,.csv,application/json,text/csv", class: "cw-import-input" });
  const importField = field("cw-s-import", "Import a log exported as JSON or CSV, this format or the one before (merged: readings " +
    "already here are kept once; readings of a CSV or of the older format are judged again)", importInput);
  const clearBtn = h("button", { type: "button", class: "md-button cw-touch cw-clear", text: "Clear the log…" });
  const confirmBox = h("div", { class: "cw-confirm", role: "alertdialog", "aria-labelledby": "cw-s-confirm-text", hidden: true });
  const toolsMsg = h("p", { class: "cw-tools-msg", role: "status", "aria-live": "polite" });
  const logBox = h("section", { class: "cw-log", "aria-label": "Survey log" },
    h("h2", { text: "Readings on this device" }), count, logTable,
    h("div", { class: "cw-actions-row" }, exportCsvBtn, exportJsonBtn, clearBtn), confirmBox, importField.el, toolsMsg,
    h("p", { class: "cw-privacy", text: "The log is kept only in this browser on this device (IndexedDB). Nothing is sent anywhere; it leaves the device only when you export it." }));
  root.querySelector(".cw-actions").before(logBox);

  let db = null;
  let records = [];
  try {
    db = await openDb();
  } catch (err) {
    addBtn.disabled = true;
    ui.formMsg.textContent = "This browser does not let the page store data here (" + String(err && err.message ? err.message : err) + "), so readings cannot be kept. Use a normal, not a private, window.";
  }
  const channel = "BroadcastChannel" in window ? new BroadcastChannel("couplewise-survey") : null;

  let draftTimer = 0;
  function saveDraft() {
    clearTimeout(draftTimer);
    draftTimer = 0;
    const draftNow = { loc: locField.control.value, time: timeField.control.value, u: unit(), on: pot.on.control.value,
      off: pot.off.control.value, nat: pot.nat.control.value, el: elField.control.value, t: tField.control.value,
      st: stField.control.value, set: setField.control.value, ir: irField.control.value, irv: irvField.control.value,
      s: sField.control.value, notes: notesField.control.value };
    if (draftDb) writeDraft(draftDb, draftNow).catch(() => { /* storage full or refused: the draft is a convenience */ });
  }
  function saveDraftSoon() {
    clearTimeout(draftTimer);
    draftTimer = setTimeout(saveDraft, DRAFT_DELAY_MS);
  }
  // a page put away (tab switched, phone locked, closed) writes its draft at once
  window.addEventListener("pagehide", () => { if (draftTimer) saveDraft(); });
  document.addEventListener("visibilitychange", () => { if (document.hidden && draftTimer) saveDraft(); });

  function renderLog() {
    sortLog(records);
    count.textContent = records.length === 0 ? "No readings yet." : records.length + (records.length === 1 ? " reading" : " readings") + " on this device.";
    logBody.replaceChildren(...records.map((r) => logRow(r, { unit: unit(), dataVersion: ds.version, irNames })));
    exportCsvBtn.disabled = exportJsonBtn.disabled = clearBtn.disabled = records.length === 0;
    logTable.hidden = records.length === 0;
  }

  // the stored records; those of the format before are rewritten in this one (and judged again)
  async function reload() {
    if (!db) return;
    const all = await allRecords(db);
    const good = [];
    for (const raw of all) {
      const { rec, problem, older } = readRecord(raw, bounds);
      if (problem) continue;
      if (older) { try { await putRecord(db, rec); } catch (err) { /* kept as it was; shown anyway */ } }
      good.push(rec);
    }
    records = good;
    if (records.length < all.length) {
      toolsMsg.textContent = (all.length - records.length) + " stored record(s) could not be read and are not shown; they stay stored.";
    }
    renderLog();
  }

  function collect() {
    let bad = false;
    const set = (f, msg) => { f.setError(msg); if (msg) bad = true; };
    showIr();
    const loc = locField.control.value.trim();
    set(locField, loc ? "" : "Enter where the reading was taken (a label of 1 to 200 characters).");
    const time = timeField.control.value;
    set(timeField, time && TIME_RE.test(time) && !Number.isNaN(Date.parse(time)) ? "" : "Enter the date and time of the reading.");
    // a number within the record's bound (the bound is in V or mV, as calc states it), else null
    const num = (f, key, noun, toBound) => {
      if (f.control.value.trim() === "") { f.setError(""); return null; }
      const x = readNumber(f.control, noun + " in " + unit());
      let msg = x.error || "";
      if (!msg && !withinBound(toBound(x.value), bounds[key])) {
        msg = "Out of range: " + allowed(sp, key, noun) + "." + (unit() === "V" && withinBound(x.value / 1000, bounds[key]) ? " Did you mean " + x.value + " mV? Switch the unit to mV." : "");
      }
      set(f, msg);
      return msg ? null : x.value;
    };
    const inV = (x) => (x === null ? null : toVolts(x, unit()));
    const on = inV(num(pot.on, "reading_V", "a reading", (x) => toVolts(x, unit())));
    const off = inV(num(pot.off, "reading_V", "a reading", (x) => toVolts(x, unit())));
    const nat = inV(num(pot.nat, "reading_V", "a potential", (x) => toVolts(x, unit())));
    if (on === null && off === null && !pot.on.msg.textContent && !pot.off.msg.textContent) {
      set(pot.off, "Enter the instant-off reading, the on reading, or both.");
    }
    const temp = num(tField, "temp_C", "a temperature", (x) => x);
    if (tField.control.value.trim() === "") set(tField, "Enter the electrode temperature: " + allowed(sp, "temp_C", "a temperature") + ".");
    const method = irField.el.hidden || irField.control.value === NOT_CONSIDERED ? null : irField.control.value;
    let irSub = null;
    if (!irvField.el.hidden) {
      irSub = inV(num(irvField, "ir_drop_mV", "an IR drop", (x) => toVolts(x, unit()) * 1000));
      if (irSub === null && !irvField.msg.textContent) set(irvField, "Enter the size of the IR drop subtracted.");
    } else irvField.setError("");
    const sal = sField.el.hidden ? (sField.setError(""), null) : num(sField, "salinity", "a salinity", (x) => x);
    set(setField, setField.control.value ? "" : "Choose a setting.");
    const notes = notesField.control.value;
    set(notesField, notes.length <= 2000 ? "" : "Notes: at most 2000 characters.");
    if (bad) return { bad };
    return { bad, rec: {
      id: newId(), location: loc, time: withOffset(time), on_V: on, off_V: off, native_V: nat, electrode: elField.control.value,
      temp_C: temp, structure: stField.control.value, setting: setField.control.value, ir_drop_method: off === null ? method : null,
      ir_subtracted_V: off === null ? irSub : null, polarisation_V: null, salinity: sal, notes, saved_at: "", judgement: null } };
  }

  // calc names the field of the request: reading_V is the instant-off reading when there is one
  const fieldFor = fieldMap({ on_V: pot.on, native_V: pot.nat, polarisation_mV: pot.nat, electrode: elField, temp_C: tField,
    structure: stField, setting: setField, ir_drop_method: irField, ir_drop_mV: irvField, salinity: sField },
  (name) => (name === "reading_V" ? (pot.off.control.value.trim() !== "" ? pot.off : pot.on) : null));

  let busy = false;
  let justSaved = false; // a reading was saved and the form, emptied for the next, not touched since
  async function add() {
    if (busy || !db) return;
    if (justSaved) { locField.control.focus(); return; } // the same press again (a click, then Enter): saved once
    saved.textContent = "";
    ui.formMsg.textContent = "";
    const { bad, rec } = collect();
    if (bad) { ui.formMsg.textContent = "Not saved: correct the fields marked above."; return; }
    busy = true;
    addBtn.disabled = true;
    saved.textContent = "Checking the reading…";
    try {
      const out = await calculate("cp", requestOf(rec, unit()));
      if (out.ok) {
        rec.judgement = judgementOf(out.result, unit());
        fill(ui.result, ...cpResultNodes(out.result, unit()));
      } else if (out.error.field === "runtime") {
        rec.judgement = null; // the reading is valid; it is judged when the runtime can start
        fill(ui.result, h("p", { class: "cw-pending", text: "Saved without a judgement: " + out.error.message }));
      } else {
        const f = fieldFor(out.error.field);
        if (f) f.setError(out.error.message);
        ui.formMsg.textContent = "Not saved: " + (f ? "see the message at the field." : out.error.message);
        saved.textContent = "";
        return;
      }
      rec.saved_at = new Date().toISOString();
      const problem = recordProblem(rec, bounds);
      if (problem) { ui.formMsg.textContent = "Not saved: " + problem; saved.textContent = ""; return; }
      try {
        await putRecord(db, rec);
      } catch (err) {
        ui.formMsg.textContent = "Not saved: the browser refused to store the reading (" + String(err && err.message ? err.message : err) + ").";
        saved.textContent = "";
        return;
      }
      records.push(rec);
      renderLog();
      fill(saved, "Saved: ", isolated(rec.location), ", " + rec.time + ". " + records.length + (records.length === 1 ? " reading" : " readings") + " on this device.");
      if (channel) channel.postMessage({ type: "changed" });
      if (navigator.storage && navigator.storage.persist) navigator.storage.persist().catch(() => {});
      // ready for the next post: same unit, electrode, temperature, structure and setting
      for (const f of [locField, pot.on, pot.off, pot.nat, irvField, notesField]) f.control.value = "";
      timeField.control.value = localNow();
      showIso();
      showIr();
      saveDraft();
      locField.control.focus();
      justSaved = true; // after the focus moved: a change event it causes does not undo it
    } finally {
      busy = false;
      addBtn.disabled = !db;
    }
  }

  ui.formBox.addEventListener("submit", (e) => { e.preventDefault(); add(); });
  ui.formBox.addEventListener("input", () => { justSaved = false; showIr(); saveDraftSoon(); });
  ui.formBox.addEventListener("change", (e) => {
    justSaved = false;
    if (e.target === stField.control) fillSelect(setField.control, settingOptions(ds, stField.control.value), setField.control.value);
    showIr();
    saveDraftSoon();
  });
  showIr();

  const sorted = () => sortLog(records.slice()).reverse();
  exportJsonBtn.addEventListener("click", () => download("couplewise-survey-" + stamp(localNow()) + ".json", "application/json", exportJson(sorted(), ds.version, unit())));
  exportCsvBtn.addEventListener("click", () => download("couplewise-survey-" + stamp(localNow()) + ".csv", "text/csv;charset=utf-8", exportCsv(sorted(), ds.version)));
  importInput.addEventListener("change", async () => {
    const file = importInput.files && importInput.files[0];
    if (!file || !db) return;
    importField.setError("");
    fill(toolsMsg, "Reading ", ...echo(file.name), "…");
    let text;
    try { text = await file.text(); } catch (err) { importField.setError("The file could not be read: " + err.message); toolsMsg.textContent = ""; return; }
    const csv = !text.trimStart().startsWith("{");
    const { records: recs, problems, repeated, older } = csv ? parseCsvImport(text, bounds) : parseImport(text, bounds);
    if (!recs.length) {
      importField.setError("Nothing imported: " + (problems[0] || "the file holds no readings") + ".");
      toolsMsg.textContent = "";
      importInput.value = "";
      return;
    }
    try {
      const merged = await mergeRecords(db, recs);
      const added = merged.added, present = merged.present + repeated;
      const olderAdded = [...merged.ids].filter((id) => older && older.has(id)).length;
      await reload();
      toolsMsg.textContent = "Imported " + added + (added === 1 ? " reading" : " readings") + (present ? "; " + present + " already in the log were kept once" : "") +
        (olderAdded ? "; " + olderAdded + " from the older format, judged again" : "") +
        (problems.length ? "; " + problems.length + " not valid and left out (first: " + problems[0] + ")" : "") + ".";
      if (problems.length) importField.setError(problems.length + " record(s) left out: " + problems[0]);
      if (channel) channel.postMessage({ type: "changed" });
      await judgeUnjudged();
    } catch (err) {
      importField.setError("Nothing imported: the browser refused to store the readings (" + err.message + ").");
      toolsMsg.textContent = "";
    }
    importInput.value = "";
  });

  clearBtn.addEventListener("click", () => {
    const n = records.length;
    const yes = h("button", { type: "button", class: "md-button md-button--primary cw-touch cw-confirm-yes", text: "Delete all " + n + (n === 1 ? " reading" : " readings") });
    const no = h("button", { type: "button", class: "md-button cw-touch cw-confirm-no", text: "Keep the log" });
    confirmBox.replaceChildren(h("p", { id: "cw-s-confirm-text", text: "Delete every reading of this log from this device? This cannot be undone: export the log first if you need it." }), yes, no);
    confirmBox.hidden = false;
    clearBtn.disabled = true;
    no.focus();
    no.addEventListener("click", () => { confirmBox.hidden = true; confirmBox.replaceChildren(); clearBtn.disabled = records.length === 0; clearBtn.focus(); });
    yes.addEventListener("click", async () => {
      yes.disabled = true;
      try {
        await clearRecords(db);
        records = [];
        renderLog();
        toolsMsg.textContent = "The log was cleared: " + n + (n === 1 ? " reading" : " readings") + " deleted.";
        if (channel) channel.postMessage({ type: "changed" });
      } catch (err) {
        toolsMsg.textContent = "The log was not cleared: " + err.message;
      }
      confirmBox.hidden = true;
      confirmBox.replaceChildren();
    });
  });

  if (channel) channel.onmessage = () => { reload(); };
  await reload();
  if (!records.length) fill(ui.result, h("p", { class: "cw-pending", text: "Each reading is judged here as it is saved." }));
  else fill(ui.result, h("p", { class: "cw-pending", text: "The latest reading's judgement is in the log below; add the next reading above." }));

  await judgeUnjudged();

  // readings saved while the runtime could not start, imported from a CSV or from the older
  // format: judge them now, in the page's unit
  async function judgeUnjudged() {
    for (const r of records.filter((x) => x.judgement === null)) {
      const out = await calculate("cp", requestOf(r, unit()));
      if (!out.ok) break;
      r.judgement = judgementOf(out.result, unit());
      try { await putRecord(db, r); } catch (err) { break; }
      renderLog();
    }
  }
}
