"""The reference docs stay true: case-file examples load, documented keys match the code and output.

* Every TOML block of ``docs/case-file.md`` loads with :func:`micromech.case.case_from_dict`
  (file names resolved against ``data/demo/``, where the demo histories live).
* The key tables of ``docs/case-file.md`` list exactly the keys ``micromech/case.py`` accepts.
* Every key path of ``docs/json-output.md`` appears in the real ``--json`` output of its command
  on the demo cases (``data/demo/panel.toml`` for estimate, laminate and size,
  ``data/demo/crossply.toml`` for check), and every key of that output is documented.
* Every page of ``docs/`` carries the caution.
"""

from __future__ import annotations

import json
import re
import tomllib
from pathlib import Path
from typing import Any

import numpy as np
import pytest
from click.testing import CliRunner

from micromech import case as case_module
from micromech.case import case_from_dict
from micromech.cli import cli
from micromech.rve.tolerances import parse_tolerances

ROOT = Path(__file__).resolve().parents[1]
DOCS = ROOT / "docs"
DEMO = ROOT / "data" / "demo"
CAUTION = ("Estimates and bounds are not design allowables: qualified test data, the\n"
           "> applicable codes and a licensed engineer decide.")


# ------------------------------------------------------------------------------------------
# docs/case-file.md


def _toml_blocks() -> list[str]:
    text = (DOCS / "case-file.md").read_text(encoding="utf-8")
    return re.findall(r"```toml\n(.*?)```", text, flags=re.S)


def _sections(path: Path) -> dict[str, str]:
    """Markdown text by level-2 heading (heading text without backticks)."""
    out: dict[str, str] = {}
    name = ""
    for line in path.read_text(encoding="utf-8").splitlines():
        if line.startswith("## "):
            name = line[3:].replace("`", "").strip()
            out[name] = ""
        elif name:
            out[name] += line + "\n"
    return out


def _key_table_keys(section: str) -> set[str]:
    """Keys in the first column of the tables whose header starts with ``| key |``."""
    keys: set[str] = set()
    in_table = False
    for line in section.splitlines():
        if line.startswith("| key |"):
            in_table = True
            continue
        if not line.startswith("|"):
            in_table = False
            continue
        if in_table and not line.startswith("|---"):
            cell = line.split("|")[1].strip()
            if re.fullmatch(r"`\w+`(, `\w+`)*", cell):
                keys.update(re.findall(r"`(\w+)`", cell))
    return keys


def test_case_file_has_toml_examples() -> None:
    assert len(_toml_blocks()) >= 10


@pytest.mark.parametrize("block", _toml_blocks(), ids=lambda b: b.splitlines()[0][:40])
def test_case_file_example_loads(block: str) -> None:
    data = tomllib.loads(block)
    case = case_from_dict(data, path=DEMO / "docs-example.toml")
    for name in data:  # every table given is read ([ply] may hold strengths only)
        attrs = ("ply", "ply_strengths") if name == "ply" else (name,)
        assert any(getattr(case, a, None) not in (None, {}, "") for a in attrs), name
    parse_tolerances(case.check.get("tolerance", {}))  # tolerance names checked as `check` does


# section of docs/case-file.md -> keys micromech/case.py accepts there
_CODE_KEYS = {
    "Top level": set(case_module._TOP_KEYS),
    "[fibre] and [matrix]": set(case_module._MATERIAL_KEYS),
    "[composite]": set(case_module._COMPOSITE_KEYS),
    "[ply]": {"model", *case_module.STRENGTH_KEYS},
    "[laminate]": {*case_module._LAMINATE_KEYS, *case_module.LOAD_KEYS},
    "[rve]": {*case_module._RVE_KEYS, "matrix", "unit"},
    "[[rve.load_case]]": set(case_module._LOAD_CASE_KEYS),
    "[check]": set(case_module._CHECK_KEYS),
}


@pytest.mark.parametrize("section", sorted(_CODE_KEYS))
def test_case_file_key_tables_match_the_validation(section: str) -> None:
    text = _sections(DOCS / "case-file.md")[section]
    documented = _key_table_keys(text)
    code = _CODE_KEYS[section]
    assert documented <= code, f"documented but not accepted: {sorted(documented - code)}"
    mentioned = set(re.findall(r"`(\w+)`", text))
    assert code <= mentioned, f"accepted but not documented: {sorted(code - mentioned)}"


# ------------------------------------------------------------------------------------------
# docs/json-output.md


def _run(args: list[str], expect: int = 0) -> dict[str, Any]:
    result = CliRunner().invoke(cli, args)
    assert result.exit_code == expect, result.output
    out: dict[str, Any] = json.loads(result.stdout)
    return out


def _averaged_case(folder: Path) -> Path:
    """An invented UD case with six averaged load cases (isotropic-looking numbers, SI)."""
    C = np.diag([140e9, 11e9, 11e9, 3e9, 4e9, 4e9])
    C[0, 1] = C[1, 0] = C[0, 2] = C[2, 0] = 5e9
    C[1, 2] = C[2, 1] = 5e9
    rows = []
    for i in range(6):
        e = np.zeros(6)
        e[i] = 1e-3
        rows.append(f"[[rve.load_case]]\nstrain = {e.tolist()}\nstress = {(C @ e).tolist()}\n")
    text = ('name = "invented: averaged load cases"\n[fibre]\nuse = "carbon-standard"\n'
            '[matrix]\nuse = "epoxy"\n[composite]\nvolume_fraction = 0.6\n'
            '[rve]\narchitecture = "unidirectional"\n' + "".join(rows))
    path = folder / "averaged.toml"
    path.write_text(text, encoding="utf-8")
    return path


