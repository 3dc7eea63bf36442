// Fieldfit loader: starts the WebAssembly program, registers the service
// worker for offline use, and tells the user plainly what is happening.
// No inline script: the page's Content-Security-Policy forbids it.
"use strict";
(function () {
  var doc = document;
  var root = doc.documentElement;
  var updateRequested = false;

  function byId(id) { return doc.getElementById(id); }

  // State for people (the messages) and for tests and the app
  // (data-fieldfit: loading, running, exited, failed).
  function setState(state) { root.setAttribute("data-fieldfit", state); }

  function hideLoading() {
    var loading = byId("loading");
    if (loading) { loading.hidden = true; }
  }

  function fail(message) {
    setState("failed");
    hideLoading();
    var box = byId("load-error");
    if (box) { box.textContent = message; box.hidden = false; }
  }

  function note(message) {
    var box = byId("offline-note");
    if (box) { box.textContent = message; box.hidden = false; }
  }

  function errorText(err) {
    if (err && err.message) { return err.message; }
    return String(err);
  }

  // --- Service worker: offline use and updates. ---

  function offerUpdate(reg) {
    // Only a replacement is an update; the first install is not.
    if (!navigator.serviceWorker.controller || !reg.waiting) { return; }
    var box = byId("update-ready");
    var button = byId("update-reload");
    if (!box || !button) { return; }
    box.hidden = false;
    button.disabled = false;
    button.onclick = function () {
      updateRequested = true;
      button.disabled = true;
      if (reg.waiting) {
        reg.waiting.postMessage({ type: "fieldfit-activate" });
      } else {
        window.location.reload();
      }
    };
    try {
      window.dispatchEvent(new CustomEvent("fieldfit:update-ready"));
    } catch (e) { /* very old browsers: no CustomEvent constructor */ }
  }

  function watch(reg, worker) {
    if (!worker) { return; }
    worker.addEventListener("statechange", function () {
      if (worker.state === "installed") { offerUpdate(reg); }
    });
  }

  function setupServiceWorker() {
    if (!("serviceWorker" in navigator) || !navigator.serviceWorker) {
      root.setAttribute("data-sw", "unavailable");
      note("Offline use is not available here (private browsing, or the page was not opened over https). " +
        "Fieldfit works while this page stays open, but it will not start again without the network.");
      return;
    }
    navigator.serviceWorker.addEventListener("controllerchange", function () {
      if (updateRequested) {
        updateRequested = false;
        window.location.reload();
      }
    });
    navigator.serviceWorker.register("sw.js", { scope: "./", updateViaCache: "none" }).then(function (reg) {
      root.setAttribute("data-sw", "registered");
      if (reg.waiting) { offerUpdate(reg); }
      watch(reg, reg.installing);
      reg.addEventListener("updatefound", function () { watch(reg, reg.installing); });
      doc.addEventListener("visibilitychange", function () {
        if (doc.visibilityState === "visible") { reg.update().catch(function () {}); }
      });
      return navigator.serviceWorker.ready;
    }).then(function () {
      root.setAttribute("data-sw", "ready");
    }).catch(function (err) {
      root.setAttribute("data-sw", "failed");
      note("Offline use could not be set up (" + errorText(err) + "). " +
        "Fieldfit works while this page stays open, but it will not start again without the network.");
    });
  }

  // --- WebAssembly: the program itself. ---

  function fetchBytes() {
    return fetch("app.wasm").then(function (resp) {
      if (!resp.ok) { throw new Error("app.wasm: HTTP " + resp.status); }
      return resp.arrayBuffer();
    });
  }

  function instantiate(go) {
    if (typeof WebAssembly.instantiateStreaming === "function") {
      return WebAssembly.instantiateStreaming(fetch("app.wasm"), go.importObject).catch(function () {
        // A host that sends app.wasm with the wrong Content-Type breaks
        // streaming; reading the bytes first still works there.
        return fetchBytes().then(function (bytes) { return WebAssembly.instantiate(bytes, go.importObject); });
      });
    }
    return fetchBytes().then(function (bytes) { return WebAssembly.instantiate(bytes, go.importObject); });
  }

  // The loading message stays until the app puts something of its own
  // into <main id="app">.
  function watchApp() {
    var app = byId("app");
    if (!app || typeof MutationObserver !== "function") { return; }
    var own = { "loading": true, "load-error": true };
    var observer = new MutationObserver(function (records) {
      for (var i = 0; i < records.length; i++) {
        var added = records[i].addedNodes;
        for (var j = 0; j < added.length; j++) {
          if (added[j].nodeType === 1 && !own[added[j].id]) {
            hideLoading();
            observer.disconnect();
            return;
          }
        }
      }
    });
    observer.observe(app, { childList: true });
  }

  function start() {
    if (typeof WebAssembly !== "object" || typeof WebAssembly.instantiate !== "function") {
      fail("This browser cannot run WebAssembly, which Fieldfit needs. " +
        "Use a current Safari (iPadOS 16 or later) or Chrome, and turn off any setting that blocks WebAssembly.");
      return;
    }
    if (typeof Go !== "function") {
      fail("A part of Fieldfit (wasm_exec.js) did not load. Reload the page; if this persists, remove the site's stored data and open it again while online.");
      return;
    }
    var go = new Go();
    instantiate(go).then(function (result) {
      // run() executes the program until it first waits, then returns a
      // promise that settles only when the program ends.
      watchApp();
      var ended = go.run(result.instance);
      setState("running");
      ended.then(function () {
        fail("Fieldfit stopped unexpectedly. Your saved projects are kept on this device; reload the page to start again.");
        setState("exited");
      });
    }).catch(function (err) {
      fail("Fieldfit could not start: " + errorText(err) + ". Reload the page to try again.");
    });
  }

  setupServiceWorker();
  start();
})();
