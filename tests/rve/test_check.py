"""check_case with the real estimates: unidirectional and cross-ply cases, demo data."""

from pathlib import Path

import numpy as np
import pytest

from micromech.case import case_from_dict, load_case
from micromech.errors import CaseFileError, InputError
from micromech.homogenize import estimate
from micromech.laminate.stack import stack_constants
from micromech.rve.check import (
    CheckResult,
    check_case,
    expected_properties,
    property_name,
)

DEMO = Path(__file__).resolve().parents[2] / "data" / "demo"
GLASS_EPOXY = {"fibre": {"use": "e-glass"}, "matrix": {"use": "epoxy"}}


def ud_case(C_gpa, vf=0.55, arrangement="random", **extra):
    data = {**GLASS_EPOXY,
            "composite": {"volume_fraction": vf, "arrangement": arrangement},
            "rve": {"architecture": "unidirectional",
                    "stiffness": {"matrix": np.asarray(C_gpa).tolist(), "unit": "GPa"}}}
    data.update(extra)
    return case_from_dict(data)


def mt_constants(vf=0.55, arrangement="random"):
    case = case_from_dict({**GLASS_EPOXY, "composite": {"volume_fraction": vf,
                                                         "arrangement": arrangement}})
    return estimate(case.composite, strengths=False)["mori_tanaka"]


def mt_stiffness_gpa(vf=0.55, arrangement="random"):
    return mt_constants(vf, arrangement).stiffness() / 1e9


# --- unidirectional, from a full stiffness ---------------------------------------------------

def test_ud_stiffness_equal_to_mori_tanaka_is_consistent_throughout():
    r = check_case(ud_case(mt_stiffness_gpa()))
    assert r.worst_verdict == "consistent" and r.exit_code == 0
    assert {"E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu23"} <= set(r.properties)
    assert r.properties["E1"].best_model == "mori_tanaka"


def test_ud_stiffness_times_1000_violates_with_unit_slip():
    # the matrix written in MPa but declared in GPa: every modulus 1000 x too large
    r = check_case(ud_case(mt_stiffness_gpa() * 1000))
    assert r.exit_code == 1
    e1 = r.properties["E1"]
    assert e1.verdict == "violates_bounds"
    assert e1.reasons[1].startswith("Likely cause 1: A unit slip")
    assert "stiffness matrix" in e1.reasons[1]
    # Poisson ratios are ratios: unchanged and consistent
    assert r.properties["nu12"].verdict == "consistent"


def test_ud_axial_modulus_40_percent_low_is_suspect():
    from micromech.tensors import engineering_constants, orthotropic_stiffness

    c = engineering_constants(mt_stiffness_gpa())
    C = orthotropic_stiffness(0.6 * c["E1"], c["E2"], c["E3"], c["G23"], c["G13"],
                              c["G12"], c["nu23"], c["nu13"], c["nu12"])
    r = check_case(ud_case(C))
    e1 = r.properties["E1"]
    assert e1.verdict == "suspect"
    assert e1.lower_bound < e1.value < e1.upper_bound
    assert any("below the expected band" in x for x in e1.reasons)
    assert any("Vf = 0.3" in x for x in e1.reasons)  # the fraction that would give it
    assert r.properties["E2"].verdict == "consistent"


def test_ud_transverse_modulus_40_percent_low_is_below_reuss_here():
    # glass/epoxy at Vf 0.55: 0.6 x Mori-Tanaka E2 = 6.1 GPa < Reuss 7.3 GPa
    from micromech.tensors import engineering_constants, orthotropic_stiffness

    c = engineering_constants(mt_stiffness_gpa())
    C = orthotropic_stiffness(c["E1"], 0.6 * c["E2"], 0.6 * c["E3"], 0.6 * c["G23"], c["G13"],
                              c["G12"], c["nu23"], c["nu13"], c["nu12"])
    assert check_case(ud_case(C)).properties["E2"].verdict == "violates_bounds"


def test_ud_bounds_are_voigt_and_reuss_of_the_constituents():
    # E1 upper bound = 1/S11 of the Voigt stiffness; E2 lower bound = harmonic mean of E
    # (isotropic phases: exact identity)
    r = check_case(ud_case(mt_stiffness_gpa()))
    vf, Ef, nuf, Em, num = 0.55, 72e9, 0.22, 3.5e9, 0.35
    assert r.properties["E2"].lower_bound == pytest.approx(1 / (vf / Ef + (1 - vf) / Em))
    # isotropic phases: the Voigt stiffness is isotropic, E = 9KG/(3K+G) of the mean K, G
    K = vf * Ef / (3 * (1 - 2 * nuf)) + (1 - vf) * Em / (3 * (1 - 2 * num))
    G = vf * Ef / (2 * (1 + nuf)) + (1 - vf) * Em / (2 * (1 + num))
    assert r.properties["E1"].upper_bound == pytest.approx(9 * K * G / (3 * K + G))
    assert r.properties["E1"].upper_bound > vf * Ef + (1 - vf) * Em  # above the plain mean


