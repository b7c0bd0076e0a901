"""The conditions a shortlist's candidates were chosen under: substrate, temperature, target.

Saved with the list (`shortlists.substrate`, `.temperature_K`, `.target` as JSON) and applied
wherever its candidates are shown or exported: band gaps at the temperature, mismatch and
critical thickness on the substrate, the best value of the gap and wavelength rows closest to
the target. The target is either a band gap (eV) or a photon wavelength (nm), never both.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from typing import Any

from sqlalchemy.orm import Session

from app.number_input import NumberRule
from app.params import STORED_TEMPERATURE_K, QueryError, number, parse_temperature
from app.substrates import resolve_substrate
from screening.constants import HC_EV_NM
from screening.epitaxy import SubstrateSpec

TARGET_GAP_RANGE_EV = (0.0, 15.0)
TARGET_WAVELENGTH_RANGE_NM = (50.0, 100_000.0)


def _positive(value: Any, name: str, unit: str, bounds: tuple[float, float]) -> float | None:
    """A number inside `bounds` (exclusive); None for an empty value."""
    low, high = bounds
    return number(value, NumberRule(name, unit, low, high, low_open=True))


@dataclass(frozen=True)
class Conditions:
    """Substrate (a name; None for none), temperature of the gaps (K) and the target.

    Attributes:
        substrate: Name of a built-in substrate or one of the user's.
        temperature_K: 0 to 2000 K.
        target_gap_eV: Target band gap, eV (None: no gap target).
        target_wavelength_nm: Target photon wavelength, nm (None: no wavelength target).
    """

    substrate: str | None = None
    temperature_K: float = STORED_TEMPERATURE_K
    target_gap_eV: float | None = None
    target_wavelength_nm: float | None = None

    @classmethod
    def parse(cls, *, substrate: Any = None, temperature: Any = None, target_gap: Any = None,
              target_wavelength: Any = None, session: Session | None = None) -> Conditions:
        """Check conditions as typed (form, JSON or CLI).

        Args:
            substrate: Substrate name ("" or None for none); checked against the built-in
                table and, with `session`, the user's substrates.
            temperature: K, 0 to 2000 (empty: 300 K).
            target_gap: eV, or empty.
            target_wavelength: nm, or empty.
            session: For the user's substrates.

        Raises:
            QueryError: A bad number, or both targets given.
            UnknownSubstrateError: A substrate name that is not known.
        """
        name = str(substrate).strip() if substrate is not None else ""
        if name:
            name = resolve_substrate(session, name).name
        temperature_K = parse_temperature(temperature)
        gap = _positive(target_gap, "target band gap", "eV", TARGET_GAP_RANGE_EV)
        wavelength = _positive(target_wavelength, "target wavelength", "nm",
                               TARGET_WAVELENGTH_RANGE_NM)
        if gap is not None and wavelength is not None:
            raise QueryError("give a target band gap or a target wavelength, not both")
        return cls(name or None,
                   STORED_TEMPERATURE_K if temperature_K is None else temperature_K,
                   gap, wavelength)

    @classmethod
    def from_row(cls, substrate: str | None, temperature_K: float, target: str | None
                 ) -> Conditions:
        """Conditions as stored (trusted: they were checked when saved)."""
        data = json.loads(target) if target else {}
        return cls(substrate, float(temperature_K), data.get("gap_eV"),
                   data.get("wavelength_nm"))

    def target_json(self) -> str | None:
        """The target as stored in `shortlists.target` (None: no target)."""
        if self.target_gap_eV is not None:
            return json.dumps({"gap_eV": self.target_gap_eV})
        if self.target_wavelength_nm is not None:
            return json.dumps({"wavelength_nm": self.target_wavelength_nm})
        return None

    @property
    def gap_goal_eV(self) -> float | None:
        """The target as a band gap, eV (from the wavelength if that is the target)."""
        if self.target_gap_eV is not None:
            return self.target_gap_eV
        if self.target_wavelength_nm is not None:
            return HC_EV_NM / self.target_wavelength_nm
        return None

    @property
    def wavelength_goal_nm(self) -> float | None:
        """The target as a photon wavelength, nm (from the gap if that is the target)."""
        if self.target_wavelength_nm is not None:
            return self.target_wavelength_nm
        if self.target_gap_eV:
            return HC_EV_NM / self.target_gap_eV
        return None

    def target_text(self) -> str:
        """The target in words, e.g. "band gap 1.42 eV" ("none" without one)."""
        if self.target_gap_eV is not None:
            return f"band gap {self.target_gap_eV:g} eV"
        if self.target_wavelength_nm is not None:
            return f"wavelength {self.target_wavelength_nm:g} nm"
        return "none"

    def text(self) -> str:
        """All conditions in one line (pages, CSV header, CLI)."""
        return (f"substrate {self.substrate or 'none'}; temperature {self.temperature_K:g} K; "
                f"target {self.target_text()}")

    def as_dict(self) -> dict[str, Any]:
        """The conditions as JSON (API, JSON export)."""
        return {"substrate": self.substrate, "temperature_K": self.temperature_K,
                "target": {"gap_eV": self.target_gap_eV,
                           "wavelength_nm": self.target_wavelength_nm}}

    def substrate_spec(self, session: Session | None) -> SubstrateSpec | None:
        """The engine's substrate (None without one).

        Raises:
            UnknownSubstrateError: The substrate was deleted since the list was saved.
        """
        return resolve_substrate(session, self.substrate) if self.substrate else None
