"""The design notebooks run top to bottom (they are part of the README's test command)."""

from __future__ import annotations

import os
import time
from pathlib import Path

import pytest

NOTEBOOKS = sorted((Path(__file__).resolve().parents[1] / "notebooks").glob("*.ipynb"))


def test_there_are_three_notebooks():
    assert len(NOTEBOOKS) >= 3, [p.name for p in NOTEBOOKS]


@pytest.mark.parametrize("path", NOTEBOOKS, ids=[p.stem for p in NOTEBOOKS])
def test_notebook_runs_top_to_bottom_within_a_minute(path, tmp_path):
    nbformat = pytest.importorskip("nbformat")
    nbclient = pytest.importorskip("nbclient")
    nb = nbformat.read(path, as_version=4)
    os.environ.setdefault("MPLBACKEND", "Agg")
    client = nbclient.NotebookClient(
        nb, timeout=120, kernel_name="python3", resources={"metadata": {"path": str(tmp_path)}}
    )
    start = time.perf_counter()
    client.execute()
    elapsed = time.perf_counter() - start
    assert elapsed < 60.0, f"{path.name} took {elapsed:.1f} s"
