"""The end-to-end tour on the bundled invented cases: estimate, size, laminate, check.

``run_demo(out_dir)`` runs the whole job on ``data/demo`` and writes one report folder:

- ``report.html`` (self-contained: plots embedded) and ``report.md``: every step's table;
- ``estimate.png``, ``sizing.png``: properties against fibre fraction with the bound band;
- ``envelope.png``: the laminate's first-ply failure envelope in Nx-Ny for four criteria;
- ``check/crossply/`` and ``check/crossply_bad/``: the RVE check reports of the good case and of
  the copy with a deliberate unit slip and a wrong cell size;
- ``summary.json``: the JSON of every step (SI units).

All demo data are invented (see ``data/demo/README.md``); nothing in them is a measurement.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from micromech.errors import InputError

__all__ = ["DemoRun", "run_demo", "DEMO_TARGETS"]

#: Targets of the sizing step of the demo (invented requirements for the invented panel).
DEMO_TARGETS: tuple[str, ...] = ("E1>=35 GPa", "E2>=10 GPa", "Ex>=18 GPa")


@dataclass(frozen=True)
class DemoRun:
    """What the demo wrote and printed.

    Attributes
    ----------
    directory : Path
        The report folder.
    files : dict of str to Path
        The main files written, by role.
    sections : dict of str to str
        The text table of each step (estimate, size, laminate, check, check_bad).
    summary : str
        A short terminal summary: the tables without the per-property reasons (those are in
        the reports).
    verdicts : dict of str to str
        Worst verdict of each checked demo case.
    """

    directory: Path
    files: dict[str, Path]
    sections: dict[str, str]
    summary: str
    verdicts: dict[str, str]


def _guard(out: Path, demo: Path) -> None:
    """Refuse a report folder that would mix with (and so risk) the demo inputs."""
    o, d = out.resolve(), demo.resolve()
    if o == d or d in o.parents or o in d.parents:
        raise InputError(
            f"--out: the report folder {out} must lie outside the demo data folder {demo} "
            "(a report never writes over or beside its inputs)"
        )


def run_demo(out_dir: str | Path) -> DemoRun:
    """Run estimate, size, laminate and check on the invented demo cases; write a report.

    Parameters
    ----------
    out_dir : str or Path
        Report folder (created if missing; files in it are replaced whole).

    Returns
    -------
    DemoRun
        Paths written, text of each step and the verdicts.

    Examples
    --------
    >>> import tempfile
    >>> run = run_demo(tempfile.mkdtemp())  # doctest: +SKIP
    >>> run.verdicts["crossply"]  # doctest: +SKIP
    'consistent'
    """
    from micromech.case import load_case
    from micromech.design import size_fraction
    from micromech.homogenize import estimate
    from micromech.laminate import (
        analyse_laminate,
        failure_envelope,
        laminate_from_case,
        plot_envelopes,
    )
    from micromech.report.check import demo_directory, format_check_text, run_demo_check
    from micromech.report.design import CAUTION, plot_sizing, sizing_table
    from micromech.report.estimate import estimate_table, plot_estimates
    from micromech.report.html import escape, html_document, image_tag
    from micromech.report.laminate import laminate_json, laminate_table
    from micromech.report.markdown import write_atomic
    from micromech.report.text import json_default

    demo = demo_directory()
    out = Path(out_dir)
    _guard(out, demo)
    out.mkdir(parents=True, exist_ok=True)

    panel = load_case(demo / "panel.toml")
    assert panel.composite is not None and panel.laminate is not None
    est = estimate(panel.composite, case=panel.name)
    files = {"estimate_plot": plot_estimates(est, out / "estimate.png")}

    sizing = size_fraction(panel, list(DEMO_TARGETS))  # the case contributes its layup
    files["sizing_plot"] = plot_sizing(panel, sizing, out / "sizing.png")

    lam = laminate_from_case(panel)
    analysis = analyse_laminate(lam, panel.laminate.loads)
    envelopes = [failure_envelope(lam, "Nx,Ny", c, delta_T=analysis.delta_T)
                 for c in ("max_stress", "tsai_hill", "tsai_wu", "hashin")]
    files["envelope_plot"] = plot_envelopes(
        envelopes, out / "envelope.png",
        title=f"{lam.code}: first-ply failure envelope (cure cool-down held fixed)")

    checks = run_demo_check(out / "check")
    sections = {
        "estimate": estimate_table(est),
        "size": sizing_table(sizing, title=f"{panel.name}: fibre fraction for the targets"),
        "laminate": laminate_table(analysis, case=panel.name),
        "check": format_check_text(checks["crossply"]),
        "check_bad": format_check_text(checks["crossply_bad"]),
    }
    verdicts = {k: str(r.worst_verdict) for k, r in checks.items()}

    titles = {
        "estimate": "1. Estimates and bounds of the panel's ply (before modelling)",
        "size": "2. Fibre fraction that meets the stiffness targets",
        "laminate": "3. Laminate: ABD, constants, ply stresses and failure",
        "check": "4. RVE check of the invented cross-ply run (good)",
        "check_bad": "5. RVE check of the same run with a unit slip and a wrong cell size",
    }
    images = {"estimate": "estimate.png", "size": "sizing.png", "laminate": "envelope.png"}
    links = {"check": "check/crossply/report.html", "check_bad": "check/crossply_bad/report.html"}

    md = ["# micromech demo (invented example data)", "", f"> Caution: {CAUTION}", ""]
    body = ["<p>All data in this demo are invented; nothing here is a measurement.</p>"]
    for key, text in sections.items():
        md += [f"## {titles[key]}", "", "```", text, "```", ""]
        body.append(f"<h2>{escape(titles[key])}</h2>")
        if key in images:
            md += [f"![{key}]({images[key]})", ""]
            body.append(image_tag((out / images[key]).read_bytes(), alt=titles[key]))
        if key in links:
            md += [f"Full report: [{links[key]}]({links[key]})", ""]
            body.append(f'<p>Full report: <a href="{links[key]}">{escape(links[key])}</a></p>')
        body.append(f"<pre>{escape(text)}</pre>")
    files["markdown"] = write_atomic(out / "report.md", "\n".join(md))
    files["html"] = write_atomic(
        out / "report.html", html_document("micromech demo (invented example data)",
                                           "\n".join(body), caution=CAUTION))
    summary: dict[str, Any] = {
        "estimate": est.as_dict(),
        "size": sizing.as_dict(),
        "laminate": laminate_json(analysis, case=panel.name),
        "check": {k: r.as_dict() for k, r in checks.items()},
        "caution": CAUTION,
    }
    files["json"] = write_atomic(
        out / "summary.json", json.dumps(summary, indent=2, default=json_default) + "\n")
    short = [text.split("\nReasons:", 1)[0].rstrip() if key.startswith("check") else text
             for key, text in sections.items()]
    short.append(f"(the reasons behind every verdict are in {out / 'check'})")
    return DemoRun(directory=out, files=files, sections=sections,
                   summary="\n\n".join(short), verdicts=verdicts)