def test_ud_hs_band_dropped_for_transverse_moduli_of_square_arrays():
    r = check_case(ud_case(mt_stiffness_gpa(arrangement="square"), arrangement="square"))
    assert r.properties["E2"].hs_band is None
    assert r.properties["E1"].hs_band is not None
    r2 = check_case(ud_case(mt_stiffness_gpa()))
    assert r2.properties["E2"].hs_band is not None


def test_tolerance_override_narrows_the_band():
    C = mt_stiffness_gpa()
    C2 = C.copy()
    C2[1, 1] *= 1.1  # stiffer transversely: E2 up by about 10 %
    assert check_case(ud_case(C2)).properties["E2"].verdict == "consistent"
    r = check_case(ud_case(C2), tolerances=["E2=0.02"])
    assert r.properties["E2"].verdict == "suspect"
    assert "given by the user" in r.properties["E2"].reasons[0]


def test_case_check_table_tolerance_is_used():
    C2 = mt_stiffness_gpa()
    C2[1, 1] *= 1.1
    r = check_case(ud_case(C2, check={"tolerance": {"E2": 0.02}}))
    assert r.properties["E2"].verdict == "suspect"


# --- cross-ply, from a stiffness and from the demo histories ---------------------------------

def crossply_stiffness_gpa(vf=0.55):
    case = case_from_dict({**GLASS_EPOXY, "composite": {"volume_fraction": vf}})
    C = estimate(case.composite, strengths=False)["mori_tanaka"].stiffness()
    return stack_constants(np.stack([C, C]), [0.5, 0.5], angles=[0.0, 90.0]).stiffness / 1e9


def test_crossply_stack_of_mt_plies_is_consistent_and_uses_stack_names():
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "crossply", "layup": "[0/90]",
                    "stiffness": {"matrix": crossply_stiffness_gpa().tolist(), "unit": "GPa"}}}
    r = check_case(case_from_dict(data))
    assert r.worst_verdict == "consistent"
    ex = r.properties["Ex"]
    assert ex.best_model == "stack_mori_tanaka"
    assert {"stack_halpin_tsai", "stack_hashin_shtrikman_lower",
            "stack_hashin_shtrikman_upper"} <= set(ex.estimates)


def test_crossply_voigt_bound_is_isotropic_mean_for_isotropic_phases():
    case = load_case(DEMO / "crossply.toml")
    e = expected_properties(case, ["Ex", "Ez", "Gxz"])
    # isotropic phases: Voigt stiffness isotropic; its Young's modulus (exact identity)
    vf, Ef, nuf, Em, num = 0.55, 72e9, 0.22, 3.5e9, 0.35
    K = vf * Ef / (3 * (1 - 2 * nuf)) + (1 - vf) * Em / (3 * (1 - 2 * num))
    G = vf * Ef / (2 * (1 + nuf)) + (1 - vf) * Em / (2 * (1 + num))
    assert e["Ex"].upper_bound == pytest.approx(9 * K * G / (3 * K + G))
    assert e["Ez"].upper_bound == pytest.approx(e["Ex"].upper_bound)
    assert e["Gxz"].upper_bound == pytest.approx(G)


def test_demo_good_case_is_consistent_throughout():
    r = check_case(DEMO / "crossply.toml")
    bad = {n: p.reasons for n, p in r.properties.items() if p.verdict != "consistent"}
    assert bad == {}
    assert r.exit_code == 0
    assert {"Ex", "Ey", "Ez", "nuxy", "nuzx", "yield_strength_z"} <= set(r.properties)
    assert set(r.curves) == {"x", "y", "z"}


def test_demo_bad_case_shows_all_three_verdicts_and_the_causes():
    r = check_case(DEMO / "crossply_bad.toml")
    verdicts = {p.verdict for p in r.properties.values()}
    assert verdicts == {"consistent", "suspect", "violates_bounds"}
    ex = r.properties["Ex"]
    assert ex.verdict == "violates_bounds" and r.exit_code == 1
    assert any("A unit slip" in x and "kN" in x for x in ex.reasons)
    assert any("check size.z" in n for n in r.notes)
    assert r.properties["Ey"].verdict == "suspect"
    assert r.properties["Ez"].verdict == "suspect"


