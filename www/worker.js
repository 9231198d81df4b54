// sunlot's worker for pages served over http(s): runs one long call of the module off the page's
// thread. Built into www/build/sunlot-worker.js beside sunlot.bundle.js and sunlot-fast.js; the
// widgets start it from there (same origin), so a strict Content-Security-Policy (worker-src falling
// back to script-src 'self') allows it. It runs the workers' module (sunlot-fast.js: the same code
// built for speed), or the page's (sunlot.bundle.js) where that is missing. From disk (file://) the
// widgets make the same worker from a Blob URL instead; both run the one loop, sunlot.serveWorker
// (www/src/serve.mjs).
let boot;
try {
  importScripts("sunlot-fast.js");
  boot = () => self.sunlot.fast.compiled.then(self.sunlot.fast.bootModule);
} catch (e) {
  importScripts("sunlot.bundle.js");
  boot = () => self.sunlot.ready;
}
self.sunlot.serveWorker(boot);
