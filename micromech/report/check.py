"""Reports of an RVE check: terminal table, Markdown and self-contained HTML with plots.

:func:`write_check_report` writes ``report.md``, ``report.html`` (figures embedded as base64
PNG, nothing fetched from elsewhere) and the PNG files into a folder. It never writes into the
folder of the case's input files, and replaces an earlier report only as whole files (temporary
file in the same folder, then :func:`os.replace`).

Plots (two PNG files): per load case a panel with the stress-strain curve, the modulus fit line
and its range, the offset line and the yield point (``curves.png``); per property a panel with an
interval chart of the rigorous bounds, the Hashin-Shtrikman band, the expected band, the
estimates and the simulated value (``properties.png``).

Every output carries the caution: estimates and bounds are not design allowables; qualified
test data, the applicable codes and a licensed engineer decide.
"""

from __future__ import annotations

import math
import textwrap
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from micromech.errors import InputError
from micromech.report.html import escape, html_document, html_table, image_tag
from micromech.report.markdown import markdown_table, write_atomic
from micromech.report.text import text_table
from micromech.rve.causes import format_property, model_label, property_kind
from micromech.units import format_si

__all__ = [
    "curves_figure",
    "demo_directory",
    "format_check_text",
    "properties_figure",
    "render_html",
    "render_markdown",
    "run_demo_check",
    "verdict_footnotes",
    "verdict_rows",
    "write_check_report",
]

#: Short labels of the estimates in the charts (explained in the caption).
SHORT_LABELS = {"mori_tanaka": "MT", "halpin_tsai": "HT", "cylinders": "CCA",
                "hashin_shtrikman_lower": "HS-", "hashin_shtrikman_upper": "HS+",
                "rule_of_mixtures": "RoM", "chamis": "Chamis"}
_VERDICT_COLOUR = {"consistent": "#1a7f37", "suspect": "#bf8700", "violates_bounds": "#cf222e"}
_HEADERS = ["property", "simulated", "lower bound", "upper bound", "best estimate",
            "expected band", "verdict"]


def _label(key: str | None) -> str:
    return "-" if key is None else model_label(key)


#: Marker of a limit-analysis bound in the bound columns, explained under the table.
LIMIT_MARK = " (LA)"
LIMIT_FOOTNOTE = (
    "(LA): limit-analysis bound of a strength for perfectly plastic, perfectly bonded phases "
    "(Drucker 1966), not a rigorous bound: a strength from a brittle or damage model may "
    "legitimately lie outside it, so a strength is at most suspect."
)
#: Verdict cell of a property that a load case names but its curve does not give.
NOT_GRADED = "not graded"


def _bound_cell(value: float | None, name: str) -> str:
    text = format_property(value, name)
    if value is not None and property_kind(name) == "strength":
        text += LIMIT_MARK
    return text


def verdict_rows(result: Any) -> tuple[list[str], list[list[str]]]:
    """Headers and rows of the verdict table (one row per property, units in the cells).

    Strength bounds carry the mark ``(LA)`` (limit analysis, see :func:`verdict_footnotes`).
    A yield strength the curve does not give (the offset line is never crossed) has a row of
    ``-`` with the verdict ``not graded``.

    Parameters
    ----------
    result : CheckResult
        The check.

    Returns
    -------
    (list of str, list of list of str)
        Headers and rows.
    """
    from micromech.rve.check import property_order

    rows = []
    for name, p in result.properties.items():
        best = p.best_estimate
        best_txt = ("-" if best is None
                    else f"{format_property(best, name)} ({_label(p.best_model)})")
        band = ("-" if p.band is None
                else f"{format_property(p.band[0], name)} .. {format_property(p.band[1], name)}")
        rows.append([name, format_property(p.value, name), _bound_cell(p.lower_bound, name),
                     _bound_cell(p.upper_bound, name), best_txt, band, p.verdict])
    rows += [[name, "-", "-", "-", "-", "-", NOT_GRADED] for name in _not_graded(result)]
    rows.sort(key=lambda r: property_order(r[0]))
    return list(_HEADERS), rows


