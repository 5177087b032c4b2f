"""The ``micromech`` command: parses arguments, calls the public API, prints.

Heavy modules (pint, matplotlib, scipy) are imported inside the commands that need them, so
``micromech --help`` answers quickly. Any :class:`~micromech.errors.MicromechError` is printed as
``error: <message>`` and exits with status 2; no traceback reaches the user.
"""

from __future__ import annotations

import json
import os
import sys
from typing import Any

import click

from micromech.errors import MicromechError


class _UserError(click.ClickException):
    exit_code = 2

    def show(self, file: Any = None) -> None:
        click.echo(f"error: {self.message}", err=True)


class _Group(click.Group):
    """Click group that turns the project's errors into a message and exit status 2."""

    def invoke(self, ctx: click.Context) -> Any:
        try:
            return super().invoke(ctx)
        except MicromechError as exc:
            raise _UserError(str(exc)) from None
        except (OSError, UnicodeDecodeError) as exc:
            raise _UserError(f"{exc}") from None
        except (click.ClickException, click.exceptions.Exit, click.Abort, SystemExit):
            raise
        except Exception as exc:  # noqa: BLE001 - the CLI never shows a bare traceback
            if os.environ.get("MICROMECH_DEBUG"):
                raise
            raise _UserError(
                f"internal error ({type(exc).__name__}: {exc}); please report it with the case "
                "file (set MICROMECH_DEBUG=1 to see the traceback)"
            ) from None


def emit_json(obj: Any) -> None:
    """Print one JSON object (SI units) to standard output."""
    from micromech.report.text import json_default

    click.echo(json.dumps(obj, indent=2, allow_nan=False, default=json_default))


@click.group(cls=_Group, context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="micromech")
def cli() -> None:
    """Size fibre composites before an RVE model, and check its results after.

    Estimates and bounds are not design allowables: qualified test data, the applicable codes
    and a licensed engineer decide.
    """


# --- materials (registry) -------------------------------------------------------------------

_MATERIALS_CAUTION = (
    "Typical values, not design allowables: qualified test data, the applicable codes and a "
    "licensed engineer decide."
)

# field -> (quantity kind for format_si, unit label for the detail view)
_MATERIAL_FIELDS: tuple[tuple[str, str], ...] = (
    ("E", "pressure"), ("G", "pressure"), ("nu", "dimensionless"), ("alpha", "expansion"),
    ("E1", "pressure"), ("E2", "pressure"), ("E3", "pressure"), ("G12", "pressure"),
    ("G13", "pressure"), ("G23", "pressure"), ("nu12", "dimensionless"),
    ("nu13", "dimensionless"), ("nu23", "dimensionless"), ("alpha1", "expansion"),
    ("alpha2", "expansion"), ("alpha3", "expansion"), ("density", "density"),
    ("fibre_diameter", "length"),
)


def _material_json(m: Any, registry: Any) -> dict[str, Any]:
    data = m.model_dump()
    data["file"] = str(registry.source_file(m.key)) if m.key in registry else None
    return data


