"""What every page showing candidates adds: "add to shortlist", RoHS flags, the user's values.

The compound table, a compound's page and an alloy's page call one of these and pass the dict
into their template, which renders it with the macros of `templates/_forms.html`
(`add_to_shortlist`, `hazard_box`) and `templates/_yours.html`.
"""

from __future__ import annotations

from collections.abc import Iterable
from typing import Any

from sqlalchemy.orm import Session

from app.candidates import USER_PROPERTIES, elements_of, user_values
from app.shortlists import all_shortlists
from screening.hazards import ROHS_RESTRICTED, ROHS_SOURCE, rohs_restricted


def rohs_flags(elements: Iterable[str]) -> list[tuple[str, str]]:
    """(element, Annex II limit) of every RoHS-restricted element among `elements`."""
    return [(e, ROHS_RESTRICTED[e]) for e in sorted(set(rohs_restricted(elements)))]


def table_extras(session: Session, rows: list[dict[str, Any]]) -> dict[str, Any]:
    """Context of the compound table: the lists to add to, and the RoHS flags of its rows."""
    return {"shortlists": all_shortlists(session),
            "rohs": rohs_flags(e for row in rows for e in row.get("rohs_restricted", ())),
            "rohs_source": ROHS_SOURCE}


def report_extras(session: Session, report: dict[str, Any]) -> dict[str, Any]:
    """Context of a compound's or alloy's page: lists, RoHS flags, the user's own values."""
    yours = user_values(session, [report["formula"]]).get(report["formula"], {})
    return {"shortlists": all_shortlists(session), "rohs": rohs_flags(elements_of(report)),
            "rohs_source": ROHS_SOURCE,
            "yours": [{"property": p, "label": USER_PROPERTIES[p][0], **v}
                      for p, v in sorted(yours.items())]}