def _not_graded(result: Any) -> dict[str, str]:
    return dict(getattr(result, "not_graded", None) or {})


def verdict_footnotes(result: Any) -> list[str]:
    """Return the notes under the verdict table: the limit-analysis mark, where it appears.

    Parameters
    ----------
    result : CheckResult
        The check.

    Returns
    -------
    list of str
        Sentences (empty when no strength has a bound).
    """
    marked = any(property_kind(n) == "strength"
                 and (p.lower_bound is not None or p.upper_bound is not None)
                 for n, p in result.properties.items())
    return [LIMIT_FOOTNOTE] if marked else []


def _curve_rows(result: Any) -> tuple[list[str], list[list[str]]]:
    headers = ["load case", "modulus", "fit range (strain)", "r2", "offset", "yield strength",
               "proportional limit", "ultimate strength", "strain at ultimate", "final strain",
               "failed", "energy to ultimate"]
    rows = []
    for d, c in result.curves.items():
        m = c.metrics
        lo, hi = m.modulus_fit_range
        rows.append([
            d, format_si(m.modulus, "pressure"), f"{lo:.3g} .. {hi:.3g}", f"{m.r2:.5f}",
            f"{m.yield_offset:g}",
            "-" if m.yield_strength is None else format_si(m.yield_strength, "pressure"),
            format_si(m.proportional_limit, "pressure"),
            format_si(m.ultimate_strength, "pressure"), f"{m.strain_at_ultimate:.4g}",
            f"{m.final_strain:.4g}", "yes" if m.failed else "no (lower limit)",
            f"{m.energy_to_ultimate / 1e6:.4g} MJ/m^3",
        ])
    return headers, rows


_STIFFNESS_AXES = ["11", "22", "33", "23", "13", "12"]


def _stiffness_summary(result: Any) -> str:
    """One sentence on the effective stiffness: where from, symmetry, positive definiteness."""
    eff = result.stiffness
    if result.stiffness_source == "load_cases":
        where = (f"fitted to {eff.n_cases} averaged load cases (relative residual "
                 f"{eff.residual:.2g}, strain condition number {eff.condition:.3g})")
    else:
        where = "given in the case file"
    pd = "yes" if eff.positive_definite else "NO (no stable material has it)"
    return (f"Effective stiffness {where}: symmetry error {100 * eff.symmetry_error:.3g} % "
            f"(max|C - C^T| / max|C|), positive definite: {pd}. The engineering constants are "
            "read from its symmetric part.")


def _stiffness_rows(result: Any) -> tuple[list[str], list[list[str]]]:
    """Tabulate the effective 6x6 stiffness in GPa (Voigt order, engineering shear strain)."""
    C = result.stiffness.stiffness
    headers = ["C (GPa)", *_STIFFNESS_AXES]
    rows = [[a, *(f"{C[i, j] / 1e9:.4g}" for j in range(6))]
            for i, a in enumerate(_STIFFNESS_AXES)]
    return headers, rows


def format_check_text(result: Any, *, all_reasons: bool = False, width: int = 100) -> str:
    """Format the terminal report: verdicts, reasons of the problems, curves, caution.

    The reasons are listed for every property that is not consistent (all with
    ``all_reasons``), followed by the curve metrics, the notes and the caution.

    Parameters
    ----------
    result : CheckResult
        The check.
    all_reasons : bool
        Also list the reasons of consistent properties.
    width : int
        Line width for wrapped reasons.

    Returns
    -------
    str
        The text.
    """
    out = [f"RVE check: {result.case}",
           f"architecture {result.architecture}, fibre fraction {result.volume_fraction:g} "
           f"({result.arrangement} arrangement); worst verdict: {result.worst_verdict}", ""]
    headers, rows = verdict_rows(result)
    out.append(text_table(headers, rows))
    out += [textwrap.fill(n, width) for n in verdict_footnotes(result)]
    shown = [(n, p.verdict, p.reasons) for n, p in result.properties.items()
             if all_reasons or p.verdict != "consistent"]
    shown += [(n, NOT_GRADED, (why,)) for n, why in _not_graded(result).items()]
    if shown:
        out += ["", "Reasons:"]
        for n, verdict, reasons in shown:
            out.append(f"{n} ({verdict}):")
            for r in reasons:
                out.append(textwrap.fill(r, width, initial_indent="  - ",
                                         subsequent_indent="    "))
    if result.curves:
        out += ["", "Load cases:"]
        out.append(text_table(*_curve_rows(result)))
    if result.stiffness is not None:
        out += ["", textwrap.fill(_stiffness_summary(result), width)]
        out.append(text_table(*_stiffness_rows(result)))
    if result.notes:
        out += ["", "Notes:"]
        out += [textwrap.fill(n, width, initial_indent="  - ", subsequent_indent="    ")
                for n in result.notes]
    out += ["", textwrap.fill(f"Caution: {result.caution}", width)]
    return "\n".join(out) + "\n"