def test_as_dict_follows_the_json_contract():
    d = check_case(DEMO / "crossply.toml").as_dict()
    assert d["worst_verdict"] == "consistent"
    for key in ("modulus", "modulus_fit_range", "r2", "yield_offset", "yield_strength",
                "ultimate_strength", "strain_at_ultimate", "final_strain", "failed"):
        assert key in d["curves"]["x"]
    for key in ("value", "lower_bound", "upper_bound", "estimates", "verdict", "reasons"):
        assert key in d["properties"]["Ex"]
    assert "licensed engineer" in d["caution"]


def test_offset_argument_moves_the_yield_point():
    a = check_case(DEMO / "crossply.toml")
    b = check_case(DEMO / "crossply.toml", offset=0.004)
    assert b.curves["x"].metrics.yield_offset == 0.004
    assert b.properties["yield_strength_x"].value > a.properties["yield_strength_x"].value


def test_inputs_list_the_case_and_histories():
    r = check_case(DEMO / "crossply.toml")
    assert isinstance(r, CheckResult)
    assert {p.name for p in r.inputs} == {"crossply.toml", "rve_x.csv", "rve_y.csv",
                                          "rve_z.csv"}


def test_property_names_by_architecture():
    assert property_name("unidirectional", "x") == "E1"
    assert property_name("unidirectional", "yz") == "G23"
    assert property_name("unidirectional", "y", "x") == "nu21"
    assert property_name("crossply", "z", "y") == "nuzy"
    assert property_name("stack", "xz") == "Gxz"


# --- errors ----------------------------------------------------------------------------------

def test_case_without_rve_raises():
    case = case_from_dict({**GLASS_EPOXY, "composite": {"volume_fraction": 0.5}})
    with pytest.raises(CaseFileError, match=r"no \[rve\] results to check"):
        check_case(case)


def test_case_without_composite_raises():
    case = case_from_dict({"rve": {"architecture": "unidirectional",
                                   "stiffness": {"matrix": np.eye(6).tolist()}}})
    with pytest.raises(CaseFileError, match=r"needs \[fibre\], \[matrix\] and \[composite\]"):
        check_case(case)


def test_bad_offset_raises():
    with pytest.raises(InputError, match="offset = 0.0 must be a strain between 0 and 1"):
        check_case(DEMO / "crossply.toml", offset=0.0)


def test_stack_without_layup_raises():
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "stack",
                    "stiffness": {"matrix": crossply_stiffness_gpa().tolist(), "unit": "GPa"}}}
    with pytest.raises(CaseFileError, match="architecture = 'stack' needs layup"):
        check_case(case_from_dict(data))


def test_unknown_direction_raises():
    with pytest.raises(InputError, match="direction = 'q'"):
        property_name("crossply", "q")


def test_poisson_with_load_axis_as_lateral_raises():
    with pytest.raises(InputError, match="needs a lateral axis among x, y, z"):
        property_name("unidirectional", "x", "x")


def test_unknown_tolerance_name_raises():
    with pytest.raises(InputError, match="unknown property 'E22'"):
        check_case(DEMO / "crossply.toml", tolerances=["E22=0.1"])


# --- particulate, averaged load cases, [check] filters ---------------------------------------

def test_particulate_spheres_at_mori_tanaka_are_consistent_with_hs_band():
    base = {"fibre": {"use": "glass-beads"}, "matrix": {"use": "epoxy"},
            "composite": {"volume_fraction": 0.3, "inclusion": "sphere"}}
    C = estimate(case_from_dict(base).composite, strengths=False)["mori_tanaka"].stiffness()
    data = {**base, "rve": {"architecture": "particulate",
                            "stiffness": {"matrix": (C / 1e9).tolist(), "unit": "GPa"}}}
    r = check_case(case_from_dict(data))
    assert r.worst_verdict == "consistent"
    e1 = r.properties["E1"]
    assert e1.hs_band is not None and e1.hs_band[0] <= e1.value * 1.001
    assert "not measured" in e1.reasons[0]  # flat band for particles


