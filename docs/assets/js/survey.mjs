// Survey log: cathodic-protection readings recorded one after another on site, each judged as
// it is entered (entry "cp" of calc) and kept in this browser's IndexedDB.
//
// Rules: a reading is checked first (the form, then calc); only a complete, valid reading is
// written; it is shown as saved only after the write has completed (durable transaction). So a
// closed tab, a crash, a reload or a flat battery loses nothing that was shown as saved. Nothing
// leaves the device unless the user exports it (CSV or JSON); either export can be imported
// again (merged by the readings' ids, so nothing is doubled; a CSV's readings are judged again).
//
// A number field is refused here when it is not a number by the one rule (ui.mjs readNumber),
// or when it lies outside calc's bound (spec.json), which is the check every record of the log
// passes (recordProblem), imported too; calc then judges the reading, and its refusal is shown
// at the field it names. A second press of save on the form just emptied by a save (a click,
// then Enter) saves nothing and leaves the message of the save standing. The form's draft is
// written to IndexedDB a moment after each change, and the page says what a draft keeps.
import { calculate } from "./site.mjs";
import {
  AGAGCL_SW, KIND_OPTIONS, SETTING_NAMES, STRUCTURE_NAMES, cpBadge, cpResultNodes, electrodeOptions, fillSelect,
  settingOptions, structureOptions,
} from "./field.mjs";
import {
  TIME_RE, allRecords, clearRecords, download, exportCsv, exportJson, judgementOf, localNow, mergeRecords, newId, openDb,
  openDraft, parseCsvImport, parseImport, putRecord, readDraft, recordProblem, requestOf, sortLog, stamp, withinBound, writeDraft,
} from "./surveylog.mjs";
import {
  allowed, begin, echo, field, fieldMap, fill, h, hint, isolated, known, numberInput, readNumber, select, signed,
} from "./ui.mjs";

const DRAFT_DELAY_MS = 300; // the draft is written this long after the last change

const SURVEY_START = { el: "CSE", t: "15", st: "carbon-steel", set: "soil-aerobic", k: "instant-off" };

