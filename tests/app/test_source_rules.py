"""Rules read from the source: SQL only with bound parameters, escaping never switched off."""

import ast
import re
from pathlib import Path

from app.main import make_templates
from tests.conftest import REPO_ROOT

SQL_CALLS = {"text", "exec_driver_sql", "execute", "executemany", "executescript"}
"""Functions and methods that take SQL text as their first argument."""
HTML_SINKS = re.compile(r"innerHTML|outerHTML|insertAdjacentHTML|document\.write|\beval\(|"
                        r"new Function\(|setTimeout\(\s*['\"]")


def python_files() -> list[Path]:
    return sorted([*(REPO_ROOT / "app").rglob("*.py"), *(REPO_ROOT / "screening").rglob("*.py")])


def formatted_sql(tree: ast.AST) -> list[int]:
    """Lines where SQL text is built by formatting: f-string, %, + or .format()."""
    found = []
    for node in ast.walk(tree):
        if not (isinstance(node, ast.Call) and node.args):
            continue
        name = getattr(node.func, "attr", None) or getattr(node.func, "id", None)
        if name not in SQL_CALLS:
            continue
        sql = node.args[0]
        built = (isinstance(sql, ast.JoinedStr)
                 or (isinstance(sql, ast.BinOp) and isinstance(sql.op, ast.Mod | ast.Add))
                 or (isinstance(sql, ast.Call) and getattr(sql.func, "attr", "") == "format"))
        if built:
            found.append(node.lineno)
    return found


def test_the_scan_finds_formatted_sql() -> None:
    for bad in ('conn.execute(f"SELECT * FROM t WHERE a = {x}")', 'text("... %s" % x)',
                'session.execute(text("a = " + x))', 'c.exec_driver_sql("{}".format(x))'):
        assert formatted_sql(ast.parse(bad)), bad
    assert not formatted_sql(ast.parse('conn.execute(text("SELECT 1 WHERE a = :a"), {"a": x})'))


def test_no_sql_is_formatted_from_values() -> None:
    offenders = {str(path.relative_to(REPO_ROOT)): lines for path in python_files()
                 if (lines := formatted_sql(ast.parse(path.read_text(encoding="utf-8"))))}
    assert len(python_files()) > 50
    assert not offenders, f"SQL built by formatting (bind parameters instead): {offenders}"


def test_templates_autoescape_and_never_mark_text_safe(settings) -> None:
    env = make_templates(settings).env
    for name in env.list_templates(extensions=["html"]):
        assert env.autoescape is True or env.autoescape(name), name
        source = (REPO_ROOT / "templates" / name).read_text(encoding="utf-8")
        assert not re.search(r"\|\s*safe\b|autoescape\s+false|Markup", source), name
    rendered = env.from_string("{{ x }}").render(x="<script>alert(1)</script>")
    assert rendered == "&lt;script&gt;alert(1)&lt;/script&gt;"


def test_scripts_never_insert_markup() -> None:
    for path in sorted((REPO_ROOT / "static").glob("*.js")):
        found = HTML_SINKS.findall(path.read_text(encoding="utf-8"))
        assert not found, f"{path.name} uses {found}: insert user text with textContent"


def test_templates_have_no_inline_scripts_or_handlers() -> None:
    # The content security policy runs only script files of the app's own origin.
    for path in sorted((REPO_ROOT / "templates").glob("*.html")):
        source = path.read_text(encoding="utf-8")
        assert not re.search(r"\son[a-z]+\s*=", source), path.name
        assert not re.search(r"javascript:", source, re.IGNORECASE), path.name
        for tag in re.findall(r"<script\b[^>]*>", source):
            assert "src=" in tag or 'type="application/json"' in tag, (path.name, tag)


def test_only_the_write_helper_commits() -> None:
    # Every change is one transaction taken with the write lock: `app.writes.writing`.
    for path in sorted((REPO_ROOT / "app").rglob("*.py")):
        if path.name != "writes.py":
            assert ".commit()" not in path.read_text(encoding="utf-8"), path.name
