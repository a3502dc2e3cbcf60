// Typed text: a number read by one rule, and what was typed shown back so that it cannot mislead.
// The same rule is calc/numbers.py (the command line); both are tested against one table,
// tests/fixtures/numbers.json. Pure functions, no DOM: ui.mjs makes the messages of them.
//
// The rule: a plain decimal number, as a person writes it. Digits 0-9; one decimal mark, a point
// or a comma (a comma only where it cannot be a thousands separator: "1,5" and "0,125" are read,
// "1,000" is refused as ambiguous); an optional exponent (e or E); a sign: hyphen, true minus
// (U+2212) or plus. Spaces, tabs and no-break spaces around it are ignored. Anything else is
// refused and the refusal says what was read and what to write instead.

const SIGN = "[+\\-\u2212]";
const PLAIN = new RegExp("^(" + SIGN + "?)([0-9]*)(?:([.,])([0-9]*))?(?:[eE](" + SIGN + "?[0-9]+))?$");
const EDGE = /^[ \t\n\r\f\v\u00a0]+|[ \t\n\r\f\v\u00a0]+$/g;
const RADIX = new RegExp("^" + SIGN + "?0[xXbBoO]");
const NONFINITE = new RegExp("^" + SIGN + "?(?:inf|infinity|nan|\u221e)$", "i");
const COMMA_GROUPS = new RegExp("^" + SIGN + "?[0-9]{1,3}(?:,[0-9]{3})+(?:\\.[0-9]*)?$");
const POINT_GROUPS = new RegExp("^" + SIGN + "?[0-9]{1,3}(?:(?:\\.[0-9]{3}){2,}(?:,[0-9]*)?|(?:\\.[0-9]{3})+,[0-9]*)$");
const SPACE_GROUPS = new RegExp("^" + SIGN + "?[0-9]{1,3}(?:[ \u00a0\u202f][0-9]{3})+(?:[.,][0-9]*)?$");

// What each refusal says: the problem (after the echo of the text) and what to write instead.
export const PROBLEMS = {
  empty: ["is empty", ""],
  format: ["is not a number", "write digits with one point or comma, e.g. −0.85 or 12,5"],
  thousands: ["is ambiguous: a comma before three digits may separate thousands", "use {fix}"],
  grouped: ["holds digit-group separators, which are not read", "use {fix}"],
  underscore: ["holds underscores, which are not read", "use {fix}"],
  radix: ["is not a decimal number: hexadecimal, binary and octal are not read", "write it in decimal digits"],
  nonfinite: ["is not a finite number", "write a decimal number such as −0.85"],
  marks: ["has more than one decimal mark", "use one point or one comma"],
  overflow: ["is too large to be a number", ""],
};

// The plain form of a match, or null: {value} or {kind: "thousands" | "overflow", fix}.
function plain(s) {
  const m = PLAIN.exec(s);
  if (!m || (m[2] === "" && (m[4] || "") === "")) return null;
  const [, sign, int, mark, frac = ""] = m;
  if (mark === "," && /^[1-9][0-9]{0,2}$/.test(int) && frac.length === 3) {
    return { kind: "thousands", fix: [s.replace(",", ""), s.replace(",", ".")] };
  }
  const exp = m[5] === undefined ? "" : "e" + m[5].replace("\u2212", "-");
  const value = Number(sign.replace("\u2212", "-") + (int || "0") + "." + (frac || "0") + exp);
  return Number.isFinite(value) ? { value } : { kind: "overflow", fix: [] };
}

// Read a typed number: {value} or {kind, text, fix} (text: what was read; fix: the texts to
// suggest, maybe none).
export function readDecimal(text) {
  const raw = String(text ?? "");
  const s = raw.replace(EDGE, "");
  const refuse = (kind, fix = []) => ({ kind, text: s, fix }); // what was read: the text without its edges
  if (s === "") return refuse("empty");
  const p = plain(s);
  if (p) return p.kind ? refuse(p.kind, p.fix) : p;
  if (NONFINITE.test(s)) return refuse("nonfinite");
  if (RADIX.test(s)) return refuse("radix");
  if (s.includes("_")) {
    const bare = s.replaceAll("_", "");
    if (plain(bare) && !plain(bare).kind) return refuse("underscore", [bare]);
  }
  if (COMMA_GROUPS.test(s)) return refuse("grouped", [s.replaceAll(",", "")]);
  if (POINT_GROUPS.test(s)) return refuse("grouped", [s.replaceAll(".", "").replace(",", ".")]);
  if (SPACE_GROUPS.test(s)) return refuse("grouped", [s.replace(/[ \u00a0\u202f]/g, "").replace(",", ".")]);
  if ((s.match(/[.,]/g) || []).length > 1 && /^[+\-\u2212]?[0-9.,]+$/.test(s)) return refuse("marks");
  return refuse("format");
}

// The words of a refusal after the echo: "is ambiguous: ...; use 1000 or 1.000".
export function problemText(r) {
  const [problem, advice] = PROBLEMS[r.kind] || PROBLEMS.format;
  const fix = advice.replace("{fix}", (r.fix || []).join(" or "));
  return fix ? problem + "; " + fix : problem;
}

// ---------------------------------------------------------------------------------------
// Echo: typed text as a message shows it. Control, format (bidirectional overrides, zero-width)
// and separator characters are written as \uXXXX, so none can act on the message around it;
// at most ECHO_MAX characters are shown, then the length.

export const ECHO_MAX = 56;
const INVISIBLE = /^[\p{Cc}\p{Cf}\p{Cs}\p{Zl}\p{Zp}]$/u;

function escaped(ch) {
  const cp = ch.codePointAt(0);
  const hex = cp.toString(16).toUpperCase();
  return cp > 0xffff ? "\\u{" + hex + "}" : "\\u" + hex.padStart(4, "0");
}

// {shown, cut, count}: the text made visible and cut to max characters; count: its characters.
export function visible(raw, max = ECHO_MAX) {
  let shown = "", length = 0, count = 0, cut = false;
  for (const ch of String(raw)) {
    count++;
    if (cut) continue;
    const piece = INVISIBLE.test(ch) ? escaped(ch) : ch;
    const n = piece === ch ? 1 : piece.length;
    if (length + n > max) { cut = true; continue; }
    shown += piece;
    length += n;
  }
  return { shown, cut, count };
}

// Typed text quoted in a plain-text message: made visible, in quotes, cut with its length
// (as calc.numbers.echo; ui.mjs' echo() also isolates it on the page).
export function echoText(raw) {
  const { shown, cut, count } = visible(raw);
  return cut ? "“" + shown + "…” (" + count + " characters)" : "“" + shown + "”";
}
