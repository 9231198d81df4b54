// sunlot's worker for pages served over http(s): runs one long call of the module off the page's
// thread. Built into www/build/sunlot-worker.js beside sunlot.bundle.js; the widgets start it from
// there (same origin), so a strict Content-Security-Policy (worker-src falling back to script-src
// 'self') allows it. From disk (file://) the widgets make the same worker from a Blob URL instead.
// Messages: {fn, input} in; {progress}, then {result} or {error} out.
importScripts("sunlot.bundle.js");
self.onmessage = async e => {
  const m = await self.sunlot;
  try {
    const out = m[e.data.fn](e.data.input, f => { self.postMessage({ progress: f }); return true; });
    self.postMessage({ result: out });
  } catch (err) { self.postMessage({ error: String(err && err.message ? err.message : err) }); }
};
