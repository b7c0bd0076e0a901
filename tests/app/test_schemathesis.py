"""Schema-driven fuzzing: schemathesis generates requests from the app's own OpenAPI document.

Every operation of `/api/openapi.json` is called with generated data (valid and invalid) on an
app of its own with a temporary database; state-changing requests carry the install's token.
Checked: no server error (`not_a_server_error`) and every answer matches the response schema
the document declares (`response_schema_conformance`), except for 422 answers (see `_fuzz`).
Bounded: a few examples per operation and mode, a timeout on every call (about 20 s in all).
"""

from __future__ import annotations

import shutil
from collections import Counter
from pathlib import Path
from typing import Any

import pytest
import schemathesis
from hypothesis import HealthCheck, given, settings
from hypothesis.errors import Unsatisfiable
from schemathesis import GenerationMode
from schemathesis.checks import not_a_server_error
from schemathesis.specs.openapi.checks import response_schema_conformance

from tests.conftest import TEST_HOST, csrf_headers

CALL_TIMEOUT_S = 20.0
"""Longest wait for one answer: a slow request fails the test instead of hanging it."""
EXAMPLES = 10
"""Generated cases per operation and mode (positive, negative)."""
CHECKS = [not_a_server_error, response_schema_conformance]


@pytest.fixture(scope="module")
def api(seeded_db_template: Path, tmp_path_factory: pytest.TempPathFactory) -> Any:
    """The app on a database of its own (the fuzzing writes to it)."""
    from app.config import Settings
    from app.main import create_app

    db = tmp_path_factory.mktemp("schemathesis") / "bondgap.db"
    shutil.copyfile(seeded_db_template, db)
    return create_app(Settings(db_path=db, allowed_hosts=(TEST_HOST,)))


@pytest.fixture(scope="module")
def api_schema(api: Any) -> Any:
    """The app's OpenAPI document, loaded through the app itself."""
    return schemathesis.openapi.from_asgi("/api/openapi.json", api)


@pytest.fixture(scope="module")
def token_headers(api: Any) -> dict[str, str]:
    """The header state-changing requests need (GET /api/token, as a client gets it)."""
    from fastapi.testclient import TestClient

    with TestClient(api) as client:
        return csrf_headers(client)


def _fuzz(operation: Any, mode: GenerationMode, headers: dict[str, str],
          answers: Counter[tuple[str, int]]) -> None:
    """Run one operation's generated cases of one mode (raises on the first failing case).

    Counts each answer's (operation, status) in `answers`.
    """

    @given(case=operation.as_strategy(generation_mode=mode))
    @settings(max_examples=EXAMPLES, deadline=None, database=None,
              suppress_health_check=list(HealthCheck))
    def run(case: Any) -> None:
        response = case.call(headers=headers, timeout=CALL_TIMEOUT_S)
        answers[(operation.label, response.status_code)] += 1
        # A 422 answers {"detail": "one line"} (app.main), while the document keeps FastAPI's
        # generated HTTPValidationError (detail: a list): its schema is not checked.
        checks = CHECKS if response.status_code != 422 else [not_a_server_error]
        case.validate_response(response, checks=checks)

    try:
        run()
    except Unsatisfiable:
        # Nothing to generate in this mode: no parameters (GET /api/status), or none that can
        # be made invalid (a path segment of any text).
        assert mode is GenerationMode.NEGATIVE, operation.label


def _describe(exc: BaseException) -> str:
    """The failure with its sub-failures (schemathesis groups the checks that failed)."""
    parts = [str(exc)]
    if isinstance(exc, BaseExceptionGroup):
        parts += [str(sub) for sub in exc.exceptions]
    return "\n".join(parts)


def test_every_operation_of_the_openapi_document(api_schema: Any,
                                                 token_headers: dict[str, str]) -> None:
    # One loop instead of schemathesis's pytest integration: its fixture-based loader
    # (`schemathesis.pytest.from_fixture`) fails under pytest 9 ('Function' object has no
    # attribute '_nodeid'), and a module-level schema would build an app at collection.
    failures, labels = [], []
    answers: Counter[tuple[str, int]] = Counter()
    for result in api_schema.get_all_operations():
        operation = result.ok()
        labels.append(operation.label)
        for mode in (GenerationMode.POSITIVE, GenerationMode.NEGATIVE):
            try:
                _fuzz(operation, mode, token_headers, answers)
            except (Exception, BaseExceptionGroup) as exc:  # report every operation's failure
                failures.append(f"{operation.label} ({mode.value}): {_describe(exc)}")
    assert len(labels) >= 20, labels  # the whole API was fuzzed, not an empty document
    assert not failures, "\n\n".join(failures)
    # The fuzzing reached the routes: no change was refused for want of the token.
    refused = sorted({label for label, status in answers if status == 403})
    assert not refused, f"refused by the request guard: {refused}"