def averaged_mt_case():
    """The Mori-Tanaka stiffness (Pa) and a case of its six unit-strain load cases (MPa)."""
    C = mt_stiffness_gpa() * 1e9
    cases = [{"stress": (C @ e / 1e6).tolist(), "strain": e.tolist(), "stress_unit": "MPa"}
             for e in 1e-3 * np.eye(6)]
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "unidirectional", "load_case": cases}}
    return C, case_from_dict(data)


def test_averaged_load_cases_give_the_full_stiffness():
    C, case = averaged_mt_case()
    r = check_case(case)
    assert r.worst_verdict == "consistent"
    assert r.properties["G23"].value == pytest.approx(C[3, 3], rel=1e-9)
    assert r.curves == {}


def test_check_table_limits_properties_and_models():
    r = check_case(ud_case(mt_stiffness_gpa(),
                           check={"properties": ["E1", "E2"], "models": ["halpin_tsai"]}))
    assert set(r.properties) == {"E1", "E2"}
    assert set(r.properties["E2"].estimates) == {"mori_tanaka", "halpin_tsai"}


def test_percent_strains_read_as_plain_numbers_are_diagnosed(tmp_path):
    # invented history: E1 of the Mori-Tanaka estimate, strain written in percent
    e1 = float(mt_constants().E1)
    strain = np.linspace(0.0, 0.01, 60)
    rows = "\n".join(f"{100 * e:.8g},{e1 * e / 1e6:.8g}" for e in strain)
    (tmp_path / "ud_x.csv").write_text("# invented example\nstrain_pct,stress_mpa\n" + rows)
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "unidirectional",
                    "load_case": [{"direction": "x", "file": "ud_x.csv",
                                   "stress": {"column": "stress_mpa", "unit": "MPa"},
                                   "strain": {"column": "strain_pct", "unit": "1"}}]}}
    r = check_case(case_from_dict(data, path=tmp_path / "ud.toml"))
    e = r.properties["E1"]
    assert e.verdict == "violates_bounds"
    assert "percent" in e.reasons[1]
    data["rve"]["load_case"][0]["strain"]["unit"] = "%"
    fixed = check_case(case_from_dict(data, path=tmp_path / "ud.toml"))
    assert fixed.properties["E1"].verdict == "consistent"


def test_skip_rows_of_a_load_case_are_honoured(tmp_path):
    e1 = float(mt_constants().E1)
    strain = np.linspace(0.0, 0.01, 40)
    rows = "\n".join(f"{e:.8g},{e1 * e / 1e6:.8g}" for e in strain)
    (tmp_path / "h.csv").write_text("solver preamble line\nmore preamble\nstrain,stress\n" + rows)
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "unidirectional",
                    "load_case": [{"direction": "x", "file": "h.csv", "skip_rows": 2,
                                   "stress": {"column": "stress", "unit": "MPa"},
                                   "strain": {"column": "strain"}}]}}
    r = check_case(case_from_dict(data, path=tmp_path / "c.toml"))
    assert r.properties["E1"].verdict == "consistent"


# --- histories synthesised in the test from the estimates (invented data) --------------------

BOX = {"x": 60e-6, "y": 40e-6, "z": 30e-6}  # invented cell, deliberately not a cube
_AX = "xyz"


def _area_gauge(d):
    if len(d) == 1:
        a, b = (k for k in _AX if k != d)
        return BOX[a] * BOX[b], BOX[d]
    i, j = d
    k = next(a for a in _AX if a not in d)
    return BOX[i] * BOX[k], BOX[j]  # force along i on the face normal to j, gauge L_j


def write_histories(folder, moduli, poisson=None, *, yield_stress=40e6, points=200,
                    noise=1e-3, seed=0):
    """Invented histories: linear at the given moduli, then a Ramberg-Osgood-like softening.

    Force in mN and displacements in um, so that the file's units differ from SI.
    """
    rng = np.random.default_rng(seed)
    cases = []
    for d, mod in moduli.items():
        s = np.linspace(0.0, 1.4 * yield_stress, points)
        e = s / mod + 0.002 * (s / yield_stress) ** 10
        area, gauge = _area_gauge(d)
        f_mn = s * area * 1e3
        f_mn = f_mn + rng.normal(0.0, noise * f_mn.max(), f_mn.size)
        f_mn[0] = 0.0
        cols, names = [f_mn, e * gauge * 1e6], ["F", "u"]
        lateral = []
        for (i, j), nu in (poisson or {}).items():
            if i == d:
                cols.append(-nu * e * BOX[j] * 1e6)
                names.append(f"u{j}")
                lateral.append({"column": f"u{j}", "unit": "um", "direction": j})
        body = "\n".join(" ".join(f"{v:.9g}" for v in row) for row in np.column_stack(cols))
        (folder / f"h_{d}.txt").write_text(
            f"# invented history, load case {d}\n" + " ".join(names) + "\n" + body + "\n")
        lc = {"direction": d, "file": f"h_{d}.txt", "force": {"column": "F", "unit": "mN"},
              "displacement": {"column": "u", "unit": "um"}}
        if lateral:
            lc["lateral"] = lateral
        cases.append(lc)
    return cases


