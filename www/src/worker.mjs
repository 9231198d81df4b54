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

/** The workers' module (www/build/sunlot-fast.js beside the bundle: the same code built for speed),
 * or null where it is missing or fails (then the workers run the page's own module) and on pages
 * served over http(s) (the worker script file loads it itself). */
let fast = null;
/** Loads the workers' module once (a classic script, so it works from file://); resolves to
 * {compiled, bootModule} or null. Called when the first long call is made, or earlier to have it
 * ready (the page calls it after its first drawing). */
export function workerModule() {
  if (fast) return fast;
  fast = new Promise(resolve => {
    // Served, the worker script loads it itself: the page need not.
    if (!BUNDLE || servedHere()) { resolve(null); return; }
    const script = document.createElement("script");
    script.src = new URL("sunlot-fast.js", BUNDLE.src).href;
    script.onload = () => {
      const f = self.sunlot.fast;
      if (!f) { resolve(null); return; }
      f.compiled.then(compiled => resolve({ compiled, bootModule: f.bootModule }), () => resolve(null));
    };
    script.onerror = () => resolve(null);
    document.head.appendChild(script);
  });
  return fast;
}

/** Which module the last worker ran: "fast" (the workers' module), "page" (the page's own) or
 * "served" (the worker script file, which loads the workers' module itself). */
export const workerRuns = { last: null };

/** From disk (file://) a worker can only be made from a Blob URL; served over http(s), the worker is
 * the script file beside the bundle (same origin), so a strict Content-Security-Policy without blob:
 * in worker-src (script-src 'self') allows it; that script loads the workers' module itself. */
const servedHere = () => location.protocol !== "file:" && WORKER_URL && new URL(WORKER_URL).origin === location.origin;

/** A worker running the module `module` ({compiled, bootModule} or null: the page's own), booting
 * at once: {worker, url, kind}. The Blob worker's source is the wasm-bindgen glue alone; it gets the
 * module compiled on the page (a WebAssembly.Module is shared, not copied), so it neither decodes
 * nor compiles. */
function spawn(module) {
  const served = servedHere();
  const kind = served ? "served" : module ? "fast" : "page";
  const url = served ? WORKER_URL : URL.createObjectURL(new Blob([
    `(${serveWorker.toString()})(${(module ? module.bootModule : self.sunlot.bootModule).toString()});`],
  { type: "text/javascript" }));
  const worker = new Worker(url);
  const compiled = served ? Promise.resolve(undefined) : module ? Promise.resolve(module.compiled) : self.sunlot.compiled;
  return { worker, url, kind, served, compiled };
}

/** Workers started ahead of the calls (booted, waiting), and how many to keep so. */
const ahead = [];
let aheadWanted = 0;
function fillAhead() {
  if (ahead.length >= aheadWanted) return;
  workerModule().then(module => {
    while (ahead.length < aheadWanted) {
      const w = spawn(module);
      w.compiled.then(compiled => w.worker.postMessage({ compiled }), () => {});
      ahead.push(w);
    }
  });
}

/** Keeps `n` workers started ahead of the long calls (0 to stop), so a call skips a worker's
 * start-up (tens of milliseconds: the script, the instance). Each holds an instance of the module;
 * a call takes one and another is started after the call ends. */
export function startWorkersAhead(n) {
  aheadWanted = Math.max(0, Math.min(8, Math.floor(n) || 0));
  while (ahead.length > aheadWanted) {
    const w = ahead.pop();
    w.worker.terminate();
    if (!w.served) URL.revokeObjectURL(w.url);
  }
  fillAhead();
}

/**
 * Runs one long call (`mapOfKind`, `sunHoursMap`, `compareMap`, `insolationMap`, `solarEnvelope`, …)
 * in a Web Worker. Returns { promise, cancel }: `onProgress(fraction)` is called as the work goes;
 * `cancel()` stops the worker at once and rejects with a CancelledError.
 */
export function runInWorker(fn, input, onProgress) {
  let w = null, resolve, reject, done = false;
  const promise = new Promise((res, rej) => { resolve = res; reject = rej; });
  const end = () => {
    done = true;
    if (w) {
      w.worker.terminate();
      if (!w.served) URL.revokeObjectURL(w.url);
      if (aheadWanted) setTimeout(fillAhead, 0);
    }
  };
  const start = module => {
    if (done) return;
    const kind = servedHere() ? "served" : module ? "fast" : "page";
    const i = ahead.findIndex(a => a.kind === kind);
    w = i >= 0 ? ahead.splice(i, 1)[0] : spawn(module);
    workerRuns.last = kind;
    w.worker.onmessage = e => {
      if (e.data.progress !== undefined) { if (onProgress) onProgress(e.data.progress); return; }
      end();
      if (e.data.error !== undefined) reject(new Error(e.data.error)); else resolve(e.data.result);
    };
    w.worker.onerror = e => { end(); reject(new Error(e.message || "worker failed")); };
    w.compiled.then(compiled => { if (!done) w.worker.postMessage({ fn, input, compiled }); }, e => { end(); reject(e); });
  };
  if (servedHere()) start(null); else workerModule().then(start);
  return { promise, cancel() { if (done) return; end(); reject(new CancelledError()); } };
}
