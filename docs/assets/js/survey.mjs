// Survey log: cathodic-protection readings recorded one after another on site, each judged as
// it is entered (entry "cp" of calc) and kept in this browser's IndexedDB.
//
// Rules: a reading is checked first (the form, then calc); only a complete, valid reading is
// written; it is shown as saved only after the write has completed (durable transaction). So a
// closed tab, a crash, a reload or a flat battery loses nothing that was shown as saved. Nothing
// leaves the device unless the user exports it (CSV or JSON); a JSON export can be imported
// again (merged by the readings' ids, so nothing is doubled).
//
// Imported by calculators.mjs (circular import): bindings from calculators.mjs and field.mjs
// are used only inside functions.
import { calculate, dataset, h } from "./couplewise.mjs";
import { field, fill, frame, numberInput, readNumber, select, signed } from "./calculators.mjs";
import {
  AGAGCL_SW, KIND_OPTIONS, SETTING_NAMES, STRUCTURE_NAMES, cpBadge, cpResultNodes, electrodeOptions, fillSelect,
  settingOptions, structureOptions,
} from "./field.mjs";

export const DB_NAME = "couplewise-survey";
export const STORE = "readings";
const DB_VERSION = 1;
export const FORMAT = "couplewise-survey-log";
export const FORMAT_VERSION = 1;
const DRAFT_KEY = "couplewise-survey-draft";
const VERDICTS = ["protected", "not protected", "over-protected"];
const UNITS = {
  reading_V: "V, against the electrode named in the record",
  temp_C: "°C (electrode temperature)",
  polarisation_mV: "mV",
  salinity: "g/kg",
  time: "local date and time as entered (ISO 8601, no time zone)",
  saved_at: "UTC (ISO 8601)",
};

// ---------------------------------------------------------------------------------------
// Storage

export function openDb() {
  return new Promise((resolve, reject) => {
    let req;
    try { req = indexedDB.open(DB_NAME, DB_VERSION); } catch (err) { reject(err); return; }
    req.onupgradeneeded = () => {
      const db = req.result;
      if (!db.objectStoreNames.contains(STORE)) db.createObjectStore(STORE, { keyPath: "id" });
    };
    req.onsuccess = () => {
      const db = req.result;
      db.onversionchange = () => db.close();
      resolve(db);
    };
    req.onerror = () => reject(req.error);
    req.onblocked = () => reject(new Error("the log is open in an older version of this page in another tab"));
  });
}

// One transaction; resolves when it has completed (committed), rejects when it fails.
function transact(db, mode, work) {
  return new Promise((resolve, reject) => {
    let tx;
    try { tx = db.transaction(STORE, mode, { durability: "strict" }); } catch (err) { reject(err); return; }
    let value;
    tx.oncomplete = () => resolve(value);
    tx.onerror = () => reject(tx.error);
    tx.onabort = () => reject(tx.error || new Error("the write was aborted"));
    try { work(tx.objectStore(STORE), (v) => { value = v; }); } catch (err) { tx.abort(); reject(err); }
  });
}

export function putRecord(db, rec) { return transact(db, "readwrite", (st) => st.put(rec)); }
export function allRecords(db) {
  return transact(db, "readonly", (st, done) => { const r = st.getAll(); r.onsuccess = () => done(r.result); });
}
export function clearRecords(db) { return transact(db, "readwrite", (st) => st.clear()); }

// Add the records whose ids are not stored yet; resolves to {added, present}.
export function mergeRecords(db, recs) {
  return transact(db, "readwrite", (st, done) => {
    const counts = { added: 0, present: 0 };
    done(counts);
    for (const rec of recs) {
      const g = st.get(rec.id);
      g.onsuccess = () => {
        if (g.result) counts.present++;
        else { st.add(rec); counts.added++; }
      };
    }
  });
}