def history_case(folder, base, arch, moduli, poisson=None, **kw):
    data = {**base, "rve": {"architecture": arch,
                            "size": {k: f"{v * 1e6:g} um" for k, v in BOX.items()},
                            "load_case": write_histories(folder, moduli, poisson, **kw)}}
    return case_from_dict(data, path=folder / "case.toml")


UD_BASE = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55, "arrangement": "hexagonal"}}


def ud_mori_tanaka():
    return mt_constants(arrangement="hexagonal")  # the composite of UD_BASE


def ud_moduli(mt, **scale):
    names = {"x": "E1", "y": "E2", "z": "E3", "xy": "G12", "xz": "G13", "yz": "G23"}
    return {d: float(mt.get(n)) * scale.get(d, 1.0) for d, n in names.items()}


def test_ud_six_histories_with_shear_cases_are_consistent_end_to_end(tmp_path):
    mt = ud_mori_tanaka()
    nu = {("x", "y"): float(mt.nu12), ("x", "z"): float(mt.nu13)}
    r = check_case(history_case(tmp_path, UD_BASE, "unidirectional", ud_moduli(mt), nu))
    elastic = {"E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13"}
    assert elastic <= set(r.properties) and set(r.curves) == {"x", "y", "z", "xy", "yz", "xz"}
    bad = {n: p.reasons for n, p in r.properties.items() if p.verdict != "consistent"}
    assert bad == {}
    for d, name in (("xy", "G12"), ("xz", "G13"), ("yz", "G23")):
        # invented data made from Mori-Tanaka: the curve gives it back (noise 0.1 %)
        assert r.properties[name].value == pytest.approx(float(mt.get(name)), rel=5e-3)
        assert r.curves[d].metrics.yield_strength == pytest.approx(40e6, rel=1e-2)
    assert r.exit_code == 0


def test_ud_histories_with_force_declared_in_newtons_violate_with_a_unit_slip(tmp_path):
    mt = ud_mori_tanaka()
    case = history_case(tmp_path, UD_BASE, "unidirectional", ud_moduli(mt))
    lc = case.rve.load_cases[0]  # x: the file holds mN, declare N: every stress x 1000
    data = {**UD_BASE, "rve": {"architecture": "unidirectional",
                               "size": {k: f"{v * 1e6:g} um" for k, v in BOX.items()},
                               "load_case": [{"direction": "x", "file": lc.file.name,
                                              "force": {"column": "F", "unit": "N"},
                                              "displacement": {"column": "u", "unit": "um"}}]}}
    r = check_case(case_from_dict(data, path=tmp_path / "case.toml"))
    e1 = r.properties["E1"]
    assert e1.verdict == "violates_bounds" and r.exit_code == 1
    assert e1.reasons[1].startswith("Likely cause 1: A unit slip") and "10^3" in e1.reasons[1]


def test_ud_history_40_percent_below_the_estimates_is_suspect(tmp_path):
    mt = ud_mori_tanaka()
    r = check_case(history_case(tmp_path, UD_BASE, "unidirectional",
                                {"x": 0.6 * float(mt.E1)}))
    e1 = r.properties["E1"]
    assert e1.verdict == "suspect" and e1.lower_bound < e1.value < e1.upper_bound
    assert any("below the expected band" in x for x in e1.reasons)


PARTICLES = {"fibre": {"use": "glass-beads"}, "matrix": {"use": "epoxy"},
             "composite": {"volume_fraction": 0.3, "inclusion": "sphere"}}


def particle_mori_tanaka():
    return estimate(case_from_dict(PARTICLES).composite, strengths=False)["mori_tanaka"]


def test_particulate_histories_at_mori_tanaka_are_consistent(tmp_path):
    mt = particle_mori_tanaka()
    E, G, nu = float(mt.E1), float(mt.G12), float(mt.nu12)
    moduli = {"x": E, "y": E, "z": E, "xy": G}
    poisson = {("x", "y"): nu, ("y", "z"): nu, ("z", "x"): nu}
    r = check_case(history_case(tmp_path, PARTICLES, "particulate", moduli, poisson))
    bad = {n: p.reasons for n, p in r.properties.items() if p.verdict != "consistent"}
    assert bad == {}
    assert {"E1", "E2", "E3", "G12", "nu12", "nu23", "nu31"} <= set(r.properties)
    assert r.properties["E1"].hs_band is not None  # random spheres: HS band applies


