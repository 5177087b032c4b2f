"""Every estimate returns the matrix at vf = 0 and the fibre at vf = 1 where defined there."""

import numpy as np
import pytest

from micromech.homogenize import (
    chamis,
    cylinders,
    halpin_tsai,
    hashin_shtrikman_fibre,
    mori_tanaka,
    rule_of_mixtures,
    voigt_reuss,
)

ENDS = np.array([0.0, 1.0])


def _models(f, m):
    lo, hi = hashin_shtrikman_fibre(f, m, ENDS)
    v, r = voigt_reuss(f, m, ENDS)
    return {
        "rule_of_mixtures": rule_of_mixtures(f, m, ENDS), "halpin_tsai": halpin_tsai(f, m, ENDS),
        "chamis": chamis(f, m, ENDS), "cylinders": cylinders(f, m, ENDS),
        "mori_tanaka": mori_tanaka(f, m, ENDS), "hs_lower": lo, "hs_upper": hi,
        "voigt": v, "reuss": r,
    }


@pytest.mark.parametrize("fibre", ["glass", "carbon"])
def test_every_fibre_model_meets_both_phases(fibre, request, epoxy):
    f = request.getfixturevalue(fibre)
    want = {"E1": (3.5e9, f.E1), "E2": (3.5e9, f.E2), "G12": (3.5e9 / 2.7, f.G12),
            "G23": (3.5e9 / 2.7, f.G23), "nu12": (0.35, f.nu12), "nu23": (0.35, f.nu23)}
    for key, r in _models(f, epoxy).items():
        for name, (at0, at1) in want.items():
            got = r.get(name)
            if got is None:
                continue
            assert np.allclose(got, [at0, float(at1)], rtol=1e-9, atol=1e-12), (key, name)