export function newId() {
  if (crypto.randomUUID) return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16)); // insecure contexts (plain-HTTP intranet) lack randomUUID
  b[6] = (b[6] & 0x0f) | 0x40; b[8] = (b[8] & 0x3f) | 0x80;
  const x = [...b].map((v) => v.toString(16).padStart(2, "0")).join("");
  return x.slice(0, 8) + "-" + x.slice(8, 12) + "-" + x.slice(12, 16) + "-" + x.slice(16, 20) + "-" + x.slice(20);
}

export function localNow() {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
}

// ---------------------------------------------------------------------------------------
// Records: what one reading holds, and the check every stored or imported record passes.

const TIME_RE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?$/;
const ID_RE = /^[A-Za-z0-9-]{8,64}$/;
const isNum = (x) => typeof x === "number" && Number.isFinite(x);
const isText = (x, max, empty = false) => typeof x === "string" && x.length <= max && (empty || x.trim() !== "");

// Returns null for a valid record, else the first problem in words.
export function recordProblem(r) {
  if (!r || typeof r !== "object" || Array.isArray(r)) return "not a record";
  if (!isText(r.id, 64) || !ID_RE.test(r.id)) return "id: expected 8 to 64 letters, digits or hyphens";
  if (!isText(r.location, 200)) return "location: expected a label of 1 to 200 characters";
  if (!isText(r.time, 40) || !TIME_RE.test(r.time) || Number.isNaN(Date.parse(r.time))) return "time: expected a date and time such as 2024-05-01T14:30";
  if (!isNum(r.reading_V) || Math.abs(r.reading_V) > 10) return "reading_V: expected a number from −10 to +10";
  if (!isText(r.electrode, 80)) return "electrode: expected an electrode id";
  if (!isNum(r.temp_C) || r.temp_C < 0 || r.temp_C > 100) return "temp_C: expected 0 to 100";
  if (!isText(r.structure, 80) || !isText(r.setting, 80)) return "structure and setting: expected ids";
  if (r.reading_kind !== "on" && r.reading_kind !== "instant-off") return "reading_kind: expected on or instant-off";
  if (r.polarisation_mV !== null && (!isNum(r.polarisation_mV) || r.polarisation_mV < 0 || r.polarisation_mV > 2000)) return "polarisation_mV: expected 0 to 2000 or null";
  if (r.salinity !== null && (!isNum(r.salinity) || r.salinity <= 0 || r.salinity > 45)) return "salinity: expected above 0 up to 45, or null";
  if (!isText(r.notes, 2000, true)) return "notes: expected text of at most 2000 characters";
  if (!isText(r.saved_at, 40) || Number.isNaN(Date.parse(r.saved_at))) return "saved_at: expected a date";
  const j = r.judgement;
  if (j !== null) {
    if (!j || typeof j !== "object") return "judgement: expected an object or null";
    if (!VERDICTS.includes(j.verdict) || typeof j.conclusive !== "boolean" || !isText(j.text, 5000) || !isText(j.label, 200) || !isText(j.data_version, 64)) return "judgement: incomplete";
    if (!Array.isArray(j.criteria) || !Array.isArray(j.warnings)) return "judgement: incomplete";
  }
  const known = new Set(["id", "location", "time", "reading_V", "electrode", "temp_C", "structure", "setting", "reading_kind",
    "polarisation_mV", "salinity", "notes", "saved_at", "judgement"]);
  for (const k of Object.keys(r)) if (!known.has(k)) return "unknown field " + k;
  return null;
}

export function requestOf(rec) {
  const req = { structure: rec.structure, setting: rec.setting, reading_V: rec.reading_V, electrode: rec.electrode,
    temp_C: rec.temp_C, reading_kind: rec.reading_kind };
  if (rec.polarisation_mV !== null) req.polarisation_mV = rec.polarisation_mV;
  if (rec.salinity !== null) req.salinity = rec.salinity;
  return req;
}

