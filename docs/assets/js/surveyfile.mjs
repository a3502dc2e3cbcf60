// The survey log's files: the JSON and CSV exports and their import, this format (2) and the one
// before it (1: one reading per record, reading_V with its kind, a polarisation in mV). An older
// file imports as it is: each reading becomes the on or the instant-off reading of its record, a
// polarisation given in mV is kept (in V), and the reading is judged again with the current data
// (a judgement of format 1 could say "protected" of an on reading). Numbers are in V against the
// record's electrode; times in ISO 8601.
import { echoText, problemText, readDecimal, visible } from "./numbers.mjs";
import { h } from "./site.mjs";
import { recordProblem, withinBound } from "./surveylog.mjs";

export const FORMAT = "couplewise-survey-log";
export const FORMAT_VERSION = 2;
const UNITS = {
  on_V: "V, against the electrode named in the record (reading with the protective current applied)",
  off_V: "V, against the electrode named in the record (instant-off reading)",
  native_V: "V, against the electrode named in the record (native, depolarised potential)",
  ir_subtracted_V: "V (size of the IR drop measured or calculated, subtracted from the on reading)",
  polarisation_V: "V (a polarisation shift given as such, kept from an older record)",
  temp_C: "°C (electrode temperature)",
  salinity: "g/kg",
  time: "ISO 8601 date and time with the offset from UTC where known",
  saved_at: "UTC (ISO 8601)",
  judgement: "polarisation_V and ir_drop_V in V; its texts in judgement.unit",
};

// ---------------------------------------------------------------------------------------
// Format 1: read and checked as it was, then turned into a record of format 2.

const V1_FIELDS = ["id", "location", "time", "reading_V", "electrode", "temp_C", "structure", "setting", "reading_kind",
  "polarisation_mV", "salinity", "notes", "saved_at", "judgement"];

function v1Problem(r, bounds) {
  if (!r || typeof r !== "object" || Array.isArray(r)) return "not a record";
  for (const k of Object.keys(r)) if (!V1_FIELDS.includes(k)) return "unknown field " + echoText(k);
  if (typeof r.reading_V !== "number" || !Number.isFinite(r.reading_V) || !withinBound(r.reading_V, bounds.reading_V)) return "reading_V: expected " + (bounds.reading_V ? bounds.reading_V.text : "a number");
  if (r.reading_kind !== "on" && r.reading_kind !== "instant-off") return "reading_kind: expected on or instant-off";
  if (r.polarisation_mV !== null && (typeof r.polarisation_mV !== "number" || !withinBound(r.polarisation_mV, bounds.polarisation_mV))) return "polarisation_mV: expected " + (bounds.polarisation_mV ? bounds.polarisation_mV.text : "a number") + " (or null)";
  return null;
}

// A record of format 1 as a record of format 2 (its judgement made again: null).
export function upgradeV1(r) {
  const on = r.reading_kind === "on";
  return {
    id: r.id, location: r.location, time: r.time, on_V: on ? r.reading_V : null, off_V: on ? null : r.reading_V,
    native_V: null, electrode: r.electrode, temp_C: r.temp_C, structure: r.structure, setting: r.setting,
    ir_drop_method: null, ir_subtracted_V: null,
    polarisation_V: r.polarisation_mV === null || r.polarisation_mV === undefined ? null : r.polarisation_mV / 1000,
    salinity: r.salinity ?? null, notes: r.notes, saved_at: r.saved_at, judgement: null,
  };
}

// A record as stored or read from a file: format 2 as it is, format 1 upgraded; {rec, problem, older}.
export function readRecord(r, bounds) {
  if (r && typeof r === "object" && !Array.isArray(r) && "reading_V" in r && !("off_V" in r)) {
    const p = v1Problem(r, bounds);
    if (p) return { rec: null, problem: p, older: true };
    const rec = upgradeV1(r);
    return { rec, problem: recordProblem(rec, bounds), older: true };
  }
  return { rec: r, problem: recordProblem(r, bounds), older: false };
}

// ---------------------------------------------------------------------------------------
// Export

export function exportJson(recs, dataVersion, unit) {
  return JSON.stringify({
    format: FORMAT, format_version: FORMAT_VERSION, exported_at: new Date().toISOString(),
    data_version: dataVersion, units: UNITS, display_unit: unit || "V", count: recs.length, records: recs,
  }, null, 1);
}