@cli.command("materials")
@click.argument("key", required=False)
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI units).")
@click.option(
    "--registry", "paths", multiple=True, type=click.Path(),
    help="Extra registry file or folder (repeatable); MICROMECH_MATERIALS is also read.",
)
def materials_command(key: str | None, as_json: bool, paths: tuple[str, ...]) -> None:
    """List the materials registry, or show one material (KEY) with units and sources."""
    from micromech.materials import Registry
    from micromech.units import format_si

    reg = Registry(paths)
    if key is None:
        mats = [reg[k] for k in reg]
        if as_json:
            emit_json({"materials": [_material_json(m, reg) for m in mats],
                       "caution": _MATERIALS_CAUTION})
            return
        head = (f"{'key':<22}{'kind':<24}{'role':<10}{'E1 GPa':>8}{'E2 GPa':>8}{'G12 GPa':>9}"
                f"{'nu12':>7}{'density g/cm^3':>16}")
        click.echo(head)
        click.echo("-" * len(head))
        for m in mats:
            rho = "-" if m.density is None else f"{m.density / 1e3:.3g}"
            click.echo(
                f"{m.key:<22}{m.kind:<24}{m.role or '-':<10}{m.E1 / 1e9:>8.4g}{m.E2 / 1e9:>8.4g}"
                f"{m.G12 / 1e9:>9.4g}{m.nu12:>7.3g}{rho:>16}"
            )
        click.echo(f"\n{len(mats)} materials. {_MATERIALS_CAUTION}")
        return
    m = reg[key]
    if as_json:
        emit_json({"material": _material_json(m, reg), "caution": _MATERIALS_CAUTION})
        return
    click.echo(f"{m.key}: {m.name}")
    click.echo(f"  kind: {m.kind}    role: {m.role or '-'}")
    click.echo(f"  file: {reg.source_file(key)}")
    click.echo(f"  source: {m.source}")
    given = m.model_fields_set
    for name, kind in _MATERIAL_FIELDS:
        if name not in type(m).model_fields:
            continue
        value = getattr(m, name)
        if value is None:
            if name in m.notes:
                click.echo(f"  {name:<15}{'-':<18}  [{m.notes[name]}]")
            continue
        text = format_si(value, kind) if kind != "dimensionless" else f"{value:.4g}"
        flag = "" if name in given else "  (derived)"
        note = f"  [{m.notes[name]}]" if name in m.notes else ""
        click.echo(f"  {name:<15}{text:<18}{flag}{note}")
    if m.strengths is not None:
        for name, value in m.strengths.as_dict().items():
            note = f"  [{m.notes[name]}]" if name in m.notes else ""
            click.echo(f"  {name:<15}{format_si(value, 'pressure'):<18}{note}")
    for name, note in m.notes.items():
        if name not in type(m).model_fields and (m.strengths is None
                                                 or name not in m.strengths.as_dict()):
            click.echo(f"  note on {name}: {note}")
    click.echo(f"\n{_MATERIALS_CAUTION}")


# --- estimate (homogenize) ------------------------------------------------------------------


@cli.command("estimate")
@click.argument("case_file", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI units).")
@click.option("--plot", "plot_file", type=click.Path(dir_okay=False),
              help="Draw each property against fibre fraction to an image (.png, .svg, .pdf).")
@click.option("--misalignment", type=float, default=2.0, show_default=True,
              help="Fibre misalignment for the kink-band compression estimate, degrees.")
def estimate_command(case_file: str, as_json: bool, plot_file: str | None,
                     misalignment: float) -> None:
    """Mean-field estimates and rigorous bounds for the [composite] of CASE_FILE."""
    from micromech.case import load_case
    from micromech.errors import CaseFileError, InputError
    from micromech.homogenize import estimate
    from micromech.report.estimate import check_plot_path, estimate_table, plot_estimates

    if not misalignment > 0.0:
        raise InputError(f"--misalignment = {misalignment!r}: the fibre misalignment must be "
                         "positive (degrees)")
    if plot_file is not None:
        check_plot_path(plot_file, "--plot")
    case = load_case(case_file)
    if case.composite is None:
        missing = [t for t, v in (("[fibre]", case.fibre), ("[matrix]", case.matrix)) if v is None]
        raise CaseFileError(
            f"{case_file}: estimate needs [fibre], [matrix] and [composite] with a fibre fraction;"
            f" missing: {', '.join(missing) or '[composite]'}"
        )
    est = estimate(case.composite, case=case.name, misalignment_deg=misalignment)
    if plot_file is not None:
        plot_estimates(est, plot_file)
    if as_json:
        emit_json(est.as_dict())
        return
    click.echo(estimate_table(est))
    if plot_file is not None:
        click.echo(f"plot written to {plot_file}")


# --- laminate -------------------------------------------------------------------------------

_LAMINATE_CRITERIA = ("max_stress", "max_strain", "tsai_hill", "tsai_wu", "hashin")


