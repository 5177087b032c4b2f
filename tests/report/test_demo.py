"""`micromech demo` runs the whole job on the invented cases and writes one report folder."""

from __future__ import annotations

import json

import pytest
from click.testing import CliRunner

from micromech.cli import cli
from micromech.errors import InputError
from micromech.report.check import demo_directory
from micromech.report.demo import run_demo


def test_demo_writes_a_report_and_shows_the_verdicts(tmp_path):
    out = tmp_path / "report"
    res = CliRunner().invoke(cli, ["demo", "--out", str(out), "--quiet"])
    assert res.exit_code == 0, res.output
    assert "crossply: consistent" in res.output and "crossply_bad: violates_bounds" in res.output
    for name in ("report.html", "report.md", "summary.json", "estimate.png", "sizing.png",
                 "check/crossply/report.html", "check/crossply_bad/report.html"):
        assert (out / name).is_file(), name
    html = (out / "report.html").read_text(encoding="utf-8")
    assert "not design allowables" in html and "invented" in html
    assert 'src="data:image/png;base64,' in html and "http" not in html  # self-contained
    summary = json.loads((out / "summary.json").read_text(encoding="utf-8"))
    assert set(summary) >= {"estimate", "size", "laminate", "check", "caution"}
    assert summary["check"]["crossply"]["worst_verdict"] == "consistent"


def test_demo_refuses_to_write_into_its_own_data_folder():
    with pytest.raises(InputError, match="must lie outside the demo data folder"):
        run_demo(demo_directory() / "report")
