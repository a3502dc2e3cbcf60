// The runner of a calculator: sends the form's request to the worker as the inputs change,
// marks a result that no longer matches the inputs (grey, and a note in words that the result is
// described by), shows calc's refusal at the field it names, says what is wrong where there is
// no result yet, and paints the answer of the opening request worked out when the site was built
// while the runtime starts (with a note in the user's words: nothing about builds or runtimes).
import { calculate, h, onRuntime, precomputedAnswers } from "./site.mjs";
import { fill } from "./ui.mjs";

// Canonical JSON: object keys sorted, no spaces (mirrors canonical() in sitebuild/precompute.py).
export function canonical(v) {
  if (Array.isArray(v)) return "[" + v.map(canonical).join(",") + "]";
  if (v && typeof v === "object") return "{" + Object.keys(v).sort().map((k) => JSON.stringify(k) + ":" + canonical(v[k])).join(",") + "}";
  return JSON.stringify(v === undefined ? null : v);
}

// The fields of a form marked invalid, as [label, message parts] (the message's nodes cloned).
function invalidFields(form) {
  return [...form.querySelectorAll("[aria-invalid=true]")].filter((c) => !c.closest("[hidden]")).map((c) => {
    const label = form.querySelector("label[for=\"" + CSS.escape(c.id) + "\"]");
    const msg = document.getElementById(c.id + "-msg");
    return [label ? label.textContent : c.id, msg ? [...msg.childNodes].map((n) => n.cloneNode(true)) : []];
  });
}

// The note beside a result that is not for the current inputs: made on first use, before the
// result; the result names it in aria-describedby while it applies.
let noteIds = 0;
function staleNote(ui) {
  if (!ui.staleNote) {
    ui.staleNote = h("div", { class: "cw-stale-note", id: "cw-stale-" + ++noteIds, "aria-live": "polite" });
    ui.result.before(ui.staleNote);
  }
  return ui.staleNote;
}

// The note on an answer worked out in advance (the same calc and data as the page's own).
const EARLY_LOADING = "The answer for the inputs this page opens with, worked out in advance; other inputs are calculated once the calculator has loaded.";
const EARLY_FAILED = "The answer for the inputs this page opens with, worked out in advance; the calculator could not start, so other inputs cannot be calculated here.";
const NO_RUNTIME = "No result: the calculator could not start (see the message above).";

function runtimeStage() {
  let stage = "idle";
  onRuntime((rt) => { stage = rt.stage; })();
  return stage;
}

// Recalculation with stale-result greying and field errors. A change is sent at once when no
// calculation is running, otherwise the latest one waits for the running one (no fixed delay).
// The first request of a page shows the build-time answer at once when it is exactly the
// precomputed request, marked as such, until the runtime's own answer replaces it.
// fieldFor(name) maps the field a calc error names to the form's field (or null: the message
// then shows under the form).
export function runner(ui, name, onResult, fieldFor) {
  let ticket = 0;
  let hasResult = false;
  let first = true;
  let early = null;
  let running = null;
  let queued = null;
  let refused = null; // [field, message] of calc's last refusal shown at a field
  // stale: the result shown is not for the inputs; busy: their own result is on its way.
  function setStale(stale, busy = false) {
    const on = stale && hasResult;
    ui.result.classList.toggle("cw-stale", on);
    if (!on) {
      if (ui.staleNote) ui.staleNote.replaceChildren();
      ui.result.removeAttribute("aria-describedby");
      return;
    }
    const names = invalidFields(ui.formBox).map(([label]) => label);
    const what = busy ? "their result is on its way." : names.length ? "correct " + names.join(", ") + " above." :
      "see the message above.";
    fill(staleNote(ui), h("p", { class: "cw-pending", role: "note" }, h("span", { class: "cw-badge", text: "out of date" }),
      ": the result below is not for the current inputs; " + what));
    ui.result.setAttribute("aria-describedby", ui.staleNote.id);
  }
  // Where there is no result yet: what is wrong, field by field (a shared link with a bad value).
  function showPending() {
    const wrong = invalidFields(ui.formBox);
    fill(ui.result, h("p", { class: "cw-pending", text: "No result yet: correct the input above." }),
      wrong.length ? h("ul", { class: "cw-pending" }, wrong.map(([label, msg]) => h("li", {}, h("strong", { text: label }), ": ", msg))) : null);
  }
  function clearRefusal() {
    if (refused && refused[0].msg.textContent === refused[1]) refused[0].setError("");
    refused = null;
  }
  async function showEarly(my, request, answer) {
    // Settled by a real answer only: when the runtime cannot start (it may fail before the
    // precomputed answers have loaded), the build-time answer is still worth showing.
    let settled = false;
    answer.then((out) => { settled = !!out && (out.ok || !out.error || out.error.field !== "runtime"); });
    if (runtimeStage() === "ready") return;
    const data = await precomputedAnswers();
    const result = data && data.answers && data.answers[name] && data.answers[name][canonical(request)];
    if (!result || settled || my !== ticket) return;
    hasResult = true;
    onResult(result, request);
    early = h("p", { class: "cw-early-note", role: "status", text: EARLY_LOADING });
    ui.result.classList.add("cw-early");
    ui.result.prepend(early);
    performance.mark("cw-early-painted");
  }
  async function go(request, clientErrors) {
    const my = ++ticket;
    if (clientErrors) {
      setStale(true);
      if (!hasResult) showPending();
      return;
    }
    if (ui.result.classList.contains("cw-stale")) setStale(true, true);
    ui.result.setAttribute("aria-busy", "true");
    const answer = calculate(name, request);
    if (first) { first = false; await showEarly(my, request, answer); }
    const out = await answer;
    if (my !== ticket) return;
    ui.result.removeAttribute("aria-busy");
    if (out.ok) {
      ui.formMsg.textContent = "";
      clearRefusal();
      hasResult = true;
      early = null;
      ui.result.classList.remove("cw-early");
      onResult(out.result, request);
      setStale(false);
      performance.mark("cw-result-painted");
    } else if (out.error.field === "runtime") {
      // the status line above the form says that the calculator could not start, and why
      if (early) early.textContent = EARLY_FAILED;
      else if (!hasResult) fill(ui.result, h("p", { class: "cw-pending", text: NO_RUNTIME }));
      else setStale(true);
    } else {
      clearRefusal();
      const f = fieldFor ? fieldFor(out.error.field) : null;
      if (f) { f.setError(out.error.message); refused = [f, out.error.message]; }
      else ui.formMsg.textContent = out.error.message;
      setStale(true);
      if (!hasResult) showPending();
    }
  }
  async function pump() {
    while (queued) {
      const [request, clientErrors] = queued;
      queued = null;
      running = go(request, clientErrors);
      await running;
    }
    running = null;
  }
  function schedule(request, clientErrors) {
    queued = [request, clientErrors];
    if (running) ticket++; // the running answer is for older inputs: do not paint it
    else pump();
  }
  return { schedule, now: schedule };
}

// The usual wiring of a form: collect() -> {req, bad}; every input and change recalculates.
export function bindForm(ui, run, collect, events = ["input", "change"]) {
  const changed = () => { const { req, bad } = collect(); run.schedule(req, bad); };
  for (const ev of events) ui.formBox.addEventListener(ev, changed);
  const first = collect();
  run.now(first.req, first.bad);
}
