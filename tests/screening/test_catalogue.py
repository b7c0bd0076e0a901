from screening.catalogue import catalogue, catalogue_formulas
from screening.elements import VALENCE
from screening.formula import parse_compound


def test_catalogue_holds_every_octet_family() -> None:
    # 10 IV-IV (C, Si, Ge, Sn and their 6 pairs), 5x5 III-V, 8x4 II-VI, 6x4 I-VII.
    families = [c.family for c in catalogue()]
    assert families.count("IV-IV") == 10
    assert families.count("III-V") == 25
    assert families.count("II-VI") == 32
    assert families.count("I-VII") == 24


def test_catalogue_formulas_are_unique_and_normalised() -> None:
    formulas = catalogue_formulas()
    assert len(set(formulas)) == len(formulas)
    for compound in catalogue():
        assert parse_compound(compound.formula) == compound
        assert VALENCE[compound.cation] + VALENCE[compound.anion] == 8