// The part of a calc result kept with the reading (the derivation is re-made on demand).
export function judgementOf(r) {
  return {
    verdict: r.verdict, conclusive: r.conclusive, label: r.verdict_label, text: r.verdict_text,
    criteria: (r.criteria || []).filter((c) => c.role !== "not checked").map((c) => ({
      id: c.id, name: c.name, standard: c.standard, clause: c.clause, role: c.role,
      value: c.role === "polarisation" ? c.value_mV : c.value_V, electrode: c.electrode || null,
      result: c.role === "limit" ? (c.exceeded ? "beyond" : "within") : (c.met === null || c.met === undefined ? "not checked" : (c.met ? "met" : "not met")),
    })),
    warnings: (r.warnings || []).map((w) => w.message),
    data_version: r.data_version,
  };
}

function sortLog(recs) {
  return recs.sort((a, b) => (b.saved_at > a.saved_at ? 1 : b.saved_at < a.saved_at ? -1 : (b.id > a.id ? 1 : -1)));
}

// ---------------------------------------------------------------------------------------
// Export

export function exportJson(recs, dataVersion) {
  return JSON.stringify({
    format: FORMAT, format_version: FORMAT_VERSION, exported_at: new Date().toISOString(),
    data_version: dataVersion, units: UNITS, count: recs.length, records: recs,
  }, null, 1);
}