# ------------------------------------------------------------------------------------------
# figures


def _figure(width: float, height: float) -> Any:
    from matplotlib.figure import Figure

    return Figure(figsize=(width, height))


def _draw_curve(ax: Any, curve: Any) -> None:
    """Draw one load case: curve, modulus fit and its range, offset line, yield, ultimate."""
    import numpy as np

    m = curve.metrics
    strain = np.asarray(curve.strain) * 100.0
    stress = np.asarray(curve.stress) / 1e6
    ax.plot(strain, stress, color="#0969da", lw=1.5, label="simulated")
    lo, hi = m.modulus_fit_range
    top = float(np.max(np.abs(curve.strain)))
    e_fit = np.linspace(0.0, min(top, 1.6 * abs(hi) + 0.25 * top), 50) * m.sign
    ax.plot(e_fit * 100, (m.modulus * e_fit + m.modulus_intercept) / 1e6, "k--", lw=1.0,
            label=f"modulus fit {format_si(m.modulus, 'pressure')} (r2 {m.r2:.4f})")
    ax.axvspan(lo * 100, hi * 100, color="0.85", alpha=0.6, lw=0, label="fit range")
    s_top = abs(m.ultimate_strength)
    e_off = np.linspace(m.yield_offset, m.yield_offset + s_top / m.modulus, 30) * m.sign
    ax.plot(e_off * 100, (m.modulus * (e_off - m.sign * m.yield_offset)
                          + m.modulus_intercept) / 1e6,
            ":", color="#cf222e", lw=1.2, label=f"offset {m.yield_offset:g}")
    if m.yield_strength is not None and m.yield_strain is not None:
        ax.plot([m.yield_strain * 100], [m.yield_strength / 1e6], "o", color="#cf222e",
                label=f"yield {format_si(m.yield_strength, 'pressure')}")
    ax.plot([m.strain_at_ultimate * 100], [m.ultimate_strength / 1e6], "x", color="k", ms=8,
            label=f"ultimate {format_si(m.ultimate_strength, 'pressure')}")
    shear = len(curve.direction) == 2
    ax.set_xlabel(("engineering shear strain" if shear else "strain") + " (%)")
    ax.set_ylabel(("shear stress" if shear else "stress") + " (MPa)")
    ax.set_title(f"load case {curve.direction}", fontsize=10)
    lo_s, hi_s = float(stress.min()), float(stress.max())
    ax.set_ylim(min(0.0, lo_s * 1.15), max(0.0, hi_s * 1.15))
    ax.grid(True, alpha=0.3)
    ax.legend(fontsize=6, loc="lower right")


