"""Tests of the `micromech materials` command."""

from __future__ import annotations

import json

from click.testing import CliRunner

from micromech.cli import cli


def run(*args, env=None):
    return CliRunner().invoke(cli, ["materials", *args], env=env or {"MICROMECH_MATERIALS": ""})


def test_list_shows_keys_kinds_moduli_density_and_caution():
    r = run()
    assert r.exit_code == 0, r.output
    lines = r.output.splitlines()
    assert lines[0].split()[:4] == ["key", "kind", "role", "E1"]
    glass = next(line for line in lines if line.startswith("e-glass"))
    assert glass.split()[:5] == ["e-glass", "isotropic", "fibre", "72", "72"]
    assert glass.split()[-1] == "2.55"  # g/cm^3
    assert "not design allowables" in r.output


def test_list_as_json_is_si():
    r = run("--json")
    assert r.exit_code == 0
    data = json.loads(r.output)
    by_key = {m["key"]: m for m in data["materials"]}
    assert by_key["epoxy"]["E"] == 3.5e9
    assert by_key["carbon-standard"]["kind"] == "transversely_isotropic"
    assert by_key["epoxy"]["file"].endswith("matrices.toml")
    assert "caution" in data


def test_show_one_material_with_units_sources_and_derived_values():
    r = run("carbon-standard")
    assert r.exit_code == 0
    assert "E1             230 GPa" in r.output
    assert "(derived)" in r.output  # G23 follows from E2 and nu23
    assert "source: typical value from memory" in r.output
    assert "alpha1         -0.5 1e-6/K" in r.output


def test_show_lists_notes_of_fields_without_value():
    r = run("flax")
    assert r.exit_code == 0
    assert "alpha1" in r.output and "swell with moisture" in r.output


def test_show_one_as_json():
    data = json.loads(run("epoxy", "--json").output)
    assert data["material"]["nu"] == 0.35 and data["material"]["strengths"]["Xt"] == 80e6


def test_unknown_key_exits_2_with_suggestion():
    r = run("carbn")
    assert r.exit_code == 2
    assert "error: unknown material 'carbn'; did you mean 'carbon-" in r.output


def test_extra_registry_file(tmp_path):
    f = tmp_path / "mine.toml"
    f.write_text('[my-resin]\nE = "3.1 GPa"\nnu = 0.36\n', encoding="utf-8")
    r = run("my-resin", "--registry", str(f))
    assert r.exit_code == 0 and "3.1 GPa" in r.output
    assert str(f) in r.output


def test_environment_variable_registry(tmp_path):
    f = tmp_path / "env.toml"
    f.write_text("[env-resin]\nE = 2e9\nnu = 0.3\n", encoding="utf-8")
    r = run(env={"MICROMECH_MATERIALS": str(f)})
    assert "env-resin" in r.output


def test_missing_registry_path_exits_2_with_an_error_line(tmp_path):
    r = run("--registry", str(tmp_path / "nope.toml"))
    assert r.exit_code == 2
    assert r.output.startswith("error: materials path ") and "does not exist" in r.output


def test_bad_registry_file_names_the_file_once_and_the_entry(tmp_path):
    f = tmp_path / "bad.toml"
    f.write_text('[my-resin]\nE = "3.1 mm"\nnu = 0.36\n', encoding="utf-8")
    r = run("--registry", str(f))
    assert r.exit_code == 2 and r.output.count("bad.toml") == 1
    assert "[my-resin]: isotropic material 'my-resin': E expects a pressure" in r.output