def test_particulate_axes_that_differ_are_suspect(tmp_path):
    # each within the flat 10 % band of Mori-Tanaka, but 16 % apart: spheres make x and y alike
    E = float(particle_mori_tanaka().E1)
    r = check_case(history_case(tmp_path, PARTICLES, "particulate",
                                {"x": 1.08 * E, "y": 0.92 * E}))
    for name in ("E1", "E2"):
        assert r.properties[name].verdict == "suspect"
        assert any("three axes of the cell alike" in x for x in r.properties[name].reasons)


def test_particulate_15_percent_low_is_suspect_above_reuss(tmp_path):
    E = float(particle_mori_tanaka().E1)
    e1 = check_case(history_case(tmp_path, PARTICLES, "particulate",
                                 {"x": 0.85 * E})).properties["E1"]
    assert e1.verdict == "suspect" and e1.value > e1.lower_bound


def test_averaged_load_cases_grade_all_nine_constants_and_report_the_stiffness():
    C, case = averaged_mt_case()
    r = check_case(case)
    nine = ("E1", "E2", "E3", "G12", "G13", "G23", "nu12", "nu13", "nu23")
    assert set(nine) <= set(r.properties)
    assert all(r.properties[n].verdict == "consistent" for n in nine)
    assert r.stiffness_source == "load_cases" and r.stiffness.n_cases == 6
    assert r.stiffness.symmetry_error < 1e-12 and r.stiffness.positive_definite
    d = r.as_dict()["stiffness"]
    assert d["source"] == "load_cases" and d["positive_definite"] is True
    assert np.allclose(d["stiffness"], C, rtol=1e-9)  # exact identity: six unit strains


def test_full_matrix_grades_all_nine_constants_under_stack_names():
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "crossply", "layup": "[0/90]",
                    "stiffness": {"matrix": crossply_stiffness_gpa().tolist(), "unit": "GPa"}}}
    r = check_case(case_from_dict(data))
    nine = ("Ex", "Ey", "Ez", "Gxy", "Gxz", "Gyz", "nuxy", "nuxz", "nuyz")
    assert set(nine) <= set(r.properties) and r.stiffness_source == "matrix"
    assert all(r.properties[n].verdict == "consistent" for n in nine)


def test_asymmetric_load_cases_are_noted_and_reported():
    C = mt_stiffness_gpa() * 1e9
    C[0, 1] *= 2.0  # C12 != C21: load cases that disagree
    eps = 1e-3 * np.eye(6)
    cases = [{"stress": (C @ e).tolist(), "strain": e.tolist()} for e in eps]
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "unidirectional", "load_case": cases}}
    r = check_case(case_from_dict(data))
    assert r.stiffness.symmetry_error > 0.05
    assert any("not symmetric" in n for n in r.notes)


def test_shear_yield_below_the_matrix_shear_yield_is_suspect(tmp_path):
    # polyamide-6 yields at 80 MPa in the registry: in shear 80 / sqrt(3) = 46.2 MPa (von Mises,
    # from memory); a uniform stress at that level is admissible (Drucker 1966, from memory)
    base = {"fibre": {"use": "e-glass"}, "matrix": {"use": "polyamide-6"},
            "composite": {"volume_fraction": 0.5, "arrangement": "hexagonal"}}
    mt = estimate(case_from_dict(base).composite, strengths=False)["mori_tanaka"]
    low = check_case(history_case(tmp_path, base, "unidirectional", {"xy": float(mt.G12)},
                                  yield_stress=40e6))
    p = low.properties["yield_strength_xy"]
    assert p.lower_bound == pytest.approx(80e6 / np.sqrt(3))
    assert p.verdict == "suspect" and "shear yield stress" in p.reasons[0]
    high = check_case(history_case(tmp_path, base, "unidirectional", {"xy": float(mt.G12)},
                                   yield_stress=60e6))
    assert high.properties["yield_strength_xy"].verdict == "consistent"


def test_wrong_cell_size_is_named_for_the_poisson_ratios_it_scales():
    r = check_case(DEMO / "crossply_bad.toml")  # size.z declared 90 um, the cell is 120 um
    assert any("The lateral strain of nuxz is taken over that edge" in x
               for x in r.properties["nuxz"].reasons)
    assert any("The axial strain of nuzx is taken over that edge" in x
               for x in r.properties["nuzx"].reasons)


