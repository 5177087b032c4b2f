"""Tests of micromech.materials.registry and the bundled data/materials files."""

from __future__ import annotations

import re

import numpy as np
import pytest

from micromech import tensors
from micromech.errors import InvalidMaterialError, RegistryError
from micromech.materials import (
    Isotropic,
    Registry,
    TransverselyIsotropic,
    default_registry,
    get_material,
    list_materials,
    load_material,
)
from micromech.materials import registry as registry_module

REG = Registry(use_env=False)
KEYS = list(REG)

FIBRES_REQUIRED = ["e-glass", "s-glass", "carbon-standard", "carbon-intermediate",
                   "carbon-high-modulus", "aramid", "basalt", "flax"]
MATRICES_REQUIRED = ["epoxy", "polyester", "vinyl-ester", "polypropylene", "polyamide-6", "peek"]


def write(path, text):
    path.write_text(text, encoding="utf-8")
    return path


# --- bundled data -----------------------------------------------------------------------------


def test_bundled_registry_has_at_least_14_constituents_including_the_required_ones():
    assert len(REG) >= 14
    for key in FIBRES_REQUIRED + MATRICES_REQUIRED:
        assert key in REG, key


@pytest.mark.parametrize("key", KEYS)
def test_every_registry_material_loads_with_positive_definite_stiffness(key):
    m = REG[key]
    C = m.stiffness()
    assert C.shape == (6, 6)
    assert bool(tensors.is_positive_definite(C))
    assert bool(tensors.is_symmetric(C))


@pytest.mark.parametrize("key", KEYS)
def test_every_registry_entry_names_its_source(key):
    m = REG[key]
    assert m.key == key and m.name
    # a cited work carries a year; otherwise the entry must say it is from memory
    assert "from memory" in m.source or re.search(r"\b(19|20)\d\d\b", m.source), m.source
    for field, note in m.notes.items():
        assert note.strip(), field


@pytest.mark.parametrize("key", FIBRES_REQUIRED + MATRICES_REQUIRED)
def test_fibres_and_matrices_carry_density(key):
    assert REG[key].density is not None
    assert 800.0 < REG[key].density < 3000.0  # polymers to glass, kg/m^3, common practice


@pytest.mark.parametrize("key", ["carbon-standard", "carbon-intermediate", "carbon-high-modulus"])
def test_carbon_fibres_are_transversely_isotropic_with_negative_axial_cte(key):
    f = REG[key]
    assert isinstance(f, TransverselyIsotropic)
    assert f.E2 < f.E1 and f.G23 is not None and f.nu23 is not None
    assert f.alpha1 is not None and f.alpha1 < 0.0


def test_carbon_grades_increase_in_axial_modulus():
    e = [REG[k].E1 for k in ("carbon-standard", "carbon-intermediate", "carbon-high-modulus")]
    assert e == sorted(e)


def test_glass_grades_and_matrices_are_isotropic():
    for key in ("e-glass", "s-glass", "basalt", *MATRICES_REQUIRED):
        assert isinstance(REG[key], Isotropic), key
    assert REG["s-glass"].E > REG["e-glass"].E


def test_aramid_is_transversely_isotropic_and_weak_in_compression():
    a = REG["aramid"]
    assert isinstance(a, TransverselyIsotropic)
    assert a.strengths.Xc < a.strengths.Xt


def test_matrices_give_tensile_strength():
    for key in MATRICES_REQUIRED:
        assert REG[key].strengths is not None and REG[key].strengths.Xt is not None, key


def test_lookup_is_case_insensitive():
    assert REG["E-Glass"] is REG["e-glass"]
    assert "EPOXY" in REG and 3 not in REG


def test_raw_and_source_file_describe_the_entry():
    assert REG.raw("epoxy")["E"] == "3.5 GPa"
    assert REG.source_file("epoxy").name == "matrices.toml"


def test_bundled_directory_is_found_next_to_the_package():
    d = registry_module.bundled_directory()
    assert (d / "fibres.toml").is_file()


def test_bundled_directory_missing_raises(monkeypatch, tmp_path):
    import micromech.resources as resources

    monkeypatch.setattr(resources, "data_candidates", lambda name: [tmp_path / "nowhere"])
    with pytest.raises(RegistryError, match=r"bundled materials data not found; looked in"):
        registry_module.bundled_directory()


# --- lookups ----------------------------------------------------------------------------------


