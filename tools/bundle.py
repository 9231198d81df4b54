"""Writes sunlot's classic scripts for pages opened straight from disk (file://, where browsers refuse
ES modules and fetch): the JavaScript sources are ES modules (www/src/*.mjs), stitched here into one
classic script, each module in its own function scope, in the order of their imports. With
`--wasm-dir`, the script starts with wasm-bindgen's no-modules glue and the wasm bytes inlined,
gzip-compressed and base64-encoded (inflated by the browser's DecompressionStream as it compiles).

Everything lands in one global namespace, `self.sunlot`: `sunlot.ready` (a promise of the module's
functions) and `sunlot.boot()` (another instance of the module), `sunlot.compiled` (a promise of the compiled
WebAssembly.Module) and `sunlot.bootModule(compiled)` (an instance from it: what Blob workers run)
from the wasm part, then
the entry module's exports. With `--for-workers`, the wasm part is the second, speed-built module for
the widgets' workers: it sets `sunlot.fast = {compiled, bootModule}` (no instance on the page).

The stitcher takes the module syntax the sources use and nothing else: `import { a, b } from
"./x.mjs";` (relative paths, no renaming), `export function|class|const|let NAME` and
`export { a, b };`. Anything else (default exports, `import *`, bare specifiers, cycles) is an error.

Usage: python3 tools/bundle.py --out <bundle path> [--wasm-dir <wasm-bindgen no-modules out dir>]
                               [--for-workers] [--entry <module.mjs>]
"""
import argparse
import base64
import gzip
import pathlib
import re
import sys

IMPORT = re.compile(r'^import\s*\{([^}]*)\}\s*from\s*"(\.{1,2}/[^"]+\.mjs)";[ \t]*$', re.M)
EXPORT_DECL = re.compile(r"^export\s+(?:async\s+)?(function\*?|class|const|let)\s+([A-Za-z_$][\w$]*)", re.M)
EXPORT_LIST = re.compile(r"^export\s*\{([^}]*)\};[ \t]*$", re.M)
NAME = re.compile(r"^[A-Za-z_$][\w$]*$")


def fail(path, message):
    sys.exit(f"bundle: {path}: {message}")


def names(text, path):
    out = [n.strip() for n in text.split(",") if n.strip()]
    for n in out:
        if not NAME.match(n):
            fail(path, f"{n!r}: only plain names are stitched (no renaming)")
    return out


class Module:
    def __init__(self, path):
        self.path = path
        source = path.read_text()
        self.imports = [(names(m.group(1), path), (path.parent / m.group(2)).resolve()) for m in IMPORT.finditer(source)]
        body = IMPORT.sub("", source)
        self.exports = [m.group(2) for m in EXPORT_DECL.finditer(body)]
        self.exports += [n for m in EXPORT_LIST.finditer(body) for n in names(m.group(1), path)]
        body = EXPORT_LIST.sub("", EXPORT_DECL.sub(lambda m: m.group(0)[len("export"):].lstrip(), body))
        for word in ("import", "export"):
            left = re.search(rf"^\s*{word}\b.*$", body, re.M)
            if left:
                fail(path, f"module syntax the stitcher does not take: {left.group(0).strip()!r}")
        self.body = body


def ordered(entry):
    """The modules `entry` needs, each after the modules it imports."""
    done, out, visiting = {}, [], set()

    def visit(path):
        if path in done:
            return
        if path in visiting:
            fail(path, "imports itself through a cycle")
        visiting.add(path)
        if not path.is_file():
            fail(path, "no such module")
        module = Module(path)
        for wanted, dep in module.imports:
            visit(dep)
            missing = [n for n in wanted if n not in done[dep].exports]
            if missing:
                fail(path, f"{dep.name} does not export {', '.join(missing)}")
        visiting.discard(path)
        done[path] = module
        out.append(module)

    visit(entry.resolve())
    return out


def stitch(entry, root):
    modules = ordered(entry)
    ident = {m.path: f"module_{re.sub(r'[^A-Za-z0-9]', '_', m.path.stem)}_{i}" for i, m in enumerate(modules)}
    parts = []
    for m in modules:
        header = "".join(f"const {{ {', '.join(n)} }} = {ident[dep]};\n" for n, dep in m.imports)
        rel = m.path.relative_to(root) if m.path.is_relative_to(root) else m.path
        parts.append(f"// ---- {rel}\nconst {ident[m.path]} = (function () {{\n\"use strict\";\n{header}{m.body.strip()}\n"
                     f"return {{ {', '.join(m.exports)} }};\n}})();\n")
    parts.append(f"Object.assign(sunlot, {ident[modules[-1].path]});\n")
    return "".join(parts)


def wasm_part(src, for_workers=False):
    glue = (src / "sunlot.js").read_text()
    # gzip-compressed (a third of the text for the browser to read), inflated by the browser's own
    # DecompressionStream straight into a streaming compile. mtime 0: the same bytes every build.
    wasm = base64.b64encode(gzip.compress((src / "sunlot_bg.wasm").read_bytes(), 9, mtime=0)).decode()
    return f"""// One instance of the module from a compiled WebAssembly.Module: self-contained (its source is
// what a Blob worker gets, with the compiled module posted to it, so a worker neither decodes nor
// compiles the wasm again).
function bootModule(compiled) {{
{glue}
return wasm_bindgen({{ module_or_path: compiled }}).then(() => wasm_bindgen);
}}
const b64 = "{wasm}";
let bytes;
if (Uint8Array.fromBase64) bytes = Uint8Array.fromBase64(b64); else {{
  const text = atob(b64);
  bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
}}
const compiled = typeof DecompressionStream === "undefined"
  ? Promise.reject(new Error("this browser has no DecompressionStream (Chrome 80, Firefox 113, Safari 16.4 or later needed)"))
  : WebAssembly.compileStreaming(new Response(new Blob([bytes]).stream().pipeThrough(new DecompressionStream("gzip")),
    {{ headers: {{ "Content-Type": "application/wasm" }} }}));
""" + ("""// The workers' module: compiled here, instantiated only in the workers it is posted to.
sunlot.fast = { compiled, bootModule };
""" if for_workers else """sunlot.compiled = compiled;
sunlot.bootModule = bootModule;
sunlot.boot = () => sunlot.compiled.then(bootModule);
sunlot.ready = sunlot.boot();
""")


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--out", required=True, type=pathlib.Path)
    ap.add_argument("--wasm-dir", type=pathlib.Path)
    ap.add_argument("--for-workers", action="store_true")
    ap.add_argument("--entry", type=pathlib.Path)
    a = ap.parse_args()
    root = pathlib.Path(__file__).resolve().parent.parent
    if a.for_workers and not a.wasm_dir:
        fail(a.out, "--for-workers needs --wasm-dir")
    module = "the workers' speed-built wasm module" if a.for_workers else "the wasm module"
    what = " + ".join(x for x in [module if a.wasm_dir else "", str(a.entry or "")] if x)
    text = (f"// sunlot: classic script ({what}). Generated by tools/bundle.py from the ES modules in www/src;\n"
            "// do not edit. Everything is in one global namespace, `sunlot` (see tools/bundle.py).\n"
            "(function (scope) {\nconst sunlot = scope.sunlot || (scope.sunlot = {});\n")
    if a.wasm_dir:
        text += wasm_part(a.wasm_dir, a.for_workers)
    if a.entry:
        text += stitch(a.entry, root)
    text += "})(self);\n"
    a.out.parent.mkdir(parents=True, exist_ok=True)
    a.out.write_text(text)
    print(f"{a.out}: {len(text.encode())} bytes")


if __name__ == "__main__":
    main()