def _output_path(path: str, option: str, *, image: bool = False) -> None:
    """Refuse an output file whose folder is missing (or, for images, an unknown format).

    Used by the laminate, rve and size commands, before any computing.
    """
    from micromech.errors import InputError

    if image:
        from micromech.report.files import check_image_path

        check_image_path(path, option)
        return
    folder = os.path.dirname(os.path.abspath(path))
    if not os.path.isdir(folder):
        raise InputError(f"{option} = {path!r}: folder {folder!r} does not exist")


@cli.command("laminate")
@click.argument("case_file", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI units).")
@click.option("--criterion", type=click.Choice(_LAMINATE_CRITERIA), default="tsai_wu",
              show_default=True, help="Criterion for the critical ply and first/last-ply failure.")
@click.option("--f12-star", type=float, default=-0.5, show_default=True,
              help="Tsai-Wu normalised interaction term, in (-1, 1).")
@click.option("--envelope", "envelope_axes", metavar="A,B",
              help="First-ply failure envelope in two axes: Nx, Ny, Nxy, Mx, My, Mxy or sx, sy, "
                   "sxy (average stress), e.g. 'Nx,Ny'.")
@click.option("--plot", type=click.Path(dir_okay=False),
              help="Draw the envelope (all criteria) to an image file (Nx,Ny without --envelope).")
@click.option("--points", type=int, default=361, show_default=True,
              help="Number of rays of the envelope.")
def laminate_command(
    case_file: str, as_json: bool, criterion: str, f12_star: float,
    envelope_axes: str | None, plot: str | None, points: int,
) -> None:
    """ABD, laminate constants, ply stresses and failure for the [laminate] of CASE_FILE."""
    from micromech.case import load_case
    from micromech.laminate import (
        analyse_laminate,
        failure_envelope,
        laminate_from_case,
        ply_origin,
    )
    from micromech.report.laminate import (
        envelope_intercepts_table,
        laminate_json,
        laminate_table,
    )

    if plot is not None:
        _output_path(plot, "--plot", image=True)
    case = load_case(case_file)
    lam = laminate_from_case(case)
    spec = case.laminate
    assert spec is not None  # laminate_from_case raised otherwise
    analysis = analyse_laminate(lam, spec.loads, criterion=criterion, f12_star=f12_star)
    envelopes = []
    if envelope_axes is None and plot is not None:
        envelope_axes = "Nx,Ny"
    if envelope_axes is not None:
        envelopes = [
            failure_envelope(lam, envelope_axes, c, n_points=points, delta_T=analysis.delta_T,
                             f12_star=f12_star)
            for c in _LAMINATE_CRITERIA
        ]
    if plot is not None:
        from micromech.laminate import plot_envelopes

        plot_envelopes(envelopes, plot, title=f"{case.name}: {lam.code}")
    if as_json:
        emit_json(laminate_json(analysis, case=case.name, envelopes=envelopes))
        return
    click.echo(laminate_table(analysis, case=case.name, ply_origin=ply_origin(case)))
    if envelopes:
        click.echo("\n" + envelope_intercepts_table(envelopes))
        if plot is not None:
            click.echo(f"  plot written to {plot}")


# --- rve geometry ---------------------------------------------------------------------------


def _rve_inputs(
    case: str | None, fraction: str | None, diameter: str | None
) -> tuple[float, float, str | None]:
    """Fibre fraction, fibre diameter (m) and the case's arrangement, options first."""
    from micromech.errors import InputError
    from micromech.units import parse_quantity

    vf: float | None = None
    d: float | None = None
    arrangement: str | None = None
    if case is not None:
        from micromech.case import load_case

        loaded = load_case(case)
        comp = loaded.composite
        fibre = loaded.fibre if comp is None else comp.fibre
        if comp is not None:
            vf = float(comp.volume_fraction)
            arrangement = comp.arrangement
        fd = None if fibre is None else getattr(fibre, "fibre_diameter", None)
        d = None if fd is None else float(fd)
    if fraction is not None:
        vf = parse_quantity(fraction, "dimensionless", "--fraction")
    if diameter is not None:
        d = parse_quantity(diameter, "length", "--diameter")
    if vf is None:
        raise InputError("--fraction: no fibre volume fraction; give --fraction or a case with "
                         "[composite] volume_fraction")
    if d is None:
        raise InputError("--diameter: no fibre diameter; give --diameter (e.g. '7 um') or "
                         "fibre_diameter in the case's [fibre] table")
    return vf, d, arrangement