def _draw_property(ax: Any, prop: Any) -> None:
    """Draw one interval chart: bounds, bands, estimates and the simulated value."""
    name = prop.name
    scale, unit = {"poisson": (1.0, ""), "strength": (1e6, "MPa")}.get(
        property_kind(name), (1e9, "GPa"))
    pts = [prop.value, prop.lower_bound, prop.upper_bound, *prop.estimates.values()]
    if prop.band:
        pts += list(prop.band)
    known = [v for v in pts if v is not None and math.isfinite(v)]
    positive = [v for v in known if v > 0]
    if len(positive) == len(known) and positive and max(positive) / min(positive) > 20.0:
        ax.set_xscale("log")
        ax.minorticks_off()

    def bar(lo: float | None, hi: float | None, h: float, colour: str, label: str) -> None:
        if lo is None or hi is None:
            return
        ax.barh(0.0, (hi - lo) / scale, left=lo / scale, height=h, color=colour, alpha=0.55,
                label=label)

    bar(prop.lower_bound, prop.upper_bound, 0.9, "0.75", "rigorous bounds")
    for b in (prop.lower_bound, prop.upper_bound):
        if b is not None:
            ax.plot([b / scale] * 2, [-0.45, 0.45], color="0.4", lw=2)
    if prop.hs_band:
        bar(prop.hs_band[0], prop.hs_band[1], 0.6, "#8c959f", "Hashin-Shtrikman band")
    if prop.band:
        bar(prop.band[0], prop.band[1], 0.35, "#2da44e", "expected band")
    for k, v in sorted(prop.estimates.items(), key=lambda kv: kv[1]):
        ax.plot([v / scale] * 2, [-0.3, 0.3], color="#57606a", lw=1)
        short = SHORT_LABELS.get(k.removeprefix("stack_"), k)
        ax.annotate(short, (v / scale, 0.32), rotation=45, fontsize=6, ha="left",
                    va="bottom", color="#57606a")
    colour = _VERDICT_COLOUR.get(prop.verdict, "k")
    ax.plot([prop.value / scale], [0.0], "D", color=colour, ms=8, label="simulated")
    ax.set_yticks([])
    ax.set_ylim(-0.6, 1.7)
    ax.set_xlabel(f"{name}" + (f" ({unit})" if unit else ""), fontsize=8)
    ax.set_title(f"{name}: {prop.verdict}", color=colour, fontsize=9, loc="left")
    ax.tick_params(labelsize=7)
    ax.grid(True, axis="x", alpha=0.3)


