// The one rule for mathematics in the text of results. The engine (calc) writes derivation
// steps, warnings and notes as plain text that reads as it is in a terminal, with a small markup
// (documented in calc/derivation.py); mathNodes() sets that text for the page:
//   - "^" raises what follows it: a bracketed group, ^(1/3) or ^{1/3}, shown without the
//     brackets; or a signed number, fraction, word or charge: ^2, ^-1/2, ^1.5, ^i, ^−pH, ^2-, ^-;
//   - a number in exponent form (1.2e-05, 3.27e-3, 1e+36) is shown as 1.2 × 10⁻⁵ (10⁻⁵ for
//     a mantissa of 1), in brackets when it is itself raised to a power;
//   - a hyphen-minus that is a sign (before a digit, not inside a word or a range such as
//     "2.4-4" or an id such as "cuni-90-10") is shown as the minus sign − (U+2212).
// numberText() writes a number by the same rule (the page's own figures), mathText() the text
// as one string where only text can go. Text stays text: the nodes are text nodes and <sup>
// elements, never HTML.

export const MINUS = "\u2212";
const SUP = { 0: "⁰", 1: "¹", 2: "²", 3: "³", 4: "⁴", 5: "⁵", 6: "⁶", 7: "⁷", 8: "⁸", 9: "⁹", "−": "⁻", "-": "⁻", "+": "⁺" };
// one match of the markup: [1] mantissa and [2] exponent of a number in exponent form; after a
// caret [3] a (...) group, [4] a {...} group or [5] a bare exponent; or a hyphen before a number
const TOKEN = /(\d+(?:\.\d+)?)[eE]([+\-−]?\d+)|\^(?:\(((?:[^()]|\([^()]*\))*)\)|\{([^{}]*)\}|([+\-−]?(?:\d+(?:\.\d+)?(?:\/\d+)?|\p{L}+)(?:[+\-−](?![\p{L}\p{N}]))?|[+\-−](?![\p{L}\p{N}.])))|-(?=\.?\d)/gu;
const WORDISH = /[\p{L}\p{N}_.]/u; // a character that makes a following number part of a word
const IN_WORD = /[\p{L}\p{N}_]/u; // a character after which a hyphen joins (aluminium-5083, 2.4-4)

// An exponent as written: "+" dropped, leading zeros dropped, hyphen-minus as the minus sign.
function exponent(text) {
  const m = /^([+\-−]?)0*(\d+)$/.exec(text);
  if (!m) return text.replace(/-/g, MINUS);
  return (m[1] === "-" || m[1] === MINUS ? MINUS : "") + m[2];
}

function sup(children) {
  const el = document.createElement("sup");
  el.className = "cw-sup";
  el.append(...children);
  return el;
}

// Plain text of the markup with the minus rule only (what is raised is set by mathNodes).
export function minusSigns(text) {
  return String(text).replace(/-(?=\.?\d)/g, (m, at, all) => (at > 0 && IN_WORD.test(all[at - 1]) ? m : MINUS));
}

// The text of a result as page nodes: strings and <sup> elements, to append to an element.
export function mathNodes(text) {
  const s = String(text ?? "");
  const out = [];
  let last = 0;
  const plain = (to) => { if (to > last) out.push(s.slice(last, to)); };
  for (const m of s.matchAll(TOKEN)) {
    const at = m.index;
    const before = at > 0 ? s[at - 1] : "";
    if (m[1] !== undefined) { // a number in exponent form, unless it is part of a word (B401e3)
      const after = s[at + m[0].length] || "";
      if ((before && WORDISH.test(before)) || (after && WORDISH.test(after))) continue;
      plain(at);
      const raised = after === "^";
      const one = /^1(?:\.0*)?$/.test(m[1]);
      if (raised) out.push("(");
      out.push(one ? "10" : m[1] + " × 10", sup([exponent(m[2])]));
      if (raised) out.push(")");
    } else if (m[0] === "-") { // a sign, unless the hyphen joins a word, an id or a range
      if (before && IN_WORD.test(before)) continue;
      plain(at);
      out.push(MINUS);
    } else { // a caret and what it raises
      plain(at);
      const inner = m[3] ?? m[4] ?? m[5];
      out.push(sup(m[5] !== undefined ? [exponent(inner)] : mathNodes(inner)));
    }
    last = at + m[0].length;
  }
  plain(s.length);
  return out;
}

// The same text as one string, where only text can go (a <select>'s options, an SVG label):
// what is raised is written in superscript characters, which exist for digits, signs and
// brackets (^2+ → ²⁺, 1e-05 → 10⁻⁵); an exponent with other characters (^1/2) is bracketed,
// ^(1/2), so that it still reads unambiguously.
export function mathText(text) {
  return mathNodes(text).map((n) => {
    if (typeof n === "string") return n;
    const t = n.textContent;
    return [...t].every((c) => c in SUP || c === "(" || c === ")") ? [...t].map((c) => SUP[c] || (c === "(" ? "⁽" : "⁾")).join("") : "^(" + t + ")";
  }).join("");
}

// A number as the page shows it: `digits` decimals, or m × 10ⁿ (three decimals in m) for
// magnitudes below 10⁻³ or from 10⁶; a true minus sign.
export function numberText(x, digits = 4) {
  if (typeof x !== "number" || !Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) {
    const [m, e] = x.toExponential(3).split("e");
    return minusSigns(m) + " × 10" + [...exponent(e)].map((c) => SUP[c] || c).join("");
  }
  return minusSigns(x.toFixed(digits));
}