function csvCell(v, text) {
  if (v === null || v === undefined) return "";
  let s = String(v);
  if (text && /^[=+\-@\t\r]/.test(s)) s = "'" + s; // a spreadsheet must not read a note as a formula
  return /[",\r\n]/.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s;
}

// The columns of a CSV export (format 2); the last ones come from the judgement (computed by calc).
const CSV_HEAD = ["id", "time", "location", "structure", "setting", "electrode", "temp_C", "on_V", "off_V", "native_V",
  "ir_drop_method", "ir_subtracted_V", "polarisation_V", "salinity_g_per_kg", "notes", "saved_at",
  "polarisation_shift_V", "ir_drop_V", "verdict", "conclusive", "verdict_text", "text_unit", "data_version"];
const TEXT_COLUMNS = new Set(["location", "electrode", "notes", "verdict_text"]);

export function exportCsv(recs, dataVersion) {
  const lines = [
    "# Couplewise survey log, format " + FORMAT_VERSION + "; exported " + new Date().toISOString() + "; data version " + dataVersion,
    "# units: potentials (on_V, off_V, native_V, ir_subtracted_V, polarisation_V, polarisation_shift_V = instant-off minus native, ir_drop_V = on minus instant-off) in V against the electrode of the row; temp_C in °C (electrode); salinity in g/kg; time ISO 8601; saved_at UTC",
    CSV_HEAD.join(","),
  ];
  for (const r of recs) {
    const j = r.judgement;
    const row = { ...r, salinity_g_per_kg: r.salinity, verdict: j ? j.verdict : "not judged", conclusive: j ? j.conclusive : "",
      verdict_text: j ? j.text : "", text_unit: j ? j.unit || "V" : "", data_version: j ? j.data_version : "",
      polarisation_shift_V: j && j.polarisation_from === "native" ? -j.polarisation_V : "", ir_drop_V: j ? j.ir_drop_V : "" };
    lines.push(CSV_HEAD.map((k) => csvCell(row[k], TEXT_COLUMNS.has(k))).join(","));
  }
  return lines.join("\r\n") + "\r\n";
}

// ---------------------------------------------------------------------------------------
// Import

function collect(items, bounds, label) {
  const records = [], problems = [], seen = new Set(), older = new Set();
  let repeated = 0;
  items.forEach((item, i) => {
    if (item.problem) { problems.push(label + " " + (i + 1) + ": " + item.problem); return; }
    const { rec, problem, older: old } = readRecord(item.rec, bounds);
    if (problem) problems.push(label + " " + (i + 1) + ": " + problem);
    else if (seen.has(rec.id)) repeated++; // the same reading twice in one file: kept once
    else { seen.add(rec.id); records.push(rec); if (old) older.add(rec.id); }
  });
  return { records, problems, repeated, older };
}

// Parse an exported JSON log, format 1 or 2: {records, problems, repeated, older} (older: the ids
// of the records read in the earlier format).
export function parseImport(text, bounds) {
  let doc;
  try { doc = JSON.parse(text); } catch (err) { return { records: [], problems: ["the file is not JSON: " + visible(err.message, 160).shown] }; }
  if (!doc || doc.format !== FORMAT || !Array.isArray(doc.records)) {
    return { records: [], problems: ["the file is not a Couplewise survey log (format " + FORMAT + ")"] };
  }
  if (doc.format_version !== 1 && doc.format_version !== FORMAT_VERSION) {
    return { records: [], problems: ["format version " + echoText(JSON.stringify(doc.format_version) ?? "none") + " is not 1 or " + FORMAT_VERSION] };
  }
  return collect(doc.records.map((r) => ({ rec: r })), bounds, "record");
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

// The columns a CSV must have, by format, and how a row becomes a record.
const CSV_V1 = ["id", "time", "location", "reading_V", "electrode", "reading_kind", "temp_C", "structure", "setting",
  "polarisation_mV", "salinity_g_per_kg", "notes", "saved_at"];
const CSV_V2 = CSV_HEAD.slice(0, 16);

function rowRecord(cell, text, num, v1) {
  const common = { id: cell("id"), location: text("location"), time: cell("time"), electrode: text("electrode"),
    temp_C: num("temp_C"), structure: cell("structure"), setting: cell("setting"), salinity: num("salinity_g_per_kg", true),
    notes: text("notes"), saved_at: cell("saved_at"), judgement: null };
  if (v1) {
    return { ...common, reading_V: num("reading_V"), reading_kind: cell("reading_kind"), polarisation_mV: num("polarisation_mV", true) };
  }
  return { ...common, on_V: num("on_V", true), off_V: num("off_V", true), native_V: num("native_V", true),
    ir_drop_method: cell("ir_drop_method") || null, ir_subtracted_V: num("ir_subtracted_V", true), polarisation_V: num("polarisation_V", true) };
}

// Parse a CSV log as exported here (format 1 or 2), maybe re-saved by a spreadsheet with ";"
// between the cells: {records, problems, repeated, older} as parseImport. Its numbers are read by
// the one rule (numbers.mjs), so "1,000" is refused, not read as 1; text cells lose the guard the
// export put before a leading = + - @. A CSV holds no full judgement: its readings are judged again.
export function parseCsvImport(text, bounds) {
  const body = text.replace(/^\ufeff/, "");
  const headLine = body.split(/\r?\n/).find((ln) => ln.trim() !== "" && !ln.startsWith("#")) || "";
  const sep = headLine.includes(";") && !headLine.includes(",") ? ";" : ",";
  const rows = csvRows(body, sep).filter((r) => !(r.length === 1 && r[0].trim() === "") && !r[0].startsWith("#"));
  const head = (rows.shift() || []).map((c) => c.trim());
  const v1 = head.includes("reading_V") && head.includes("reading_kind");
  const missing = (v1 ? CSV_V1 : CSV_V2).filter((c) => !head.includes(c));
  if (missing.length) return { records: [], problems: ["the file is not a Couplewise survey log (a CSV export has the column " + missing[0] + ")"], repeated: 0, older: new Set() };
  const items = rows.map((row) => {
    const cell = (name) => row[head.indexOf(name)] ?? "";
    const txt = (name) => { const t = cell(name); return /^'[=+\-@\t\r]/.test(t) ? t.slice(1) : t; };
    const num = (name, optional) => {
      if (optional && cell(name).trim() === "") return null;
      const r = readDecimal(cell(name));
      if (r.value === undefined) throw new Error(name + ": " + (r.kind === "empty" ? "empty" : echoText(r.text) + " " + problemText(r)));
      return r.value;
    };
    try { return { rec: rowRecord(cell, txt, num, v1) }; } catch (err) { return { problem: err.message }; }
  });
  return collect(items, bounds, "row");
}

export function download(name, type, text) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = h("a", { href: url, download: name, class: "cw-hidden-link" });
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}

// A file name's time stamp: the ISO 8601 basic form of the local date and time.
export function stamp(localNow) { return localNow.replace(/[-:]/g, ""); }
