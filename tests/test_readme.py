"""The README stays true: its quick start is what CI runs, and its API tour runs."""

from __future__ import annotations

import os
import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
README = (ROOT / "README.md").read_text(encoding="utf-8")


def _bash_blocks() -> list[str]:
    return [b.strip() for b in re.findall(r"```bash\n(.*?)```", README, re.S)]


def test_quick_start_is_exactly_two_commands():
    quick = README.split("## Quick start", 1)[1].split("\n## ", 1)[0]
    blocks = [b.strip() for b in re.findall(r"```bash\n(.*?)```", quick, re.S)]
    assert blocks == ["pip install -e . && micromech demo",
                      "pip install -e '.[test]' && python -m pytest"]


def test_ci_runs_exactly_the_readme_test_command():
    ci = (ROOT / ".ci" / "run").read_text(encoding="utf-8").splitlines()
    assert _bash_blocks()[1] in ci


def test_readme_opening_states_the_rve_job_and_the_caution():
    opening = README.split("## Quick start", 1)[0]
    assert "representative volume element" in opening and "RVE" in opening
    assert "not design allowables" in opening


def test_readme_api_tour_runs(monkeypatch):
    monkeypatch.chdir(ROOT)
    monkeypatch.setenv("MPLBACKEND", "Agg")
    code = re.findall(r"```python\n(.*?)```", README, re.S)[0]
    namespace: dict[str, object] = {}
    exec(compile(code, "README.md", "exec"), namespace)  # noqa: S102 - our own README
    assert str(namespace["result"].worst_verdict) == "consistent"  # type: ignore[attr-defined]
    assert os.fspath(ROOT)
