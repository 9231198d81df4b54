// sunlot's worker for pages served over http(s): runs one long call of the module off the page's
// thread. Built into www/build/sunlot-worker.js beside sunlot.bundle.js; the widgets start it from
// there (same origin), so a strict Content-Security-Policy (worker-src falling back to script-src
// 'self') allows it. From disk (file://) the widgets make the same worker from a Blob URL instead;
// both run the one loop, sunlot.serveWorker (www/src/serve.mjs).
importScripts("sunlot.bundle.js");
self.sunlot.serveWorker(() => self.sunlot.ready);