@pytest.fixture(scope="module")
def outputs(tmp_path_factory: pytest.TempPathFactory) -> dict[str, list[dict[str, Any]]]:
    tmp = tmp_path_factory.mktemp("docs")
    panel, crossply = str(DEMO / "panel.toml"), str(DEMO / "crossply.toml")
    return {
        "estimate": [_run(["estimate", panel, "--json"])],
        "laminate": [_run(["laminate", panel, "--json", "--envelope", "Nx,Ny",
                           "--points", "13"])],
        "size": [_run(["size", panel, "--json", "-t", "E2>=9GPa", "-t", "Ex>=20GPa",
                       "--uncertainty", "200", "--seed", "1"])],
        "check": [_run(["check", crossply, "--json"]),
                  _run(["check", str(_averaged_case(tmp)), "--json"])],
        "rve": [_run(["rve", "--fraction", "0.5", "--diameter", "7 um", "--packing",
                      "hexagonal", "--json"]),
                _run(["rve", "--fraction", "0.5", "--diameter", "7 um", "--fibres", "12",
                      "--seed", "1", "--json"])],
        "materials": [_run(["materials", "--json"]), _run(["materials", "epoxy", "--json"])],
    }


#: Documented paths written only with an option that is slow to run (figures are drawn).
_SLOW_PATHS = ("report.",)


def _documented_paths() -> dict[str, list[str]]:
    out: dict[str, list[str]] = {}
    for name, text in _sections(DOCS / "json-output.md").items():
        paths = re.findall(r"^\| `([^`]+)` \|", text, flags=re.M)
        if paths:
            out[name] = paths
    return out


def _tokens(path: str) -> list[str]:
    return [t for t in re.split(r"\.|(\[\])", path) if t]


def _resolves(obj: Any, tokens: list[str]) -> bool:
    """Whether a documented path exists in ``obj`` (an empty map or list counts as present)."""
    if not tokens:
        return True
    head, rest = tokens[0], tokens[1:]
    if head == "[]":
        return isinstance(obj, list) and (not obj or any(_resolves(e, rest) for e in obj))
    if not isinstance(obj, dict):
        return False
    if head.startswith("<"):
        return not obj or any(_resolves(v, rest) for v in obj.values())
    return head in obj and _resolves(obj[head], rest)


def _leaves(obj: Any, prefix: tuple[str, ...] = ()) -> list[tuple[str, ...]]:
    """Key paths to every value that is not an object or a list of objects."""
    if isinstance(obj, dict) and obj:
        return [p for k, v in obj.items() for p in _leaves(v, (*prefix, k))]
    if isinstance(obj, list) and obj and all(isinstance(e, dict) for e in obj):
        return [p for e in obj for p in _leaves(e, (*prefix, "[]"))]
    return [prefix]


def _matches(leaf: tuple[str, ...], pattern: list[str]) -> bool:
    """A leaf matches a pattern of the same length, or is an empty container it starts."""
    if len(pattern) < len(leaf):
        return False
    for a, b in zip(leaf, pattern, strict=False):
        if not (a == b or (b.startswith("<") and a != "[]")):
            return False
    return True


def test_json_doc_covers_each_command() -> None:
    assert set(_documented_paths()) == {"estimate", "laminate", "size", "check", "rve",
                                        "materials"}


@pytest.mark.parametrize("command", ["estimate", "laminate", "size", "check", "rve",
                                     "materials"])
def test_json_documented_keys_appear_in_the_output(
    command: str, outputs: dict[str, list[dict[str, Any]]]
) -> None:
    missing = [p for p in _documented_paths()[command] if not p.startswith(_SLOW_PATHS)
               and not any(_resolves(o, _tokens(p)) for o in outputs[command])]
    assert not missing, f"{command}: documented but not in the --json output: {missing}"


@pytest.mark.slow
def test_json_check_report_keys_appear_with_report(tmp_path: Path) -> None:
    out = _run(["check", str(DEMO / "crossply.toml"), "--json", "--report", str(tmp_path)])
    paths = [p for p in _documented_paths()["check"] if p.startswith(_SLOW_PATHS)]
    assert paths
    assert all(_resolves(out, _tokens(p)) for p in paths)
    assert Path(out["report"]["html"]).is_file()


@pytest.mark.parametrize("command", ["estimate", "laminate", "size", "check", "rve",
                                     "materials"])
def test_json_output_keys_are_documented(
    command: str, outputs: dict[str, list[dict[str, Any]]]
) -> None:
    patterns = [_tokens(p) for p in _documented_paths()[command]]
    leaves = {leaf for o in outputs[command] for leaf in _leaves(o)}
    undocumented = sorted(".".join(leaf).replace(".[]", "[]") for leaf in leaves
                          if not any(_matches(leaf, p) for p in patterns))
    assert not undocumented, f"{command}: in the --json output but not documented: {undocumented}"


def test_json_check_demo_properties_are_graded(outputs: dict[str, list[dict[str, Any]]]) -> None:
    crossply = outputs["check"][0]
    assert crossply["worst_verdict"] == "consistent"
    assert set(crossply["curves"]) == {"x", "y", "z"}
    assert outputs["check"][1]["stiffness"]["source"] == "load_cases"


# ------------------------------------------------------------------------------------------
# every page


@pytest.mark.parametrize("page", ["case-file.md", "json-output.md", "verdicts.md", "models.md"])
def test_docs_page_starts_with_the_caution(page: str) -> None:
    head = (DOCS / page).read_text(encoding="utf-8")[:600]
    assert CAUTION in head