def test_unknown_key_suggests_the_nearest_keys():
    with pytest.raises(RegistryError, match=r"unknown material 'carbon'; did you mean "
                       r"'carbon-\w+', 'carbon-[\w-]+' or 'carbon-[\w-]+'\?"):
        REG["carbon"]


def test_registry_error_is_also_a_key_error():
    with pytest.raises(KeyError):
        REG["no-such-thing-at-all"]


def test_module_functions_use_the_default_registry(monkeypatch):
    monkeypatch.delenv(registry_module.ENV_VAR, raising=False)
    assert get_material("epoxy").E == pytest.approx(3.5e9)
    keys = [m.key for m in list_materials()]
    assert keys == sorted(keys) and "peek" in keys
    assert default_registry() is default_registry()


# --- user files -------------------------------------------------------------------------------


def test_user_file_adds_materials(tmp_path):
    f = write(tmp_path / "mine.toml", '[my-resin]\nE = "3.1 GPa"\nnu = 0.36\nrole = "matrix"\n'
                                      'source = "invented for a test"\n')
    reg = Registry([f], use_env=False)
    assert reg["my-resin"].E == pytest.approx(3.1e9)
    assert len(reg) == len(REG) + 1


def test_user_folder_is_searched_recursively(tmp_path):
    (tmp_path / "sub").mkdir()
    write(tmp_path / "sub" / "a.toml", "[resin-a]\nE = 3e9\nnu = 0.3\n")
    write(tmp_path / "b.toml", "[resin-b]\nE = 2e9\nnu = 0.3\n")
    reg = Registry([tmp_path], bundled=False, use_env=False)
    assert list(reg) == ["resin-a", "resin-b"]


def test_environment_variable_paths_are_read(tmp_path, monkeypatch):
    a = write(tmp_path / "a.toml", "[resin-a]\nE = 3e9\nnu = 0.3\n")
    b = write(tmp_path / "b.toml", "[resin-b]\nE = 2e9\nnu = 0.3\n")
    monkeypatch.setenv(registry_module.ENV_VAR, f"{a}{registry_module.os.pathsep}{b}")
    reg = Registry(bundled=False)
    assert set(reg) == {"resin-a", "resin-b"}
    assert "resin-a" in default_registry()


def test_key_defined_twice_names_both_files(tmp_path):
    a = write(tmp_path / "a.toml", "[resin]\nE = 3e9\nnu = 0.3\n")
    b = write(tmp_path / "b.toml", "[RESIN]\nE = 2e9\nnu = 0.3\n")
    with pytest.raises(RegistryError, match=r"material key 'resin' is defined twice: in "
                       r".*a\.toml and in .*b\.toml"):
        Registry([a, b], bundled=False, use_env=False)


def test_user_key_clashing_with_bundled_key_is_an_error(tmp_path):
    f = write(tmp_path / "mine.toml", "[epoxy]\nE = 3e9\nnu = 0.3\n")
    with pytest.raises(RegistryError, match=r"'epoxy' is defined twice: in .*matrices\.toml "
                       r"and in .*mine\.toml"):
        Registry([f], use_env=False)


def test_same_file_given_twice_is_read_once(tmp_path):
    f = write(tmp_path / "a.toml", "[resin]\nE = 3e9\nnu = 0.3\n")
    assert len(Registry([f, tmp_path], bundled=False, use_env=False)) == 1


def test_malformed_toml_names_file_and_line(tmp_path):
    f = write(tmp_path / "bad.toml", "[resin]\nE = = 3\n")
    with pytest.raises(RegistryError, match=r"bad\.toml: malformed TOML: .*line 2"):
        Registry([f], bundled=False, use_env=False)


def test_non_utf8_file_is_rejected(tmp_path):
    f = tmp_path / "latin.toml"
    f.write_bytes(b"[r\xe9sin]\nE = 3e9\n")
    with pytest.raises(RegistryError, match=r"latin\.toml: not UTF-8 text"):
        Registry([f], bundled=False, use_env=False)


def test_top_level_value_must_be_a_table(tmp_path):
    f = write(tmp_path / "flat.toml", 'E = "3 GPa"\n')
    with pytest.raises(RegistryError, match=r"top-level key 'E' must be a table of constants"):
        Registry([f], bundled=False, use_env=False)


def test_key_with_odd_characters_is_rejected(tmp_path):
    f = write(tmp_path / "k.toml", '["my resin"]\nE = 3e9\nnu = 0.3\n')
    with pytest.raises(RegistryError, match=r"key 'my resin' must be letters, digits"):
        Registry([f], bundled=False, use_env=False)