def _rve_gap(gap: str | None, d: float) -> float | None:
    """Minimum gap in m: a bare number is a fraction of the diameter, else a length."""
    from micromech.units import parse_quantity

    if gap is None:
        return None
    try:
        return float(gap) * d
    except ValueError:
        return parse_quantity(gap, "length", "--gap")


def _rve_refuse_same(target: str, other: str, option: str, what: str) -> None:
    """Refuse an output path that names another file of the command (input or output)."""
    from micromech.errors import InputError

    if os.path.abspath(target) == os.path.abspath(other) or (
        os.path.exists(target) and os.path.exists(other) and os.path.samefile(target, other)
    ):
        raise InputError(f"{option} = {target!r} is {what}; choose another file name")


@cli.command("rve")
@click.argument("case", required=False, type=click.Path(exists=True, dir_okay=False))
@click.option("--packing", type=click.Choice(["random", "square", "hexagonal"]), default=None,
              help="Fibre arrangement [default: the case's composite.arrangement, else random].")
@click.option("--fraction", help="Fibre volume fraction (overrides the case).")
@click.option("--diameter", help="Fibre diameter, e.g. '7 um' (overrides the case).")
@click.option("--fibres", type=int,
              help="Number of fibres (square: n*n; hexagonal: 2*n*n) [random default: a cell "
                   "of 50 fibre radii].")
@click.option("--cell-size", help="Random packing: cell side, e.g. '180 um' (not with --fibres).")
@click.option("--gap", help="Minimum gap: fraction of the diameter ('0.05') or a length "
                            "('0.35 um') [random: 0.05; square, hexagonal: 0].")
@click.option("--seed", type=int, help="Random seed (recorded; drawn when not given).")
@click.option("--out", type=click.Path(dir_okay=False),
              help="Write the fibre centres and face images: CSV, or JSON for a .json name.")
@click.option("--unit", default="um", show_default=True, help="Length unit of the CSV columns.")
@click.option("--fibre-axis", type=click.Choice(["z", "x"]), default="z", show_default=True,
              help="Axis the fibres run along in the output: z (centres x, y) or x (centres "
                   "y, z, as in a unidirectional check cell).")
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI units).")
@click.option("--plot", type=click.Path(dir_okay=False),
              help="Draw the cell to an image file (.png, .svg, .pdf, ...).")
