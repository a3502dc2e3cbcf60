// Couplewise pages opened from a file manager (file://). A classic script on purpose: browsers
// refuse module scripts on file:// pages, so couplewise.mjs never runs there, and no calculator
// can start (the Python runtime needs the site served over HTTP). This script
//  1. replaces each calculator with a plain notice and the one command that serves the site;
//  2. makes links to folders open the folder's index.html (a browser shows a folder listing
//     for a file:// folder), so the reference pages and the search results can be followed.
// Over HTTP(S) it does nothing.
(function () {
  "use strict";
  if (location.protocol !== "file:") return;

  var siteRoot = new URL("../../", document.currentScript.src);

  function fixLink(a) {
    var url;
    try { url = new URL(a.href); } catch (err) { return; }
    if (url.protocol !== "file:" || url.pathname.slice(-1) !== "/") return;
    url.pathname += "index.html";
    a.href = url.href;
  }

  function fixFromEvent(event) {
    var a = event.target instanceof Element ? event.target.closest("a[href]") : null;
    if (a) fixLink(a);
  }

  // The folder as the user's system writes it: /home/me/couplewise or C:\Users\me\couplewise.
  function localPath(url) {
    var path = decodeURIComponent(url.pathname).replace(/\/$/, "");
    if (/^\/[A-Za-z]:/.test(path)) path = path.slice(1).replace(/\//g, "\\");
    return path || "/";
  }

  function el(tag, className, text) {
    var node = document.createElement(tag);
    if (className) node.className = className;
    if (text) node.textContent = text;
    return node;
  }

  function notice(root) {
    var page = location.href.slice(siteRoot.href.length).replace(/index\.html$/, "");
    var command = "python3 -m http.server --bind 127.0.0.1 8000 --directory \"" + localPath(siteRoot) + "\"";
    var box = el("div", "admonition warning cw-file-notice");
    box.setAttribute("role", "alert");
    var pre = el("pre");
    var code = el("code", null, command);
    code.style.whiteSpace = "pre-wrap"; // the folder can be long: wrap rather than hide it
    code.style.wordBreak = "break-all";
    pre.append(code);
    box.append(
      el("p", "admonition-title", "This calculator cannot run from a file"),
      el("p", null, "Browsers do not let the Python runtime start on a page opened from the file manager. " +
        "Serve the site with this one command (on Windows write py instead of python3):"),
      pre,
      el("p", null, "then open http://127.0.0.1:8000/" + page + " in the browser. " +
        "The reference pages and the search work from the file as they are."));
    root.replaceChildren(box);
  }

  document.querySelectorAll("a[href]").forEach(fixLink);
  // Links made later (search results, for one) are fixed as they are followed or focused.
  ["click", "auxclick", "focusin"].forEach(function (type) {
    document.addEventListener(type, fixFromEvent, true);
  });
  document.querySelectorAll("[data-cw-calc]").forEach(notice);
})();