function csvCell(v, text) {
  if (v === null || v === undefined) return "";
  let s = String(v);
  if (text && /^[=+\-@\t\r]/.test(s)) s = "'" + s; // a spreadsheet must not read a note as a formula
  return /[",\r\n]/.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s;
}

export function exportCsv(recs, dataVersion) {
  const head = ["id", "time", "location", "reading_V", "electrode", "reading_kind", "temp_C", "structure", "setting",
    "polarisation_mV", "salinity_g_per_kg", "verdict", "conclusive", "verdict_text", "notes", "data_version", "saved_at"];
  const lines = [
    "# Couplewise survey log; exported " + new Date().toISOString() + "; data version " + dataVersion,
    "# units: reading_V in V against the electrode of the row; temp_C in °C (electrode); polarisation_mV in mV; salinity in g/kg; time local as entered; saved_at UTC",
    head.join(","),
  ];
  for (const r of recs) {
    const j = r.judgement;
    lines.push([
      csvCell(r.id), csvCell(r.time), csvCell(r.location, true), csvCell(r.reading_V), csvCell(r.electrode, true),
      csvCell(r.reading_kind), csvCell(r.temp_C), csvCell(r.structure), csvCell(r.setting), csvCell(r.polarisation_mV),
      csvCell(r.salinity), csvCell(j ? j.verdict : "not judged"), csvCell(j ? j.conclusive : ""), csvCell(j ? j.text : "", true),
      csvCell(r.notes, true), csvCell(j ? j.data_version : ""), csvCell(r.saved_at),
    ].join(","));
  }
  return lines.join("\r\n") + "\r\n";
}

// Parse an exported JSON log: {records, problems} (records valid, problems in words).
export function parseImport(text) {
  let doc;
  try { doc = JSON.parse(text); } catch (err) { return { records: [], problems: ["the file is not JSON: " + err.message] }; }
  if (!doc || doc.format !== FORMAT || !Array.isArray(doc.records)) {
    return { records: [], problems: ["the file is not a Couplewise survey log (format " + FORMAT + ")"] };
  }
  if (doc.format_version !== FORMAT_VERSION) return { records: [], problems: ["format version " + doc.format_version + " is not " + FORMAT_VERSION] };
  const records = [], problems = [], seen = new Set();
  let repeated = 0;
  doc.records.forEach((r, i) => {
    const p = recordProblem(r);
    if (p) problems.push("record " + (i + 1) + ": " + p);
    else if (seen.has(r.id)) repeated++; // the same reading twice in one file: kept once
    else { seen.add(r.id); records.push(r); }
  });
  return { records, problems, repeated };
}

function download(name, type, text) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = h("a", { href: url, download: name, class: "cw-hidden-link" });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

function stamp() { return localNow().replace(/[-:]/g, "").replace("T", "-"); }

// ---------------------------------------------------------------------------------------
// The page

const SURVEY_START = { el: "CSE", t: "15", st: "carbon-steel", set: "soil-aerobic", k: "instant-off" };

async function surveyCalc(root) {
  const ui = frame(root, "Survey log");
  const ds = await dataset();
  let draft = {};
  try { draft = JSON.parse(localStorage.getItem(DRAFT_KEY) || "{}") || {}; } catch (err) { draft = {}; }
  const d = (k, dflt) => (typeof draft[k] === "string" ? draft[k] : dflt);
  const elIds = new Set(ds.reference_electrodes.map((r) => r.id));
  const stOpts = structureOptions(ds);

  const locField = field("cw-s-loc", "Location", h("input", { type: "text", autocomplete: "off", maxlength: "200", value: d("loc", "") }), "test post, pile or chainage, e.g. TP 14");
  const timeField = field("cw-s-time", "Time", h("input", { type: "datetime-local", value: d("time", localNow()) }), "local time; now by default");
  const vField = field("cw-s-v", "Reading (V)", numberInput(d("v", "")), "as read on the meter, e.g. −0.912");
  const elField = field("cw-s-el", "Reference electrode", select(electrodeOptions(ds), elIds.has(d("el")) ? d("el") : SURVEY_START.el));
  const kField = field("cw-s-k", "Reading taken", select(KIND_OPTIONS, d("k", SURVEY_START.k)));
  const tField = field("cw-s-t", "Electrode temperature (°C)", numberInput(d("t", SURVEY_START.t)), "0 to 100 °C");
  const stField = field("cw-s-st", "Structure", select(stOpts, stOpts.some((o) => o.value === d("st")) ? d("st") : SURVEY_START.st));
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
    notesField.el, h("div", { class: "cw-actions-row" }, addBtn));
  const saved = h("p", { class: "cw-saved", role: "status", "aria-live": "polite" });
  ui.formMsg.after(saved);

  // the log and its tools
  const count = h("p", { class: "cw-log-count", "aria-live": "polite" });
  const logBody = h("tbody", {});
  const logTable = h("div", { class: "cw-matrix-wrap" }, h("table", { class: "cw-compare cw-survey-log" },
    h("thead", {}, h("tr", {}, ["Time", "Location", "Reading", "Structure and setting", "Verdict", "Notes"].map((t) => h("th", { scope: "col", text: t })))), logBody));
  const exportCsvBtn = h("button", { type: "button", class: "md-button cw-touch cw-export-csv", text: "Export CSV" });
  const exportJsonBtn = h("button", { type: "button", class: "md-button cw-touch cw-export-json", text: "Export JSON" });
  const importInput = h("input", { type: "file", accept: ".json,application/json", class: "cw-import-input" });
  const importField = field("cw-s-import", "Import a log exported as JSON (merged: readings already here are kept once)", importInput);
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

  function saveDraft() {
    const draftNow = { loc: locField.control.value, time: timeField.control.value, v: vField.control.value, el: elField.control.value,
      k: kField.control.value, t: tField.control.value, st: stField.control.value, set: setField.control.value, p: pField.control.value,
      s: sField.control.value, notes: notesField.control.value };
    try { localStorage.setItem(DRAFT_KEY, JSON.stringify(draftNow)); } catch (err) { /* storage full or refused: the draft is a convenience */ }
  }

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
    records = all.filter((r) => recordProblem(r) === null);
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
    const v = readNumber(vField.control, { min: -10, max: 10, allowed: "a reading from −10 to +10 V" });
    set(vField, v.error);
    const t = readNumber(tField.control, { min: 0, max: 100, allowed: "a temperature from 0 to 100 °C" });
    set(tField, t.error);
    let pol = null;
    if (pField.control.value.trim() !== "") {
      const p = readNumber(pField.control, { min: 0, max: 2000, allowed: "a shift from 0 to 2000 mV, or empty" });
      set(pField, p.error); pol = p.error ? null : p.value;
    } else pField.setError("");
    let sal = null;
    sField.el.hidden = elField.control.value !== AGAGCL_SW;
    if (!sField.el.hidden && sField.control.value.trim() !== "") {
      const s = readNumber(sField.control, { positive: true, max: 45, allowed: "a salinity above 0 and up to 45 g/kg, or empty" });
      set(sField, s.error); sal = s.error ? null : s.value;
    } else sField.setError("");
    set(setField, setField.control.value ? "" : "Choose a setting.");
    const notes = notesField.control.value;
    set(notesField, notes.length <= 2000 ? "" : "Notes: at most 2000 characters.");
    if (bad) return { bad };
    return { bad, rec: {
      id: newId(), location: loc, time, reading_V: v.value, electrode: elField.control.value, temp_C: t.value,
      structure: stField.control.value, setting: setField.control.value, reading_kind: kField.control.value,
      polarisation_mV: pol, salinity: sal, notes, saved_at: "", judgement: null } };
  }

  function fieldFor(name) {
    return { reading_V: vField, electrode: elField, temp_C: tField, structure: stField, setting: setField, reading_kind: kField,
      polarisation_mV: pField, salinity: sField }[name] || null;
  }

  let busy = false;
  async function add() {
    if (busy || !db) return;
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
      const problem = recordProblem(rec);
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
      saved.textContent = "Saved: " + rec.location + ", " + signed(rec.reading_V, 3) + " V vs " + rec.electrode + ". " + records.length + (records.length === 1 ? " reading" : " readings") + " on this device.";
      if (channel) channel.postMessage({ type: "changed" });
      if (navigator.storage && navigator.storage.persist) navigator.storage.persist().catch(() => {});
      // ready for the next reading: same electrode, temperature, structure and setting
      locField.control.value = ""; vField.control.value = ""; pField.control.value = ""; notesField.control.value = "";
      timeField.control.value = localNow();
      saveDraft();
      locField.control.focus();
    } finally {
      busy = false;
      addBtn.disabled = !db;
    }
  }

  ui.formBox.addEventListener("submit", (e) => { e.preventDefault(); add(); });
  ui.formBox.addEventListener("input", saveDraft);
  ui.formBox.addEventListener("change", (e) => {
    if (e.target === stField.control) fillSelect(setField.control, settingOptions(ds, stField.control.value), setField.control.value);
    sField.el.hidden = elField.control.value !== AGAGCL_SW;
    saveDraft();
  });
  sField.el.hidden = elField.control.value !== AGAGCL_SW;

  exportJsonBtn.addEventListener("click", () => download("couplewise-survey-" + stamp() + ".json", "application/json", exportJson(sortLog(records.slice()).reverse(), ds.version)));
  exportCsvBtn.addEventListener("click", () => download("couplewise-survey-" + stamp() + ".csv", "text/csv;charset=utf-8", exportCsv(sortLog(records.slice()).reverse(), ds.version)));
  importInput.addEventListener("change", async () => {
    const file = importInput.files && importInput.files[0];
    if (!file || !db) return;
    importField.setError("");
    toolsMsg.textContent = "Reading " + file.name + "…";
    let text;
    try { text = await file.text(); } catch (err) { importField.setError("The file could not be read: " + err.message); toolsMsg.textContent = ""; return; }
    const { records: recs, problems, repeated } = parseImport(text);
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

  // readings saved while the runtime could not start: judge them now
  for (const r of records.filter((x) => x.judgement === null)) {
    const out = await calculate("cp", requestOf(r));
    if (!out.ok) break;
    r.judgement = judgementOf(out.result);
    try { await putRecord(db, r); } catch (err) { break; }
    renderLog();
  }
}

export const SURVEY_CALCULATORS = { survey: surveyCalc };