def rve_command(
    case: str | None, packing: str | None, fraction: str | None, diameter: str | None,
    fibres: int | None, cell_size: str | None, gap: str | None, seed: int | None,
    out: str | None, unit: str, fibre_axis: str, as_json: bool, plot: str | None,
) -> None:
    """Make the fibre arrangement of an RVE cell from CASE (or --fraction and --diameter).

    Prints the achieved fraction, the cell size in um and in fibre radii, nearest-neighbour
    statistics and the size guidance, and writes the centres for a mesher with --out. The
    centres lie in the cell's cross-section: x, y with the fibres along z by default, or y, z
    with --fibre-axis x (a unidirectional check cell has its fibres along x).
    """
    import math

    from micromech.errors import InputError
    from micromech.rve import geometry as geo
    from micromech.units import parse_quantity

    vf, d, arrangement = _rve_inputs(case, fraction, diameter)
    method = packing or arrangement or "random"
    min_gap = _rve_gap(gap, d)
    for target, option in ((out, "--out"), (plot, "--plot")):
        if target is not None and case is not None:
            _rve_refuse_same(target, case, option, "the input case file")
    if out is not None and plot is not None:
        _rve_refuse_same(plot, out, "--plot", "also the --out file")
    # check what is written before the (possibly long) packing runs
    if out is not None:
        _output_path(out, "--out")
        if not out.lower().endswith(".json"):
            parse_quantity(f"1 {unit}", "length", "--unit")  # raises for a unit that is no length
    if plot is not None:
        _output_path(plot, "--plot", image=True)
    if method == "random":
        arr = geo.random_cell(vf, d, n_fibres=fibres, cell_size=cell_size, min_gap=min_gap,
                              seed=seed)
    else:
        if cell_size is not None:
            raise InputError(f"--cell-size applies to random packing only, not {method}")
        per = 1 if method == "square" else 2
        n = 1
        if fibres is not None:
            n = math.isqrt(max(fibres, 0) // per)
            if fibres < 1 or per * n * n != fibres:
                raise InputError(f"--fibres = {fibres}: a {method} cell holds {per}*n*n fibres "
                                 f"({', '.join(str(per * k * k) for k in (1, 2, 3, 4))}, ...)")
        make = geo.square_cell if method == "square" else geo.hexagonal_cell
        arr = make(vf, d, n_per_side=n, min_gap=0.0 if min_gap is None else min_gap)
    written = None
    if out is not None:
        written = (arr.to_json(out, fibre_axis=fibre_axis) if out.lower().endswith(".json")
                   else arr.to_csv(out, unit=unit, fibre_axis=fibre_axis))
    if plot is not None:
        geo.plot_arrangement(arr, plot, fibre_axis=fibre_axis)
    if as_json:
        data = arr.as_dict(fibre_axis)
        data["case"] = case
        data["file"] = None if written is None else str(written)
        data["plot"] = plot
        emit_json(data)
        return
    title = f"RVE cell{'' if case is None else ' for ' + case}"
    click.echo(geo.arrangement_text(arr, title, written=written, plot=plot,
                                    fibre_axis=fibre_axis))


# --- size (design) --------------------------------------------------------------------------


#: Monte Carlo runs with more samples than this show a progress bar on standard error.
_SIZE_PROGRESS_ABOVE = 1_000_000
#: Largest Monte Carlo run (micromech.design.uncertainty.MAX_SAMPLES, not imported here so that
#: ``micromech --help`` stays fast).
_SIZE_MAX_SAMPLES = 10_000_000


def _size_percentiles(text: str) -> tuple[float, ...]:
    from micromech.errors import InputError

    try:
        out = tuple(float(p) for p in text.split(",") if p.strip())
    except ValueError:
        raise InputError(f"--percentiles: {text!r} is not a comma-separated list of numbers "
                         "(e.g. '5,50,95')") from None
    if not out:
        raise InputError("--percentiles: give at least one percentile (e.g. '5,50,95')")
    return out


@cli.command("size")
@click.argument("case_file", type=click.Path(dir_okay=False))
@click.option("--target", "-t", "targets", multiple=True, metavar="NAME=VALUE",
              help="Target, repeatable: NAME=VALUE, NAME>=VALUE or NAME<=VALUE with units, e.g. "
                   "'E2=9GPa', 'density<=1.6 g/cm^3', 'Ex>=50GPa' (needs [laminate]), "
                   "'E1/density>=40 GPa/(g/cm^3)'.")
@click.option("--model", "-m", "models", multiple=True,
              help="Only these estimates (repeatable; default: all that apply).")
@click.option("--no-bounds", is_flag=True, help="Leave out the Hashin-Shtrikman bounds.")
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI units).")
@click.option("--plot", "plot_file", type=click.Path(dir_okay=False),
              help="Each target's property against fibre fraction, with the target line, to an "
                   "image file (.png, .svg, .pdf, ...; histograms go to FILE-scatter.png, same "
                   "suffix, with --uncertainty).")
