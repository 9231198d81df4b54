// What the module's bundle (www/build/sunlot.bundle.js, without the widgets) adds to the namespace
// `sunlot` besides `ready` and `boot`: the worker loop, which www/worker.js runs.
import { serveWorker } from "./serve.mjs";

export { serveWorker };