def curves_figure(result: Any) -> Any:
    """Stress-strain curves of all load cases, with modulus fit, offset line and yield point.

    Parameters
    ----------
    result : CheckResult
        The check (at least one curve).

    Returns
    -------
    matplotlib.figure.Figure
        One panel per load case (not attached to pyplot).
    """
    n = len(result.curves)
    cols = min(n, 3)
    rows = -(-n // cols)
    fig = _figure(4.2 * cols, 3.4 * rows)
    for i, c in enumerate(result.curves.values()):
        _draw_curve(fig.add_subplot(rows, cols, i + 1), c)
    fig.subplots_adjust(left=0.07, right=0.98, bottom=0.14 / rows, top=1 - 0.08 / rows,
                        wspace=0.28, hspace=0.35)
    return fig


def properties_figure(result: Any) -> Any:
    """Interval charts of every property: bounds, bands, estimates and the simulated value.

    Parameters
    ----------
    result : CheckResult
        The check (at least one property).

    Returns
    -------
    matplotlib.figure.Figure
        One panel per property, two columns (not attached to pyplot).
    """
    props = list(result.properties.values())
    cols = 2 if len(props) > 1 else 1
    rows = -(-len(props) // cols)
    fig = _figure(5.2 * cols, 1.55 * rows + 0.5)
    axes = [fig.add_subplot(rows, cols, i + 1) for i in range(len(props))]
    for ax, p in zip(axes, props, strict=True):
        _draw_property(ax, p)
    handles: dict[str, Any] = {}
    for ax in axes:
        for h, lab in zip(*ax.get_legend_handles_labels(), strict=True):
            handles.setdefault(lab, h)
    height = 1.55 * rows + 0.5
    fig.legend(list(handles.values()), list(handles), loc="lower center",
               ncol=len(handles), fontsize=7)
    fig.subplots_adjust(left=0.03, right=0.98, bottom=0.75 / height, top=1 - 0.25 / height,
                        wspace=0.08, hspace=1.25)
    return fig


_CHART_CAPTION = (
    "Light grey: rigorous bounds; darker grey: Hashin-Shtrikman band; green: expected band; "
    "ticks: estimates (MT Mori-Tanaka, HT Halpin-Tsai, CCA composite cylinders, HS-/HS+ "
    "Hashin-Shtrikman lower/upper, RoM rule of mixtures; for stacks: stacks of such plies); "
    "diamond: the simulated value, coloured by its verdict."
)


def _figures(result: Any) -> dict[str, tuple[str, bytes]]:
    """Render the figures: key -> (file name, PNG bytes)."""
    from micromech.report.html import figure_png

    out: dict[str, tuple[str, bytes]] = {}
    if result.curves:
        out["curves"] = ("curves.png", figure_png(curves_figure(result)))
    if result.properties:
        out["properties"] = ("properties.png", figure_png(properties_figure(result)))
    return out


# ------------------------------------------------------------------------------------------
# documents


def _summary(result: Any) -> list[tuple[str, str]]:
    return [
        ("case", result.case),
        ("case file", "-" if result.path is None else str(result.path)),
        ("architecture", result.architecture),
        ("fibre fraction", f"{result.volume_fraction:g} ({result.arrangement} arrangement)"),
        ("worst verdict", result.worst_verdict),
    ]


def render_markdown(result: Any, images: Mapping[str, str] | None = None) -> str:
    """Markdown report; figures referenced by file name (written next to it).

    Parameters
    ----------
    result : CheckResult
        The check.
    images : Mapping of str to str, optional
        Figure key (``curves``, ``properties``) -> file name.

    Returns
    -------
    str
        The Markdown text.
    """
    images = images or {}
    caution = f"> **Caution.** {result.caution}\n"
    out = [f"# RVE check: {result.case}\n", caution,
           markdown_table(["item", "value"], _summary(result))]
    headers, rows = verdict_rows(result)
    out += ["## Verdicts\n", markdown_table(headers, rows)]
    out += [f"{n}\n" for n in verdict_footnotes(result)]
    out.append("## Reasons\n")
    for n, p in result.properties.items():
        out.append(f"### {n}: {p.verdict}\n")
        out += [f"- {r}" for r in p.reasons]
        out.append("")
    for n, why in _not_graded(result).items():
        out += [f"### {n}: {NOT_GRADED}\n", f"- {why}", ""]
    if result.curves:
        out += ["## Load cases\n", markdown_table(*_curve_rows(result))]
        if "curves" in images:
            out.append(f"![stress-strain curves]({images['curves']})\n")
    if result.stiffness is not None:
        out += ["## Effective stiffness\n", f"{_stiffness_summary(result)}\n",
                markdown_table(*_stiffness_rows(result))]
    if "properties" in images:
        out += ["## Properties against bounds and estimates\n",
                f"![bounds, estimates and simulated values]({images['properties']})\n",
                f"{_CHART_CAPTION}\n"]
    if result.notes:
        out += ["## Notes\n", *[f"- {n}" for n in result.notes], ""]
    out.append(caution)
    return "\n".join(out)


def render_html(result: Any, images: Mapping[str, bytes] | None = None) -> str:
    """Self-contained HTML report; figures embedded as base64 PNG.

    Parameters
    ----------
    result : CheckResult
        The check.
    images : Mapping of str to bytes, optional
        Figure key -> PNG bytes.

    Returns
    -------
    str
        The HTML document.
    """
    images = images or {}
    body = [html_table(["item", "value"], _summary(result))]
    headers, rows = verdict_rows(result)
    blank: list[str | None] = [None] * (len(headers) - 1)
    classes = [[*blank, None if r[-1] == NOT_GRADED else r[-1]] for r in rows]
    body += ["<h2>Verdicts</h2>",
             html_table(headers, rows, numeric=[False, True, True, True, True, True, False],
                        cell_class=classes)]
    body += [f"<p>{escape(n)}</p>" for n in verdict_footnotes(result)]
    body.append("<h2>Reasons</h2>")
    for n, p in result.properties.items():
        body.append(f'<h3>{escape(n)}: <span class="{escape(p.verdict)}">'
                    f"{escape(p.verdict)}</span></h3>")
        body.append("<ul>" + "".join(f"<li>{escape(r)}</li>" for r in p.reasons) + "</ul>")
    for n, why in _not_graded(result).items():
        body.append(f"<h3>{escape(n)}: {NOT_GRADED}</h3><ul><li>{escape(why)}</li></ul>")
    if result.curves:
        body += ["<h2>Load cases</h2>", html_table(*_curve_rows(result))]
        if "curves" in images:
            body.append(image_tag(images["curves"], "stress-strain curves",
                                  "Curves with the modulus fit (dashed, grey: fit range), the "
                                  "offset line (dotted), the yield point and the ultimate point."))
    if result.stiffness is not None:
        body += ["<h2>Effective stiffness</h2>", f"<p>{escape(_stiffness_summary(result))}</p>",
                 html_table(*_stiffness_rows(result), numeric=[False] + [True] * 6)]
    if "properties" in images:
        body += ["<h2>Properties against bounds and estimates</h2>",
                 image_tag(images["properties"], "bounds, estimates and simulated values",
                           _CHART_CAPTION)]
    if result.notes:
        body += ["<h2>Notes</h2>",
                 "<ul>" + "".join(f"<li>{escape(n)}</li>" for n in result.notes) + "</ul>"]
    return html_document(f"RVE check: {result.case}", "\n".join(body), caution=result.caution)


def write_check_report(result: Any, directory: str | Path) -> dict[str, Path]:
    """Write report.md, report.html and the PNG figures into a folder.

    Parameters
    ----------
    result : CheckResult
        The check.
    directory : str or Path
        Target folder; created if missing. It may not be the folder of any input file.

    Returns
    -------
    dict of str to Path
        ``markdown``, ``html`` and one entry per figure.

    Raises
    ------
    InputError
        If the folder holds one of the case's input files, is an existing file, or cannot be
        created.
    """
    d = Path(directory)
    if d.exists() and not d.is_dir():
        raise InputError(f"report folder {str(d)!r} is an existing file; give a folder")
    target = d.resolve()
    clash = [p for p in result.inputs if Path(p).resolve().parent == target]
    if clash:
        names = ", ".join(Path(p).name for p in clash)
        raise InputError(
            f"report folder {str(d)!r} holds the case's input files ({names}); write the "
            "report to another folder so that the inputs are never overwritten"
        )
    try:
        d.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise InputError(
            f"report folder {str(d)!r} cannot be created ({exc.strerror or exc})"
        ) from None
    figures = _figures(result)
    written: dict[str, Path] = {}
    for key, (fname, png) in figures.items():
        written[key] = write_atomic(d / fname, png)
    written["markdown"] = write_atomic(
        d / "report.md", render_markdown(result, {k: f for k, (f, _) in figures.items()}))
    written["html"] = write_atomic(
        d / "report.html", render_html(result, {k: b for k, (_, b) in figures.items()}))
    return written


# ------------------------------------------------------------------------------------------
# demo


def demo_directory() -> Path:
    """Return the folder of the invented demo cases (source tree or installed data files).

    Returns
    -------
    Path
        The folder holding ``crossply.toml`` (see :func:`micromech.resources.data_directory`).

    Raises
    ------
    DataFileError
        If the demo data are not installed.
    """
    from micromech.resources import data_directory

    return data_directory("demo", "crossply.toml")


def run_demo_check(out_dir: str | Path, *, write: bool = True) -> dict[str, Any]:
    """Check the invented demo cases and write a report for each.

    The good case (``crossply``) grades consistent throughout; the bad one
    (``crossply_bad``: a force unit slip and a wrong cell size) shows all three verdicts.

    Parameters
    ----------
    out_dir : str or Path
        Folder for the reports: ``out_dir/crossply`` and ``out_dir/crossply_bad``.
    write : bool
        Whether to write the reports (False: only check).

    Returns
    -------
    dict of str to CheckResult
        By case stem.
    """
    from micromech.rve.check import check_case

    demo = demo_directory()
    out: dict[str, Any] = {}
    for stem in ("crossply", "crossply_bad"):
        r = check_case(demo / f"{stem}.toml")
        if write:
            write_check_report(r, Path(out_dir) / stem)
        out[stem] = r
    return out