@click.option("--uncertainty", "samples", type=click.IntRange(min=2, max=_SIZE_MAX_SAMPLES),
              default=None,
              metavar="N", help="Monte Carlo scatter of the case's properties with N samples.")
@click.option("--cov", type=click.FloatRange(min=0.0), default=0.05, show_default=True,
              help="Coefficient of variation of the constituent moduli.")
@click.option("--cov-fraction", type=click.FloatRange(min=0.0), default=0.02,
              show_default=True, help="Coefficient of variation of the fibre fraction.")
@click.option("--distribution", type=click.Choice(["normal", "lognormal"]), default="normal",
              show_default=True, help="Distribution of every uncertain input.")
@click.option("--percentiles", default="5,50,95", show_default=True,
              help="Percentiles to report, comma-separated.")
@click.option("--seed", type=int, default=0, show_default=True,
              help="Seed of the Monte Carlo random generator.")
@click.option("--mc-model", default=None,
              help="Estimate propagated by --uncertainty (default: the case's ply model).")
def size_command(
    case_file: str, targets: tuple[str, ...], models: tuple[str, ...], no_bounds: bool,
    as_json: bool, plot_file: str | None, samples: int | None, cov: float, cov_fraction: float,
    distribution: str, percentiles: str, seed: int, mc_model: str | None,
) -> None:
    """Fibre fraction at which the [composite] of CASE_FILE meets property targets.

    Prints, per target, the fraction under each estimate, the interval the bounds admit and a
    status (an unreachable target is an answer), then the window meeting all targets with the
    weight fraction and density. With --uncertainty, Monte Carlo percentiles of the properties.
    """
    from pathlib import Path

    from micromech.case import load_case
    from micromech.design import monte_carlo, size_fraction
    from micromech.errors import InputError
    from micromech.report.design import (
        CAUTION,
        monte_carlo_table,
        plot_histograms,
        plot_sizing,
        sizing_table,
    )

    if not targets and samples is None:
        raise InputError("size: give at least one --target (e.g. --target E2=9GPa) or "
                         "--uncertainty N")
    pct = _size_percentiles(percentiles)
    if plot_file is not None:
        _output_path(plot_file, "--plot", image=True)
    case = load_case(case_file)
    result = None
    if targets:
        result = size_fraction(case, list(targets), models=list(models) or None,
                               bounds=not no_bounds)
    mc = None
    if samples is not None:
        kwargs: dict[str, Any] = dict(model=mc_model, cov=cov, cov_fraction=cov_fraction,
                                      distribution=distribution, seed=seed, percentiles=pct)
        if samples > _SIZE_PROGRESS_ABOVE:
            with click.progressbar(length=samples, label="Monte Carlo", file=sys.stderr) as bar:
                seen = [0]

                def progress(done: int, total: int) -> None:
                    bar.update(done - seen[0])
                    seen[0] = done

                mc = monte_carlo(case, samples, progress=progress, **kwargs)
        else:
            mc = monte_carlo(case, samples, **kwargs)
    written = []
    if plot_file is not None:
        if result is not None:
            written.append(plot_sizing(case, result, plot_file))
        if mc is not None:
            p = Path(plot_file)
            hist = p if result is None else p.with_name(f"{p.stem}-scatter{p.suffix or '.png'}")
            written.append(plot_histograms(mc, hist))
    if as_json:
        emit_json({"case": case.name, "sizing": None if result is None else result.as_dict(),
                   "uncertainty": None if mc is None else mc.as_dict(), "caution": CAUTION})
        return
    blocks = []
    if result is not None:
        blocks.append(sizing_table(result, title=f"case: {case.name}"))
    if mc is not None:
        blocks.append(monte_carlo_table(mc, title="" if result else f"case: {case.name}"))
    click.echo("\n\n".join(blocks))
    for w in written:
        click.echo(f"plot written to {w}")


# --- check (rve results) --------------------------------------------------------------------


