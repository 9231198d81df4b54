// What the end-to-end tests and benches/page_speed.mjs share: Debian's headless Chromium started
// with the flags that run it as root without a GPU or network chatter (playwright-core drives it;
// no browser is downloaded), the repository's root, and a blank page loading the classic bundle.
import { chromium } from "playwright-core";
import { fileURLToPath, pathToFileURL } from "node:url";
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
/** Where the tests write screenshots, exports and generated pages. */
export const out = path.join(root, "target", "e2e");

/** Starts headless Chromium. */
export function launch() {
  return chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: ["--headless=new", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
           "--disable-component-update", "--disable-sync", "--no-first-run"],
  });
}

/** The file:// URL of a blank page `name`.html in target/e2e that loads www/build/sunlot.bundle.js. */
export function bundlePage(name) {
  mkdirSync(out, { recursive: true });
  const html = path.join(out, `${name}.html`);
  writeFileSync(html, `<!doctype html><meta charset="utf-8"><title>${name}</title>
<script src="${pathToFileURL(path.join(root, "www", "build", "sunlot.bundle.js")).href}"></script>`);
  return pathToFileURL(html).href;
}