export async function survey(root) {
  const { ui, ds, sp } = await begin(root, "Survey log", "survey");
  const bounds = sp.bounds || {};
  const draftDb = await openDraft();
  const draft = await readDraft(draftDb);
  const d = (k, dflt) => (typeof draft[k] === "string" ? draft[k] : dflt);
  const elIds = new Set(ds.reference_electrodes.map((r) => r.id));
  const stOpts = structureOptions(ds);

  const locField = field("cw-s-loc", "Location", h("input", { type: "text", autocomplete: "off", maxlength: "200", value: d("loc", "") }), "test post, pile or chainage, e.g. TP 14");
  const timeField = field("cw-s-time", "Time", h("input", { type: "datetime-local", value: d("time", localNow()) }), "local time; now by default");
  const vField = field("cw-s-v", "Reading (V)", numberInput(d("v", "")), "as read on the meter, e.g. −0.912");
  const elField = field("cw-s-el", "Reference electrode", select(electrodeOptions(ds), known(elIds, d("el"), SURVEY_START.el)));
  const kField = field("cw-s-k", "Reading taken", select(KIND_OPTIONS, d("k", SURVEY_START.k)));
  const tField = field("cw-s-t", "Electrode temperature (°C)", numberInput(d("t", SURVEY_START.t)), hint(sp, "temp_C"));
  const stField = field("cw-s-st", "Structure", select(stOpts, known(new Set(stOpts.map((o) => o.value)), d("st"), SURVEY_START.st)));
  const setField = field("cw-s-set", "Setting", select([], ""));
  fillSelect(setField.control, settingOptions(ds, stField.control.value), d("set", SURVEY_START.set));
  const pField = field("cw-s-p", "Polarisation shift (mV, optional)", numberInput(d("p", "")), "for the 100 mV criterion");
  const sField = field("cw-s-s", "Salinity (g/kg, optional)", numberInput(d("s", "")), "Ag/AgCl seawater electrode in brackish water");
  const notesField = field("cw-s-notes", "Notes", h("textarea", { rows: "2", maxlength: "2000" }), "anything worth keeping: coating, access, weather");
  notesField.control.value = d("notes", "");
  const addBtn = h("button", { type: "submit", class: "md-button md-button--primary cw-touch cw-add", text: "Check and save reading" });
  ui.formBox.append(
    h("div", { class: "cw-row" }, locField.el, timeField.el),
    h("div", { class: "cw-row" }, vField.el, elField.el, kField.el),
    h("div", { class: "cw-row" }, tField.el, stField.el, setField.el),
    h("div", { class: "cw-row" }, pField.el, sField.el),
    notesField.el, h("div", { class: "cw-actions-row" }, addBtn),
    h("p", { class: "cw-field-help cw-draft-note", text: "A reading is in the log only once it is saved. Until then the form is kept " +
      "on this device as a draft, written a moment after each change and shown again when the page opens; what was typed in " +
      "the last moment before a crash can be lost." }));
  const saved = h("p", { class: "cw-saved", role: "status", "aria-live": "polite" });
  ui.formMsg.after(saved);

  // the log and its tools
  const count = h("p", { class: "cw-log-count", "aria-live": "polite" });
  const logBody = h("tbody", {});
  const logTable = h("div", { class: "cw-matrix-wrap" }, h("table", { class: "cw-compare cw-survey-log" },
    h("thead", {}, h("tr", {}, ["Time", "Location", "Reading", "Structure and setting", "Verdict", "Notes"].map((t) => h("th", { scope: "col", text: t })))), logBody));
  const exportCsvBtn = h("button", { type: "button", class: "md-button cw-touch cw-export-csv", text: "Export CSV" });
  const exportJsonBtn = h("button", { type: "button", class: "md-button cw-touch cw-export-json", text: "Export JSON" });
  const importInput = h("input", { type: "file", accept: ".json,.csv,application/json,text/csv", class: "cw-import-input" });
  const importField = field("cw-s-import", "Import a log exported as JSON or CSV (merged: readings already here are kept once; " +
    "the readings of a CSV are judged again)", importInput);
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
    const draftNow = { loc: locField.control.value, time: timeField.control.value, v: vField.control.value, el: elField.control.value,
      k: kField.control.value, t: tField.control.value, st: stField.control.value, set: setField.control.value, p: pField.control.value,
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

  function verdictCell(r) {
    const j = r.judgement;
    if (!j) return h("td", {}, h("span", { class: "cw-badge", text: "not judged yet" }));
    const det = h("details", { class: "cw-log-verdict" }, h("summary", {}, cpBadge(j.verdict, j.conclusive)),
      h("p", { text: j.text }),
      j.warnings.length ? h("ul", {}, j.warnings.map((w) => h("li", { text: w }))) : null,
      h("p", { class: "cw-data-tag", text: "judged with data version " + j.data_version + (j.data_version !== ds.version ? " (not the current one)" : "") }));
    return h("td", {}, det);
  }

  function renderLog() {
    sortLog(records);
    count.textContent = records.length === 0 ? "No readings yet." : records.length + (records.length === 1 ? " reading" : " readings") + " on this device.";
    logBody.replaceChildren(...records.map((r) => h("tr", { "data-id": r.id },
      h("td", { text: r.time.replace("T", " ") }),
      h("td", { class: "cw-log-location", text: r.location }),
      h("td", { text: signed(r.reading_V, 3) + " V vs " + r.electrode + " (" + r.reading_kind + ", " + r.temp_C + " °C)" + (r.polarisation_mV !== null ? "; polarisation " + r.polarisation_mV + " mV" : "") }),
      h("td", { text: (STRUCTURE_NAMES[r.structure] || r.structure).split(" (")[0] + "; " + (SETTING_NAMES[r.setting] || r.setting) }),
      verdictCell(r),
      h("td", { class: "cw-log-notes", text: r.notes }))));
    exportCsvBtn.disabled = exportJsonBtn.disabled = clearBtn.disabled = records.length === 0;
    logTable.hidden = records.length === 0;
  }

  async function reload() {
    if (!db) return;
    const all = await allRecords(db);
    records = all.filter((r) => recordProblem(r, bounds) === null);
    if (records.length < all.length) {
      toolsMsg.textContent = (all.length - records.length) + " stored record(s) could not be read and are not shown; they stay stored.";
    }
    renderLog();
  }

  function collect() {
    let bad = false;
    const set = (f, msg) => { f.setError(msg); if (msg) bad = true; };
    const loc = locField.control.value.trim();
    set(locField, loc ? "" : "Enter where the reading was taken (a label of 1 to 200 characters).");
    const time = timeField.control.value;
    set(timeField, time && TIME_RE.test(time) && !Number.isNaN(Date.parse(time)) ? "" : "Enter the date and time of the reading.");
    // a number within the record's bound, else null (with the message at the field)
    const num = (f, key, noun) => {
      const x = readNumber(f.control, allowed(sp, key, noun));
      const msg = x.error || (withinBound(x.value, bounds[key]) ? "" : "Out of range: " + allowed(sp, key, noun) + ".");
      set(f, msg);
      return msg ? null : x.value;
    };
    const reading = num(vField, "reading_V", "a reading in volts");
    const temp = num(tField, "temp_C", "a temperature");
    let pol = null;
    if (pField.control.value.trim() !== "") pol = num(pField, "polarisation_mV", "a shift in mV");
    else pField.setError("");
    let sal = null;
    sField.el.hidden = elField.control.value !== AGAGCL_SW;
    if (!sField.el.hidden && sField.control.value.trim() !== "") sal = num(sField, "salinity", "a salinity");
    else sField.setError("");
    set(setField, setField.control.value ? "" : "Choose a setting.");
    const notes = notesField.control.value;
    set(notesField, notes.length <= 2000 ? "" : "Notes: at most 2000 characters.");
    if (bad) return { bad };
    return { bad, rec: {
      id: newId(), location: loc, time, reading_V: reading, electrode: elField.control.value, temp_C: temp,
      structure: stField.control.value, setting: setField.control.value, reading_kind: kField.control.value,
      polarisation_mV: pol, salinity: sal, notes, saved_at: "", judgement: null } };
  }

  const fieldFor = fieldMap({ reading_V: vField, electrode: elField, temp_C: tField, structure: stField, setting: setField,
    reading_kind: kField, polarisation_mV: pField, salinity: sField });

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
      const out = await calculate("cp", requestOf(rec));
      if (out.ok) {
        rec.judgement = judgementOf(out.result);
        fill(ui.result, ...cpResultNodes(out.result));
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
      fill(saved, "Saved: ", isolated(rec.location), ", " + signed(rec.reading_V, 3) + " V vs " + rec.electrode + ". " + records.length + (records.length === 1 ? " reading" : " readings") + " on this device.");
      if (channel) channel.postMessage({ type: "changed" });
      if (navigator.storage && navigator.storage.persist) navigator.storage.persist().catch(() => {});
      // ready for the next reading: same electrode, temperature, structure and setting
      locField.control.value = ""; vField.control.value = ""; pField.control.value = ""; notesField.control.value = "";
      timeField.control.value = localNow();
      saveDraft();
      locField.control.focus();
      justSaved = true; // after the focus moved: a change event it causes does not undo it
    } finally {
      busy = false;
      addBtn.disabled = !db;
    }
  }

  ui.formBox.addEventListener("submit", (e) => { e.preventDefault(); add(); });
  ui.formBox.addEventListener("input", () => { justSaved = false; saveDraftSoon(); });
  ui.formBox.addEventListener("change", (e) => {
    justSaved = false;
    if (e.target === stField.control) fillSelect(setField.control, settingOptions(ds, stField.control.value), setField.control.value);
    sField.el.hidden = elField.control.value !== AGAGCL_SW;
    saveDraftSoon();
  });
  sField.el.hidden = elField.control.value !== AGAGCL_SW;

  exportJsonBtn.addEventListener("click", () => download("couplewise-survey-" + stamp() + ".json", "application/json", exportJson(sortLog(records.slice()).reverse(), ds.version)));
  exportCsvBtn.addEventListener("click", () => download("couplewise-survey-" + stamp() + ".csv", "text/csv;charset=utf-8", exportCsv(sortLog(records.slice()).reverse(), ds.version)));
  importInput.addEventListener("change", async () => {
    const file = importInput.files && importInput.files[0];
    if (!file || !db) return;
    importField.setError("");
    fill(toolsMsg, "Reading ", ...echo(file.name), "…");
    let text;
    try { text = await file.text(); } catch (err) { importField.setError("The file could not be read: " + err.message); toolsMsg.textContent = ""; return; }
    const csv = !text.trimStart().startsWith("{");
    const { records: recs, problems, repeated } = csv ? parseCsvImport(text, bounds) : parseImport(text, bounds);
    if (!recs.length) {
      importField.setError("Nothing imported: " + (problems[0] || "the file holds no readings") + ".");
      toolsMsg.textContent = "";
      importInput.value = "";
      return;
    }
    try {
      const merged = await mergeRecords(db, recs);
      const added = merged.added, present = merged.present + repeated;
      await reload();
      toolsMsg.textContent = "Imported " + added + (added === 1 ? " reading" : " readings") + (present ? "; " + present + " already in the log were kept once" : "") +
        (problems.length ? "; " + problems.length + " not valid and left out (first: " + problems[0] + ")" : "") + ".";
      if (problems.length) importField.setError(problems.length + " record(s) left out: " + problems[0]);
      if (channel) channel.postMessage({ type: "changed" });
      if (csv) await judgeUnjudged();
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

  // readings saved while the runtime could not start, or imported from a CSV: judge them now
  async function judgeUnjudged() {
    for (const r of records.filter((x) => x.judgement === null)) {
      const out = await calculate("cp", requestOf(r));
      if (!out.ok) break;
      r.judgement = judgementOf(out.result);
      try { await putRecord(db, r); } catch (err) { break; }
      renderLog();
    }
  }
}
