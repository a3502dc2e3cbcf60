// The survey log's records: storage in this browser's IndexedDB (a reading is shown as saved only
// after its write has completed), the check every stored or imported record passes, and the
// exports (CSV, JSON) and import. The bounds of the numbers are calc's (spec.json: bounds).
import { echoText, problemText, readDecimal, visible } from "./numbers.mjs";
import { h } from "./site.mjs";

export const DB_NAME = "couplewise-survey";
export const STORE = "readings";
const DB_VERSION = 1;
export const FORMAT = "couplewise-survey-log";
export const FORMAT_VERSION = 1;
export const DRAFT_KEY = "couplewise-survey-draft"; // the draft's place before: localStorage, read once
// The form's draft: a database of its own (the log's database keeps its version), one record.
const DRAFT_DB = "couplewise-survey-draft";
const DRAFT_STORE = "draft";
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

export function openDb(name = DB_NAME, store = STORE) {
  return new Promise((resolve, reject) => {
    let req;
    try { req = indexedDB.open(name, DB_VERSION); } catch (err) { reject(err); return; }
    req.onupgradeneeded = () => {
      const db = req.result;
      if (!db.objectStoreNames.contains(store)) db.createObjectStore(store, { keyPath: "id" });
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
function transact(db, mode, work, store = STORE) {
  return new Promise((resolve, reject) => {
    let tx;
    try { tx = db.transaction(store, mode, { durability: "strict" }); } catch (err) { reject(err); return; }
    let value;
    tx.oncomplete = () => resolve(value);
    tx.onerror = () => reject(tx.error);
    tx.onabort = () => reject(tx.error || new Error("the write was aborted"));
    try { work(tx.objectStore(store), (v) => { value = v; }); } catch (err) { tx.abort(); reject(err); }
  });
}

export function putRecord(db, rec) { return transact(db, "readwrite", (st) => st.put(rec)); }
export function allRecords(db) {
  return transact(db, "readonly", (st, done) => { const r = st.getAll(); r.onsuccess = () => done(r.result); });
}
export function clearRecords(db) { return transact(db, "readwrite", (st) => st.clear()); }

// The draft of the form (field -> text as typed): written as it is typed (the caller waits a
// moment after the last change), so a crash loses at most that moment; localStorage, where it
// was kept before, writes to disk only seconds later. null when the browser stores nothing.
export async function openDraft() {
  try { return await openDb(DRAFT_DB, DRAFT_STORE); } catch (err) { return null; }
}
export async function readDraft(db) {
  let draft = null;
  if (db) {
    try { draft = await transact(db, "readonly", (st, done) => { const r = st.get("form"); r.onsuccess = () => done(r.result); }, DRAFT_STORE); }
    catch (err) { draft = null; }
  }
  try {
    if (!draft) draft = JSON.parse(localStorage.getItem(DRAFT_KEY) || "null");
    localStorage.removeItem(DRAFT_KEY);
  } catch (err) { /* no storage: no draft */ }
  return draft && typeof draft === "object" ? draft : {};
}
export function writeDraft(db, draft) {
  return transact(db, "readwrite", (st) => st.put({ ...draft, id: "form" }), DRAFT_STORE);
}

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

export const TIME_RE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?$/;
const ID_RE = /^[A-Za-z0-9-]{8,64}$/;
const isNum = (x) => typeof x === "number" && Number.isFinite(x);
const isText = (x, max, empty = false) => typeof x === "string" && x.length <= max && (empty || x.trim() !== "");

// Whether x lies within one of calc's bounds ({low, high, low_open}; null: no limit that side).
export function withinBound(x, b) {
  if (!b) return true;
  if (b.low !== null && (b.low_open ? !(x > b.low) : !(x >= b.low))) return false;
  return b.high === null || x <= b.high;
}

// Returns null for a valid record, else the first problem in words; bounds: spec.json's bounds.
export function recordProblem(r, bounds) {
  const outside = (k) => !withinBound(r[k], bounds[k]);
  const expected = (k) => k + ": expected " + (bounds[k] ? bounds[k].text : "a number");
  if (!r || typeof r !== "object" || Array.isArray(r)) return "not a record";
  if (!isText(r.id, 64) || !ID_RE.test(r.id)) return "id: expected 8 to 64 letters, digits or hyphens";
  if (!isText(r.location, 200)) return "location: expected a label of 1 to 200 characters";
  if (!isText(r.time, 40) || !TIME_RE.test(r.time) || Number.isNaN(Date.parse(r.time))) return "time: expected a date and time such as 2024-05-01T14:30";
  if (!isNum(r.reading_V) || outside("reading_V")) return expected("reading_V");
  if (!isText(r.electrode, 80)) return "electrode: expected an electrode id";
  if (!isNum(r.temp_C) || outside("temp_C")) return expected("temp_C");
  if (!isText(r.structure, 80) || !isText(r.setting, 80)) return "structure and setting: expected ids";
  if (r.reading_kind !== "on" && r.reading_kind !== "instant-off") return "reading_kind: expected on or instant-off";
  if (r.polarisation_mV !== null && (!isNum(r.polarisation_mV) || outside("polarisation_mV"))) return expected("polarisation_mV") + " (or null)";
  if (r.salinity !== null && (!isNum(r.salinity) || outside("salinity"))) return expected("salinity") + " (or null)";
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
  for (const k of Object.keys(r)) if (!known.has(k)) return "unknown field " + echoText(k);
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

export function sortLog(recs) {
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
export function parseImport(text, bounds) {
  let doc;
  try { doc = JSON.parse(text); } catch (err) { return { records: [], problems: ["the file is not JSON: " + visible(err.message, 160).shown] }; }
  if (!doc || doc.format !== FORMAT || !Array.isArray(doc.records)) {
    return { records: [], problems: ["the file is not a Couplewise survey log (format " + FORMAT + ")"] };
  }
  if (doc.format_version !== FORMAT_VERSION) return { records: [], problems: ["format version " + echoText(JSON.stringify(doc.format_version) ?? "none") + " is not " + FORMAT_VERSION] };
  const records = [], problems = [], seen = new Set();
  let repeated = 0;
  doc.records.forEach((r, i) => {
    const p = recordProblem(r, bounds);
    if (p) problems.push("record " + (i + 1) + ": " + p);
    else if (seen.has(r.id)) repeated++; // the same reading twice in one file: kept once
    else { seen.add(r.id); records.push(r); }
  });
  return { records, problems, repeated };
}

// Rows of cells of a CSV text (RFC 4180 quoting; sep "," or ";").
function csvRows(text, sep) {
  const rows = [];
  let row = [], cell = "", quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c !== '"') cell += c;
      else if (text[i + 1] === '"') { cell += '"'; i++; } else quoted = false;
    } else if (c === '"' && cell === "") quoted = true;
    else if (c === sep) { row.push(cell); cell = ""; }
    else if (c === "\n" || c === "\r") {
      if (c === "\r" && text[i + 1] === "\n") i++;
      row.push(cell); rows.push(row); row = []; cell = "";
    } else cell += c;
  }
  if (cell !== "" || row.length) { row.push(cell); rows.push(row); }
  return rows;
}

const CSV_COLUMNS = ["id", "time", "location", "reading_V", "electrode", "reading_kind", "temp_C", "structure", "setting",
  "polarisation_mV", "salinity_g_per_kg", "notes", "saved_at"];

// Parse a CSV log as exported here, maybe re-saved by a spreadsheet with ";" between the cells:
// {records, problems, repeated} as parseImport. Its numbers are read by the one rule (numbers.mjs),
// so "1,000" is refused, not read as 1; text cells lose the guard the export put before a leading
// = + - @. A CSV holds no full judgement: its readings are judged again (judgement null).
export function parseCsvImport(text, bounds) {
  const body = text.replace(/^\ufeff/, "");
  const headLine = body.split(/\r?\n/).find((ln) => ln.trim() !== "" && !ln.startsWith("#")) || "";
  const sep = headLine.includes(";") && !headLine.includes(",") ? ";" : ",";
  const rows = csvRows(body, sep).filter((r) => !(r.length === 1 && r[0].trim() === "") && !r[0].startsWith("#"));
  const head = (rows.shift() || []).map((c) => c.trim());
  const missing = CSV_COLUMNS.filter((c) => !head.includes(c));
  if (missing.length) return { records: [], problems: ["the file is not a Couplewise survey log (a CSV export has the column " + missing[0] + ")"], repeated: 0 };
  const records = [], problems = [], seen = new Set();
  let repeated = 0;
  rows.forEach((row, i) => {
    const cell = (name) => row[head.indexOf(name)] ?? "";
    const text = (name) => { const t = cell(name); return /^'[=+\-@\t\r]/.test(t) ? t.slice(1) : t; };
    const num = (name, optional) => {
      if (optional && cell(name).trim() === "") return null;
      const r = readDecimal(cell(name));
      if (r.value === undefined) throw new Error(name + ": " + (r.kind === "empty" ? "empty" : echoText(r.text) + " " + problemText(r)));
      return r.value;
    };
    let rec;
    try {
      rec = { id: cell("id"), location: text("location"), time: cell("time"), reading_V: num("reading_V"), electrode: text("electrode"),
        temp_C: num("temp_C"), structure: cell("structure"), setting: cell("setting"), reading_kind: cell("reading_kind"),
        polarisation_mV: num("polarisation_mV", true), salinity: num("salinity_g_per_kg", true), notes: text("notes"),
        saved_at: cell("saved_at"), judgement: null };
    } catch (err) { problems.push("row " + (i + 1) + ": " + err.message); return; }
    const p = recordProblem(rec, bounds);
    if (p) problems.push("row " + (i + 1) + ": " + p);
    else if (seen.has(rec.id)) repeated++;
    else { seen.add(rec.id); records.push(rec); }
  });
  return { records, problems, repeated };
}

export function download(name, type, text) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = h("a", { href: url, download: name, class: "cw-hidden-link" });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

export function stamp() { return localNow().replace(/[-:]/g, "").replace("T", "-"); }
