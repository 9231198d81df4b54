// The worker side of the widgets' long calls, one loop for both workers: the script file beside the
// bundle (www/worker.js, for pages served over http(s)) and the worker made from a Blob URL (pages
// opened from disk), which gets this function's source.
// Messages: {fn, input, compiled?} in; {progress}, then {result} or {error} out. A message without
// `fn` only boots the module (a worker started ahead of its call).

/** Answers the page's messages with calls of the module `boot(compiled)` resolves to (`compiled`:
 * the WebAssembly.Module the page posts with the call, or none). Self-contained (its source is sent
 * to a Blob worker as it is). */
export function serveWorker(boot) {
  // A worker started ahead of its call runs a small map of the demo site once booted (a few
  // milliseconds), so the browser has compiled the map code before the page's first long call.
  const warmUp = m => {
    try { m.sunHoursMap({ site: m.demoSiteText(), cellM: 4, date: "2026-06-21", stepMin: 60 }); } catch (err) { /* a warm-up only */ }
  };
  let ready;
  self.onmessage = async e => {
    const m = await (ready ||= boot(e.data.compiled));
    if (e.data.fn === undefined) { warmUp(m); return; } // started ahead of its call: booted, it waits
    try {
      const out = m[e.data.fn](e.data.input, f => { self.postMessage({ progress: f }); return true; });
      // A map's cells go to the page as they are (moved, not copied).
      self.postMessage({ result: out }, out && out.values instanceof Float64Array ? [out.values.buffer] : []);
    } catch (err) { self.postMessage({ error: String(err && err.message ? err.message : err) }); }
  };
}
