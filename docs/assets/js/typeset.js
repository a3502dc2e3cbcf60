// Typesetting of the mathematics written in the pages (docs/methods.md). The markdown extension
// pymdownx.arithmatex (generic mode, mkdocs.yml) leaves each formula as its TeX source in
// <span class="arithmatex">\(...\)</span> or <div class="arithmatex">\[...\]</div>; this
// script has KaTeX, served from the site itself (katex/, staged from the npm package by
// sitebuild/mathstage.py), set them on the page.
//
// A classic script on purpose, so the maths is set on pages opened from a file manager too
// (browsers refuse module scripts there). KaTeX is loaded only by a page that has maths.
// katex.render() builds DOM nodes and sets their styles through the CSSOM, which the site's
// Content-Security-Policy (style-src 'self') allows; the HTML of katex.renderToString() carries
// style="" attributes, which it blocks, so it is never used.
(function () {
  "use strict";
  var base = new URL("../../katex/", document.currentScript.src);
  var loading = null;

  function add(tag, attrs) {
    return new Promise(function (resolve, reject) {
      var el = document.createElement(tag);
      for (var k in attrs) el.setAttribute(k, attrs[k]);
      el.addEventListener("load", resolve);
      el.addEventListener("error", function () { reject(new Error(attrs.href || attrs.src)); });
      document.head.append(el);
    });
  }

  function katexReady() {
    if (window.katex) return Promise.resolve(window.katex);
    if (!loading) {
      loading = Promise.all([
        add("link", { rel: "stylesheet", href: new URL("katex.min.css", base).href }),
        add("script", { src: new URL("katex.min.js", base).href }),
      ]).then(function () { return window.katex; });
      loading.catch(function () { loading = null; });
    }
    return loading;
  }

  // The TeX of one formula and whether it is a display (block) formula.
  function source(el) {
    var text = el.textContent.trim();
    var m = /^\\\(([\s\S]*)\\\)$/.exec(text) || /^\\\[([\s\S]*)\\\]$/.exec(text);
    return { tex: m ? m[1] : text, display: el.tagName === "DIV" || /^\\\[/.test(text) };
  }

  function typeset() {
    var todo = [].slice.call(document.querySelectorAll(".arithmatex:not(.cw-math-done):not(.cw-math-pending)"));
    if (!todo.length) return;
    todo.forEach(function (el) { el.classList.add("cw-math-pending"); });
    katexReady().then(function (katex) {
      todo.forEach(function (el) {
        var f = source(el);
        try {
          katex.render(f.tex, el, { displayMode: f.display, throwOnError: true, output: "htmlAndMathml" });
          el.classList.add("cw-math-done");
        } catch (err) {
          el.classList.add("cw-math-failed"); // the TeX source stays readable
          console.warn("formula not typeset: " + f.tex + ": " + err.message);
        }
        el.classList.remove("cw-math-pending");
      });
      document.documentElement.dataset.cwMath = "done";
    }, function (err) {
      todo.forEach(function (el) { el.classList.remove("cw-math-pending"); el.classList.add("cw-math-failed"); });
      document.documentElement.dataset.cwMath = "failed";
      console.warn("KaTeX could not be loaded: " + err.message);
    });
  }

  // Now (the script comes after the content), and whenever the theme's instant navigation swaps
  // the page content without loading a new document (its document$ does not emit on file://).
  typeset();
  if (window.document$ && typeof window.document$.subscribe === "function") window.document$.subscribe(typeset);
})();
