"""Tests of tools/bundle.py's stitcher: module order, scopes, exports into the namespace, and the
errors for the module syntax it does not take. Run: python3 -m unittest tools/bundle_test.py"""
import pathlib
import subprocess
import sys
import tempfile
import unittest

BUNDLE = pathlib.Path(__file__).resolve().parent / "bundle.py"


def run(files, entry):
    with tempfile.TemporaryDirectory() as d:
        root = pathlib.Path(d)
        for name, text in files.items():
            (root / name).write_text(text)
        out = root / "out.js"
        p = subprocess.run([sys.executable, str(BUNDLE), "--entry", str(root / entry), "--out", str(out)],
                           capture_output=True, text=True)
        return p.returncode, (out.read_text() if out.exists() else ""), p.stderr


class Stitcher(unittest.TestCase):
    def test_modules_come_after_their_imports_each_in_its_own_scope(self):
        code, text, err = run({
            "a.mjs": 'import { b } from "./b.mjs";\nconst local = 1;\nexport function a() { return b() + local; }\n',
            "b.mjs": "const local = 2;\nexport const b = () => local;\n",
        }, "a.mjs")
        self.assertEqual(code, 0, err)
        self.assertLess(text.index("// ---- "), text.index("const { b } = module_b_0"))
        self.assertIn("return { b };", text)
        self.assertIn("return { a };", text)
        self.assertIn("Object.assign(sunlot, module_a_1);", text)
        self.assertNotIn("export", text.split("do not edit")[1])
        if subprocess.run(["node", "--version"], capture_output=True).returncode == 0:
            check = subprocess.run(["node", "-e", f"globalThis.self = globalThis;\n{text}\nif (self.sunlot.a() !== 3) process.exit(1);"])
            self.assertEqual(check.returncode, 0)

    def test_syntax_it_does_not_take_is_an_error_naming_the_module(self):
        for files, says in [
            ({"a.mjs": 'import b from "./b.mjs";\n', "b.mjs": ""}, "does not take"),
            ({"a.mjs": "export default 1;\n"}, "does not take"),
            ({"a.mjs": 'import { b as c } from "./b.mjs";\n', "b.mjs": "export const b = 1;\n"}, "no renaming"),
            ({"a.mjs": 'import { c } from "./b.mjs";\n', "b.mjs": "export const b = 1;\n"}, "does not export c"),
            ({"a.mjs": 'import { b } from "./b.mjs";\nexport const a = 1;\n',
              "b.mjs": 'import { a } from "./a.mjs";\nexport const b = 1;\n'}, "cycle"),
            ({"a.mjs": 'import { b } from "./missing.mjs";\n'}, "no such module"),
        ]:
            code, _, err = run(files, "a.mjs")
            self.assertNotEqual(code, 0)
            self.assertIn(says, err)


# The smallest valid wasm module (magic and version) and a stand-in for wasm-bindgen's glue that
# records what it was given.
EMPTY_WASM = b"\0asm\x01\0\0\0"
GLUE = "let wasm_bindgen = (function () { const f = async ({ module_or_path }) => { f.got = module_or_path; }; return f; })();\n"


def run_wasm(extra):
    with tempfile.TemporaryDirectory() as d:
        root = pathlib.Path(d)
        (root / "sunlot.js").write_text(GLUE)
        (root / "sunlot_bg.wasm").write_bytes(EMPTY_WASM)
        out = root / "out.js"
        p = subprocess.run([sys.executable, str(BUNDLE), "--wasm-dir", str(root), "--out", str(out), *extra],
                           capture_output=True, text=True)
        return p.returncode, (out.read_text() if out.exists() else ""), p.stderr


@unittest.skipIf(subprocess.run(["node", "--version"], capture_output=True).returncode != 0, "node is not installed")
class WasmPart(unittest.TestCase):
    def node(self, text, check):
        p = subprocess.run(["node", "-e", f"globalThis.self = globalThis;\n{text}\n(async () => {{ {check} }})()"
                            ".catch(e => { console.error(e); process.exit(1); });"], capture_output=True, text=True)
        self.assertEqual(p.returncode, 0, p.stderr)

    def test_the_page_module_is_compiled_and_instantiated(self):
        code, text, err = run_wasm([])
        self.assertEqual(code, 0, err)
        self.node(text, "const m = await self.sunlot.ready; const c = await self.sunlot.compiled;"
                        "if (!(c instanceof WebAssembly.Module) || m.got !== c || self.sunlot.fast) process.exit(2);")

    def test_the_workers_module_is_compiled_and_left_for_the_workers(self):
        code, text, err = run_wasm(["--for-workers"])
        self.assertEqual(code, 0, err)
        self.node(text, "const f = self.sunlot.fast; const c = await f.compiled;"
                        "if (!(c instanceof WebAssembly.Module) || self.sunlot.ready || self.sunlot.compiled) process.exit(2);"
                        "const m = await f.bootModule(c); if (m.got !== c) process.exit(3);")

    def test_the_workers_module_needs_a_wasm_dir(self):
        with tempfile.TemporaryDirectory() as d:
            p = subprocess.run([sys.executable, str(BUNDLE), "--for-workers", "--out", str(pathlib.Path(d) / "o.js")],
                               capture_output=True, text=True)
        self.assertNotEqual(p.returncode, 0)
        self.assertIn("--for-workers needs --wasm-dir", p.stderr)


if __name__ == "__main__":
    unittest.main()
