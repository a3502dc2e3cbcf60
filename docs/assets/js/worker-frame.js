// The frame that runs one worker script for file-worker.js on a page opened from the file
// system. The worker script finds what it expects of a worker: postMessage() sends to the page,
// "message" events bring the page's messages, importScripts() loads more scripts. Only scripts
// of this site, and only on file:// pages.
(function () {
  "use strict";
  var siteRoot = new URL("../../", location.href).href;
  var channel = new MessageChannel();
  var port = channel.port1;

  function load(url) {
    return new Promise(function (resolve, reject) {
      var script = document.createElement("script");
      script.src = url;
      script.onload = resolve;
      script.onerror = function () { reject(new Error("cannot load " + url)); };
      document.head.append(script);
    });
  }

  function checked(url) {
    var href = new URL(url, src).href;
    if (href.indexOf(siteRoot) !== 0) throw new Error("not a script of this site: " + href);
    return href;
  }

  var src = new URLSearchParams(location.search).get("worker") || "";
  window.postMessage = function (data) { port.postMessage({ kind: "message", data: data }); };
  window.importScripts = function () {
    var urls = Array.prototype.slice.call(arguments);
    return urls.reduce(function (done, url) {
      return done.then(function () { return load(checked(url)); });
    }, Promise.resolve());
  };
  port.onmessage = function (event) {
    window.dispatchEvent(new MessageEvent("message", { data: event.data }));
  };
  window.addEventListener("error", function (event) { port.postMessage({ kind: "error", message: event.message }); });
  if (location.protocol !== "file:" || window.parent === window) return;
  var host = window.parent;
  host.postMessage({ couplewiseFrame: "port" }, "*", [channel.port2]);
  // A worker has no parent; a script that looks into it would hit the page's other origin
  // (every file:// page is an origin of its own). parent is replaceable: hide it.
  window.parent = undefined;
  Promise.resolve().then(function () { return load(checked(src)); }).then(
    function () { port.postMessage({ kind: "ready" }); },
    function (err) { port.postMessage({ kind: "error", message: String(err && err.message ? err.message : err) }); });
})();
