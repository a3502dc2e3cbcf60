// On pages opened from the file system (file://) browsers refuse to start a Web Worker, so
// mkdocs-material's search could not run there. This stand-in, loaded before material's bundle,
// runs a worker script from the site in a hidden frame (worker-frame.html) and passes messages
// over a MessageChannel as a worker would. No inline script anywhere, so the pages'
// Content-Security-Policy holds. Over HTTP(S) it does nothing.
(function () {
  "use strict";
  if (location.protocol !== "file:") return;
  var frameURL = new URL("worker-frame.html", document.currentScript.src);

  class FrameWorker extends EventTarget {
    constructor(url) {
      super();
      this.onmessage = null;
      this.onerror = null;
      this.port = null;
      this.queue = [];
      var frame = document.createElement("iframe");
      frame.hidden = true;
      frame.title = "search";
      frame.src = frameURL.href + "?worker=" + encodeURIComponent(new URL(String(url), location.href).href);
      this.frame = frame;
      this.listener = (event) => {
        if (event.source !== frame.contentWindow || !event.data || event.data.couplewiseFrame !== "port") return;
        window.removeEventListener("message", this.listener);
        this.port = event.ports[0];
        this.port.onmessage = (e) => this.receive(e.data || {});
      };
      window.addEventListener("message", this.listener);
      document.body.append(frame);
    }

    receive(msg) {
      if (msg.kind === "ready") {
        const queued = this.queue;
        this.queue = null;
        for (const data of queued) this.port.postMessage(data);
      } else if (msg.kind === "message") {
        const event = new MessageEvent("message", { data: msg.data });
        this.dispatchEvent(event);
        if (typeof this.onmessage === "function") this.onmessage(event);
      } else if (msg.kind === "error") {
        const event = new ErrorEvent("error", { message: msg.message });
        this.dispatchEvent(event);
        if (typeof this.onerror === "function") this.onerror(event);
      }
    }

    postMessage(data) {
      if (this.queue) this.queue.push(data);
      else this.port.postMessage(data);
    }

    terminate() {
      window.removeEventListener("message", this.listener);
      if (this.port) this.port.close();
      this.frame.remove();
    }
  }

  window.Worker = FrameWorker;
})();