def test_strain_range_argument_replaces_the_search():
    r = check_case(DEMO / "crossply.toml", strain_range=(0.0005, 0.003))
    m = r.curves["x"].metrics
    assert not m.fit_automatic and 0.0005 <= m.modulus_fit_range[0] < m.modulus_fit_range[1]
    assert m.modulus_fit_range[1] <= 0.003


@pytest.mark.parametrize(("value", "message"), [
    ((0.003, 0.001), "must satisfy 0 <= low < high"),
    ((0.001,), "must be two strains"),
    (("a", "b"), "must be two strains"),
    ((-0.001, 0.002), "must satisfy 0 <= low < high"),
])
def test_bad_strain_range_raises(value, message):
    with pytest.raises(InputError, match=message):
        check_case(DEMO / "crossply.toml", strain_range=value)


def test_expected_properties_without_composite_raises():
    case = case_from_dict({"rve": {"architecture": "unidirectional",
                                   "stiffness": {"matrix": np.eye(6).tolist()}}})
    with pytest.raises(CaseFileError, match=r"needs \[fibre\], \[matrix\], \[composite\]"):
        expected_properties(case, ["E1"])


def test_quasi_isotropic_stack_grades_through_the_stack_constants():
    from micromech.laminate.layup import parse_layup

    C = estimate(case_from_dict({**GLASS_EPOXY, "composite": {"volume_fraction": 0.55}})
                 .composite, strengths=False)["mori_tanaka"].stiffness()
    angles = np.asarray(parse_layup("[0/+-45/90]s"), dtype=float)
    stack = stack_constants(np.broadcast_to(C, (angles.size, 6, 6)),
                            np.full(angles.size, 1 / angles.size), angles=angles).stiffness

    def graded(scale):
        data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
                "rve": {"architecture": "stack", "layup": "[0/+-45/90]s",
                        "stiffness": {"matrix": (scale * stack / 1e9).tolist(), "unit": "GPa"}}}
        return check_case(case_from_dict(data)).properties

    good = graded(1.0)  # the stack of Mori-Tanaka plies itself (exact identity)
    assert all(p.verdict == "consistent" for p in good.values())
    assert good["Gxy"].best_model == "stack_mori_tanaka"
    low = graded(0.6)  # 40 % below: in-plane moduli inside Voigt/Reuss, so suspect
    for name in ("Ex", "Ey", "Gxy"):
        assert low[name].verdict == "suspect"
        assert low[name].lower_bound < low[name].value < low[name].upper_bound


def test_randomly_oriented_fibres_are_refused_with_the_rule(tmp_path):
    # The check's tolerances come from aligned-fibre measurements (ACCURACY.md): a random mat is
    # refused rather than graded against the wrong band.
    from micromech.report.check import demo_directory

    src = (demo_directory() / "crossply.toml").read_text(encoding="utf-8")
    src = src.replace('inclusion = "continuous"', 'inclusion = "spheroid"\naspect_ratio = 20\n'
                      'orientation = "random_3d"')
    for name in ("rve_x.csv", "rve_y.csv", "rve_z.csv"):
        (tmp_path / name).write_bytes((demo_directory() / name).read_bytes())
    (tmp_path / "mat.toml").write_text(src, encoding="utf-8")
    with pytest.raises(CaseFileError, match=r"orientation = 'random_3d'.*aligned fibres"):
        check_case(load_case(tmp_path / "mat.toml"))


# --- issue 6 of the user trial ---------------------------------------------------------------

def with_check(case, **check):
    """The case with another [check] table, past the case file's own validation of names."""
    import dataclasses

    return dataclasses.replace(case, check=check)


def test_unknown_property_names_raise_with_the_nearest_valid_names():
    # a 1000 x unit slip must not pass as consistent because the names select nothing
    case = with_check(ud_case(mt_stiffness_gpa() * 1000), properties=["e1", "G21"])
    with pytest.raises(InputError, match=r"'e1' \(did you mean 'E1'\?\); 'G21' \(did you mean "
                                         r"'G12'\?\) are not property names"):
        check_case(case)


