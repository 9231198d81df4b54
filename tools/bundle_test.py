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


if __name__ == "__main__":
    unittest.main()