def test_use_is_not_allowed_in_registry_files(tmp_path):
    f = write(tmp_path / "u.toml", '[copy]\nuse = "epoxy"\n')
    with pytest.raises(RegistryError, match=r"\[copy\] 'use' is only allowed in case files"):
        Registry([f], bundled=False, use_env=False)


def test_invalid_constants_in_a_file_name_file_and_key(tmp_path):
    f = write(tmp_path / "v.toml", "[soft]\nE = 3e9\nnu = 0.6\n")
    with pytest.raises(InvalidMaterialError, match=r"v\.toml: \[soft\]: isotropic material "
                       r"'soft': nu = 0\.6 makes the stiffness not positive definite"):
        Registry([f], bundled=False, use_env=False)
    with pytest.raises(InvalidMaterialError, match=r"^[^:]*v\.toml: \[soft\]: "):  # file once
        Registry([f], bundled=False, use_env=False)


def test_missing_path_is_an_error(tmp_path):
    with pytest.raises(RegistryError, match=r"materials path .*nope\.toml' does not exist"):
        Registry([tmp_path / "nope.toml"], bundled=False, use_env=False)


# --- resolve: key, inline, use + overrides ----------------------------------------------------


def test_resolve_key_inline_and_material():
    assert REG.resolve("epoxy") is REG["epoxy"]
    m = REG.resolve({"E": "3 GPa", "nu": 0.3})
    assert isinstance(m, Isotropic) and m.E == 3e9
    assert REG.resolve(m) is m


def test_use_with_override_replaces_single_fields():
    m = REG.resolve({"use": "e-glass", "E": "74 GPa"}, label="[fibre]")
    assert m.E == pytest.approx(74e9)
    assert m.nu == REG["e-glass"].nu and m.density == REG["e-glass"].density
    assert m.G == pytest.approx(74e9 / (2 * (1 + m.nu)))
    assert "overridden in [fibre]" in m.notes["E"]
    assert REG.resolve({"use": "epoxy"}) is REG["epoxy"]


def test_overriding_g23_rederives_nu23():
    m = REG.resolve({"use": "carbon-standard", "G23": "6 GPa"})
    assert m.nu23 == pytest.approx(15 / 12 - 1)


def test_strength_overrides_merge_with_registry_strengths():
    m = REG.resolve({"use": "epoxy", "strengths": {"Xt": "70 MPa"}})
    assert m.strengths.Xt == pytest.approx(70e6)
    assert m.strengths.Xc == REG["epoxy"].strengths.Xc


def test_use_unknown_key_names_the_table():
    with pytest.raises(RegistryError, match=r"\[fibre\]: unknown material 'eglass'; did you "
                       r"mean 'e-glass'"):
        REG.resolve({"use": "eglass"}, label="[fibre]")


def test_override_with_unknown_field_suggests_nearest():
    with pytest.raises(InvalidMaterialError, match=r"\[fibre\]: unknown key 'E1' for isotropic "
                       r"material 'e-glass'; did you mean 'E'\?"):
        REG.resolve({"use": "e-glass", "E1": "74 GPa"}, label="[fibre]")


def test_override_that_breaks_a_rule_names_the_table():
    with pytest.raises(InvalidMaterialError, match=r"\[matrix\]: isotropic material .*nu = 0.55"):
        REG.resolve({"use": "epoxy", "nu": 0.55}, label="[matrix]")


def test_override_of_kind_is_refused():
    with pytest.raises(InvalidMaterialError, match=r"kind = 'orthotropic' conflicts with "
                       r"'epoxy' which is isotropic"):
        REG.resolve({"use": "epoxy", "kind": "orthotropic"})


def test_use_must_be_text():
    with pytest.raises(InvalidMaterialError, match=r"use = 3 must be a registry key"):
        REG.resolve({"use": 3})


def test_resolve_rejects_other_values():
    with pytest.raises(InvalidMaterialError, match=r"expected a registry key or a table"):
        REG.resolve(72e9)


def test_load_material_reads_inline_tables_without_the_registry():
    m = load_material({"E": 1e9, "nu": 0.2}, registry=None)
    assert m.E == 1e9
    assert load_material("epoxy", registry=REG) is REG["epoxy"]
    assert np.isclose(load_material({"use": "epoxy", "E": 3e9}).E, 3e9)
