// Long calls of the module in a Web Worker, so the page stays responsive, with progress and cancel.
import { serveWorker } from "./serve.mjs";

/** The rejection of a call that was cancelled (`cancel()` of runInWorker). */
export class CancelledError extends Error {
  constructor() { super("cancelled"); this.name = "CancelledError"; }
}

/** The worker script beside this bundle (www/build/sunlot-worker.js), for pages served over http(s). */
const BUNDLE = typeof document !== "undefined"
  && document.querySelector('script[src$="sunlot.bundle.js"], script[src$="sunlot-widgets.bundle.js"]');
const WORKER_URL = BUNDLE ? new URL("sunlot-worker.js", BUNDLE.src).href : null;

/**
 * Runs one long call (`mapOfKind`, `sunHoursMap`, `compareMap`, `insolationMap`, `solarEnvelope`, …)
 * in a Web Worker. Returns { promise, cancel }: `onProgress(fraction)` is called as the work goes;
 * `cancel()` stops the worker at once and rejects with a CancelledError.
 */
export function runInWorker(fn, input, onProgress) {
  // From disk (file://) a worker can only be made from a Blob URL; served over http(s), the worker is
  // the script file beside the bundle (same origin), so a strict Content-Security-Policy without
  // blob: in worker-src (script-src 'self') allows it.
  const served = location.protocol !== "file:" && WORKER_URL && new URL(WORKER_URL).origin === location.origin;
  // The Blob worker's source is the wasm-bindgen glue alone; it gets the module the page compiled
  // with the call (a WebAssembly.Module is shared, not copied), so it neither decodes nor compiles.
  const url = served ? WORKER_URL
    : URL.createObjectURL(new Blob([`(${serveWorker.toString()})(${self.sunlot.bootModule.toString()});`],
      { type: "text/javascript" }));
  const worker = new Worker(url);
  let reject, done = false;
  const end = () => { done = true; worker.terminate(); if (!served) URL.revokeObjectURL(url); };
  const promise = new Promise((res, rej) => {
    reject = rej;
    worker.onmessage = e => {
      if (e.data.progress !== undefined) { if (onProgress) onProgress(e.data.progress); return; }
      end();
      if (e.data.error !== undefined) rej(new Error(e.data.error)); else res(e.data.result);
    };
    worker.onerror = e => { end(); rej(new Error(e.message || "worker failed")); };
  });
  if (served) worker.postMessage({ fn, input });
  else self.sunlot.compiled.then(compiled => worker.postMessage({ fn, input, compiled }), e => { end(); reject(e); });
  return { promise, cancel() { if (done) return; end(); reject(new CancelledError()); } };
}