@cli.command("check")
@click.argument("case_file", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Print JSON (SI units).")
@click.option("--report", "report_dir", type=click.Path(file_okay=False),
              help="Write report.md, report.html and the PNG figures into this folder "
                   "(never the folder of the input files).")
@click.option("--offset", type=float, default=None,
              help="Strain offset of the yield line  [default: the case's, else 0.002]")
@click.option("--tolerance", "tolerances", multiple=True, metavar="NAME=VALUE",
              help="Relative tolerance around the best estimate, e.g. E2=0.2 or E2=20% "
                   "(repeatable); replaces the default band of that property.")
@click.option("--strain-range", "strain_range", metavar="LOW,HIGH",
              help="Strain range of the modulus fit of every history, e.g. 0.0005,0.0025 "
                   "(replaces the automatic search and the case's ranges).")
@click.option("--all-reasons", is_flag=True,
              help="Also list the reasons of the consistent properties.")
def check_command(case_file: str, as_json: bool, report_dir: str | None, offset: float | None,
                  tolerances: tuple[str, ...], strain_range: str | None,
                  all_reasons: bool) -> None:
    """Grade the simulated RVE results of CASE_FILE against bounds and estimates.

    Each property is consistent, suspect (outside the expected band or a consistency check)
    or violates_bounds (outside a rigorous bound), with reasons. Exit status: 0, or 1 when any
    property violates a bound (to gate a pipeline); 2 on bad input.
    """
    from micromech.report.check import format_check_text, write_check_report
    from micromech.rve.check import check_case

    result = check_case(case_file, offset=offset, tolerances=list(tolerances),
                        strain_range=_check_range_option(strain_range))
    written = write_check_report(result, report_dir) if report_dir is not None else None
    if as_json:
        obj = result.as_dict()
        if written is not None:
            obj["report"] = {"markdown": str(written["markdown"]), "html": str(written["html"])}
        emit_json(obj)
    else:
        click.echo(format_check_text(result, all_reasons=all_reasons), nl=False)
        if written is not None:
            click.echo(f"report written to {written['html']} and {written['markdown']}")
    if result.exit_code:
        click.get_current_context().exit(result.exit_code)


def _check_range_option(text: str | None) -> tuple[float, float] | None:
    """Read ``--strain-range LOW,HIGH`` (plain strains)."""
    from micromech.errors import InputError

    if text is None:
        return None
    parts = [p.strip() for p in text.split(",")]
    try:
        lo, hi = (float(p) for p in parts)
    except ValueError:
        raise InputError(f"--strain-range: {text!r} must be two strains LOW,HIGH, e.g. "
                         "0.0005,0.0025") from None
    return lo, hi


# --- demo -----------------------------------------------------------------------------------


@cli.command("demo")
@click.option("--out", "out_dir", type=click.Path(file_okay=False), default="micromech-demo-report",
              show_default=True, help="Report folder to write (created if missing).")
@click.option("--quiet", is_flag=True, help="Print only where the report is.")
def demo_command(out_dir: str, quiet: bool) -> None:
    """Run the whole job on the bundled invented cases and write a report folder.

    Estimates and bounds for a glass/epoxy ply, the fibre fraction for stiffness targets, a
    laminate with ply failure, and the check of an invented cross-ply RVE run (a good copy and
    one with a unit slip and a wrong cell size, so all three verdicts show).
    """
    from micromech.report.demo import run_demo

    run = run_demo(out_dir)
    if not quiet:
        click.echo(run.summary)
        click.echo("")
    verdicts = ", ".join(f"{k}: {v}" for k, v in run.verdicts.items())
    click.echo(f"Demo verdicts (invented data): {verdicts}")
    click.echo(f"Report written to {run.files['html'].resolve()}")


def main(argv: list[str] | None = None) -> None:
    """Entry point of the console script."""
    cli.main(args=argv, prog_name="micromech")


if __name__ == "__main__":  # pragma: no cover
    main(sys.argv[1:])
