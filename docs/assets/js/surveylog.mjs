// The survey log's records: storage in this browser's IndexedDB (a reading is shown as saved only
// after its write has completed), what one record holds and the check every stored or imported
// record passes, the request it makes to calc and the part of calc's judgement kept with it. The
// files (export, import, older formats) are surveyfile.mjs. The bounds are calc's (spec.json).
//
// A record is one test post at one time: the on reading (current flowing) and the instant-off
// reading, either or both, with the native (depolarised) potential when known; every potential
// in V against the record's electrode (the page shows V or mV, as the user chooses); the time in
// ISO 8601 with the offset from UTC of the device when it was entered.
import { echoText } from "./numbers.mjs";

export const DB_NAME = "couplewise-survey";
export const STORE = "readings";
const DB_VERSION = 1;
export const DRAFT_KEY = "couplewise-survey-draft"; // the draft's place before: localStorage, read once
// The form's draft: a database of its own (the log's database keeps its version), one record.
const DRAFT_DB = "couplewise-survey-draft";
const DRAFT_STORE = "draft";
export const VERDICTS = ["protected", "unconfirmed", "not protected", "over-protected"];

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

// Add the records whose ids are not stored yet; resolves to {added, present, ids} (ids: those added).
export function mergeRecords(db, recs) {
  return transact(db, "readwrite", (st, done) => {
    const counts = { added: 0, present: 0, ids: new Set() };
    done(counts);
    for (const rec of recs) {
      const g = st.get(rec.id);
      g.onsuccess = () => {
        if (g.result) counts.present++;
        else { st.add(rec); counts.added++; counts.ids.add(rec.id); }
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
// Records: what one test post's readings hold, and the check every stored or imported record passes.

// ISO 8601 date and time, to the minute or beyond, with an offset (Z or ±hh:mm) or, for records
// entered before the offset was kept, without one (the device's local time).
export const TIME_RE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?(Z|[+-]\d{2}:\d{2})?$/;
const ID_RE = /^[A-Za-z0-9-]{8,64}$/;
const METHOD_RE = /^[a-z0-9-]{1,40}$/;
const isNum = (x) => typeof x === "number" && Number.isFinite(x);
const isText = (x, max, empty = false) => typeof x === "string" && x.length <= max && (empty || x.trim() !== "");
const numOrNull = (x) => x === null || isNum(x);
// The fields of a record (format 2)
export const RECORD_FIELDS = ["id", "location", "time", "on_V", "off_V", "native_V", "electrode", "temp_C", "structure",
  "setting", "ir_drop_method", "ir_subtracted_V", "polarisation_V", "salinity", "notes", "saved_at", "judgement"];

// A datetime-local value (YYYY-MM-DDTHH:MM, the device's local time) in ISO 8601 with its offset.
export function withOffset(local) {
  const d = new Date(local);
  if (Number.isNaN(d.getTime())) return local;
  const off = -d.getTimezoneOffset();
  const a = Math.abs(off);
  return local + (off >= 0 ? "+" : "-") + String(Math.floor(a / 60)).padStart(2, "0") + ":" + String(a % 60).padStart(2, "0");
}

// Whether x lies within one of calc's bounds ({low, high, low_open}; null: no limit that side).
export function withinBound(x, b) {
  if (!b) return true;
  if (b.low !== null && (b.low_open ? !(x > b.low) : !(x >= b.low))) return false;
  return b.high === null || x <= b.high;
}

function judgementProblem(j) {
  if (j === null) return null;
  if (!j || typeof j !== "object") return "judgement: expected an object or null";
  if (!VERDICTS.includes(j.verdict) || typeof j.conclusive !== "boolean" || !isText(j.text, 5000) || !isText(j.label, 200) || !isText(j.data_version, 64)) return "judgement: incomplete";
  if (!Array.isArray(j.criteria) || !Array.isArray(j.warnings)) return "judgement: incomplete";
  if (!numOrNull(j.polarisation_V ?? null) || !numOrNull(j.ir_drop_V ?? null) || !(j.unit === undefined || j.unit === "V" || j.unit === "mV")) return "judgement: incomplete";
  return null;
}

// Returns null for a valid record (format 2), else the first problem in words; bounds: spec.json's.
export function recordProblem(r, bounds) {
  const outside = (k, key = k) => r[k] !== null && !withinBound(r[k], bounds[key]);
  const expected = (k, key = k) => k + ": expected " + (bounds[key] ? bounds[key].text : "a number") + " (or null)";
  if (!r || typeof r !== "object" || Array.isArray(r)) return "not a record";
  if (!isText(r.id, 64) || !ID_RE.test(r.id)) return "id: expected 8 to 64 letters, digits or hyphens";
  if (!isText(r.location, 200)) return "location: expected a label of 1 to 200 characters";
  if (!isText(r.time, 40) || !TIME_RE.test(r.time) || Number.isNaN(Date.parse(r.time))) return "time: expected an ISO 8601 date and time such as 2024-05-01T14:30+02:00";
  for (const k of ["on_V", "off_V", "native_V"]) if (!numOrNull(r[k]) || outside(k, "reading_V")) return expected(k, "reading_V");
  if (r.on_V === null && r.off_V === null) return "on_V and off_V: expected at least one reading";
  if (!isText(r.electrode, 80)) return "electrode: expected an electrode id";
  if (!isNum(r.temp_C) || outside("temp_C")) return "temp_C: expected " + (bounds.temp_C ? bounds.temp_C.text : "a number");
  if (!isText(r.structure, 80) || !isText(r.setting, 80)) return "structure and setting: expected ids";
  if (r.ir_drop_method !== null && !(typeof r.ir_drop_method === "string" && METHOD_RE.test(r.ir_drop_method))) return "ir_drop_method: expected a method id or null";
  if (!numOrNull(r.ir_subtracted_V) || (r.ir_subtracted_V !== null && !withinBound(r.ir_subtracted_V * 1000, bounds.ir_drop_mV))) return "ir_subtracted_V: expected the size of an IR drop in V (or null)";
  if (!numOrNull(r.polarisation_V) || (r.polarisation_V !== null && !withinBound(r.polarisation_V * 1000, bounds.polarisation_mV))) return "polarisation_V: expected a polarisation shift in V (or null)";
  if (r.native_V !== null && r.polarisation_V !== null) return "native_V and polarisation_V: expected one of the two";
  if (!numOrNull(r.salinity) || outside("salinity")) return expected("salinity");
  if (!isText(r.notes, 2000, true)) return "notes: expected text of at most 2000 characters";
  if (!isText(r.saved_at, 40) || Number.isNaN(Date.parse(r.saved_at))) return "saved_at: expected a date";
  const jp = judgementProblem(r.judgement);
  if (jp) return jp;
  const known = new Set(RECORD_FIELDS);
  for (const k of Object.keys(r)) if (!known.has(k)) return "unknown field " + echoText(k);
  for (const k of RECORD_FIELDS) if (!(k in r)) return k + ": missing";
  return null;
}

// The request to calc for a record: the instant-off reading when there is one (with the on reading
// beside it and the native potential), else the on reading with the way its IR drop was considered.
export function requestOf(rec, unit) {
  const req = { structure: rec.structure, setting: rec.setting, electrode: rec.electrode, temp_C: rec.temp_C };
  if (rec.off_V !== null) {
    Object.assign(req, { reading_V: rec.off_V, reading_kind: "instant-off" });
    if (rec.on_V !== null) req.on_V = rec.on_V;
    if (rec.native_V !== null) req.native_V = rec.native_V;
  } else {
    Object.assign(req, { reading_V: rec.on_V, reading_kind: "on" });
    if (rec.ir_drop_method !== null) req.ir_drop_method = rec.ir_drop_method;
    if (rec.ir_subtracted_V !== null) req.ir_drop_mV = Math.round(rec.ir_subtracted_V * 1e9) / 1e6;
    if (rec.native_V !== null) req.native_V = rec.native_V;
  }
  if (rec.polarisation_V !== null) req.polarisation_mV = Math.round(rec.polarisation_V * 1e9) / 1e6;
  if (rec.salinity !== null) req.salinity = rec.salinity;
  if (unit) req.unit = unit;
  return req;
}

// The part of a calc result kept with the reading (the derivation is re-made on demand); its
// texts are worded in the unit the page had when it was judged (unit).
export function judgementOf(r, unit) {
  return {
    verdict: r.verdict, conclusive: r.conclusive, label: r.verdict_label, text: r.verdict_text,
    criteria: (r.criteria || []).filter((c) => c.role !== "not checked").map((c) => ({
      id: c.id, name: c.name, standard: c.standard, clause: c.clause, role: c.role,
      value: c.role === "polarisation" ? c.value_mV : c.value_V, electrode: c.electrode || null,
      result: c.role === "limit" ? (c.exceeded ? "beyond" : "within") : (c.met === null || c.met === undefined ? "not checked" : (c.met ? "met" : "not met")),
      margin: c.margin_text || null,
    })),
    warnings: (r.warnings || []).map((w) => w.message),
    polarisation_V: r.polarisation_mV === null || r.polarisation_mV === undefined ? null : r.polarisation_mV / 1000,
    polarisation_from: r.polarisation_from || null,
    ir_drop_V: r.ir_drop_V ?? null,
    unit: unit || "V",
    data_version: r.data_version,
  };
}

export function sortLog(recs) {
  return recs.sort((a, b) => (b.saved_at > a.saved_at ? 1 : b.saved_at < a.saved_at ? -1 : (b.id > a.id ? 1 : -1)));
}
