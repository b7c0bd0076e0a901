import json
import subprocess
import sys


def test_engine_imports_no_web_or_database_module() -> None:
    # The engine is pure: importing and running it must not pull in the web or storage layer.
    code = (
        "import sys, json; from screening.report import catalogue_reports; catalogue_reports();"
        "print(json.dumps(sorted(m for m in sys.modules if m.split('.')[0] in "
        "('app', 'fastapi', 'sqlalchemy', 'starlette', 'uvicorn', 'alembic', 'jinja2'))))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert json.loads(out.stdout) == []