def test_property_no_load_case_gives_raises_naming_the_load_case(tmp_path):
    mt = ud_mori_tanaka()
    case = history_case(tmp_path, UD_BASE, "unidirectional", {"x": float(mt.E1)})
    with pytest.raises(CaseFileError, match=r"'E2' is not given by .* direction = 'y'"):
        check_case(with_check(case, properties=["E1", "E2"]))
    with pytest.raises(CaseFileError, match=r"'Ex' is not given by .* name this property 'E1'"):
        check_case(with_check(case, properties=["Ex"]))


def test_empty_property_list_raises():
    with pytest.raises(CaseFileError, match=r"properties = \[\] selects nothing to grade"):
        check_case(with_check(ud_case(mt_stiffness_gpa()), properties=[]))


def linear_x_history_case(folder):
    """Invented linear x history at the Mori-Tanaka E1: it never crosses the offset line."""
    e1 = float(mt_constants().E1)
    strain = np.linspace(0.0, 0.01, 40)
    rows = "\n".join(f"{e:.8g},{e1 * e / 1e6:.8g}" for e in strain)
    (folder / "h.csv").write_text("# invented example\nstrain,stress\n" + rows)
    data = {**GLASS_EPOXY, "composite": {"volume_fraction": 0.55},
            "rve": {"architecture": "unidirectional",
                    "load_case": [{"direction": "x", "file": "h.csv",
                                   "stress": {"column": "stress", "unit": "MPa"},
                                   "strain": {"column": "strain"}}]}}
    return case_from_dict(data, path=folder / "c.toml")


def test_selection_of_only_a_yield_the_curve_does_not_give_raises(tmp_path):
    case = with_check(linear_x_history_case(tmp_path), properties=["yield_strength_x"])
    with pytest.raises(CaseFileError, match=r"selects nothing that can be graded "
                                            r"\(yield_strength_x: no offset yield"):
        check_case(case)


def test_yield_the_curve_does_not_give_is_kept_as_not_graded(tmp_path):
    r = check_case(linear_x_history_case(tmp_path))
    assert "yield_strength_x" not in r.properties
    assert r.not_graded["yield_strength_x"].startswith("no offset yield: the curve stays above")


def test_fraction_search_reaches_the_packing_limit():
    case = load_case(DEMO / "crossply.toml")
    grid = expected_properties(case, ["Ex"])["Ex"].fraction_curve[0]
    assert grid[-1] == pytest.approx(case.composite.packing_limit)  # as the size command uses


def test_poisson_ratio_beyond_the_stability_limit_violates_bounds(tmp_path):
    # lateral column 1000 x the axial unit: nu12 = 271 while sqrt(E1 / E2) = 2.0; a positive
    # definite compliance needs nu12^2 < E1 / E2 (Lempriere 1968, AIAA J. 6, 2226, from memory)
    mt = ud_mori_tanaka()
    moduli = {"x": float(mt.E1), "y": float(mt.E2)}
    r = check_case(history_case(tmp_path, UD_BASE, "unidirectional", moduli,
                                {("x", "y"): 1000 * float(mt.nu12)}))
    nu = r.properties["nu12"]
    assert nu.verdict == "violates_bounds" and r.exit_code == 1
    assert nu.reasons[0].startswith("nu12 = 271 breaks the stability limit |nu12| < "
                                    "sqrt(E1 / E2) = 2.0")
    assert "simulated" in nu.reasons[0] and "unit mismatch" in nu.reasons[0]
    assert any(x.startswith("Likely cause 1: A unit slip") for x in nu.reasons)


def test_modulus_that_violates_its_bounds_does_not_condemn_the_poisson_ratio():
    # crossply_bad: Ex is 1000 x too large; nuyx^2 < Ey / Ex would fail with it, so the
    # stability check takes the best estimate of Ex instead
    r = check_case(DEMO / "crossply_bad.toml")
    assert r.properties["Ex"].verdict == "violates_bounds"
    assert r.properties["nuyx"].verdict == "suspect"


def test_other_shear_convention_in_a_history_is_named(tmp_path):
    # xy history written with the force along y on the x face and the displacement over Lx:
    # micromech's G12 is (Ly / Lx)^2 times the true one (BOX: x 60 um, y 40 um)
    mt = ud_mori_tanaka()
    r = check_case(history_case(tmp_path, UD_BASE, "unidirectional",
                                {"xy": float(mt.G12) * (40 / 60) ** 2}))
    g = r.properties["G12"]
    assert g.verdict == "violates_bounds"
    first = next(x for x in g.reasons if x.startswith("Likely cause 1"))
    assert "A wrong area or length" in first and "other shear convention" in first
    assert "The xy load case is read as force along x on the face normal to y" in first
