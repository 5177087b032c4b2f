"""Check simulated RVE results against rigorous bounds and closed-form estimates.

:func:`check_case` reads a case file's ``[rve]`` results (histories, averaged load cases or a
full stiffness), measures the curves, and grades every property it can name (see
:mod:`micromech.rve.verdicts`) against what the case's constituents, fraction and architecture
allow:

============== ============================== ====================================== ==========
architecture   rigorous bounds                estimates                              best
============== ============================== ====================================== ==========
unidirectional Voigt/Reuss of the             every estimate of the composite         Mori-
               constituents (x = fibre = 1)   (Mori-Tanaka, Halpin-Tsai, cylinders,   Tanaka
                                              Chamis, rule of mixtures); HS band
                                              where the arrangement is transversely
                                              isotropic (random, hexagonal)
crossply,      Voigt/Reuss of the             stacks (exact layer averaging) of       stack of
stack          constituents over the whole    plies from each complete estimate       Mori-
               cell, fibres turned with       (Mori-Tanaka, Halpin-Tsai, HS lower /   Tanaka
               their plies                    upper, cylinders)                       plies
particulate    Voigt/Reuss                    Mori-Tanaka (spheres/spheroids); HS     Mori-
                                              band for a random arrangement           Tanaka
============== ============================== ====================================== ==========

Directions: x, y in-plane and z through the thickness; for unidirectional and particulate cells
x = 1 (the fibre axis), y = 2, z = 3, and the properties are named E1 ... nu32; for stacks Ex
... nuzy. Strengths are graded against the limit-analysis bounds (matrix yield below, in shear
its von Mises shear yield, yield / sqrt(3); Voigt average of the phase strengths above, normal
load cases only); these hold for perfectly plastic phases, so outside them a strength is only
``suspect``. Every expected band is clipped to the rigorous bounds. A Poisson ratio beyond the
stability limit nu_ij^2 < E_i / E_j (positive definite compliance) is ``violates_bounds``.
Averaged load cases or a full matrix give the effective 6x6 stiffness, whose symmetry error and
positive definiteness are reported (:attr:`CheckResult.stiffness`) and whose engineering
constants are graded. A ``[check] properties`` list is validated against the names the results
give: the check never grades nothing silently.

Estimates and bounds are not design allowables: qualified test data, the applicable codes and a
licensed engineer decide.

References
----------
.. [1] Hill, R. (1952). *Proc. Phys. Soc. A* 65, 349-354 (Voigt and Reuss bounds; the bound on
   a directional modulus follows from the bound on the stiffness as a quadratic form).
.. [2] Pagano, N. J. (1974). Exact moduli of anisotropic laminates. In *Composite Materials*
   Vol. 2, Academic Press, 23-44 (stack constants).
.. [3] Drucker, D. C. (1966). *J. Materials* 1, 873-910 (limit-analysis bounds).
.. [4] Lempriere, B. M. (1968). Poisson's ratio in orthotropic materials. *AIAA J.* 6,
   2226-2227 (nu_ij^2 < E_i / E_j; from memory).
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

import numpy as np
from numpy.typing import NDArray

from micromech.errors import CaseFileError, InputError
from micromech.rve.causes import STACK_ARCHITECTURES as _STACK_ARCH
from micromech.rve.causes import STACK_PROPERTIES as _STACK_ALL
from micromech.rve.causes import UD_PROPERTIES as _UD_ALL
from micromech.rve.causes import (
    Diagnosis,
    consistency_reasons,
    fit_size_error,
    fraction_for_value,
    likely_causes,
    model_label,
    property_kind,
    property_name,
    size_error_reason,
)
from micromech.rve.causes import constant_of as _const
from micromech.rve.causes import direction_of as _direction_of
from micromech.rve.expected import (
    Expectation,
    _layup_angles,
    _strength_limits,
    expected_properties,
)
from micromech.rve.tolerances import (
    BOUND_SLACK,
    check_selection,
    parse_tolerances,
    property_order,
    ud_base_name,
)
from micromech.rve.verdicts import (
    CAUTION,
    VERDICTS,
    PropertyCheck,
    grade_property,
    poisson_stability,
    worst_verdict,
)

__all__ = [
    "CAUTION",
    "VERDICTS",
    "CheckResult",
    "CurveResult",
    "Diagnosis",
    "Expectation",
    "PropertyCheck",
    "check_case",
    "consistency_reasons",
    "expected_properties",
    "fit_size_error",
    "fraction_for_value",
    "grade_property",
    "likely_causes",
    "model_label",
    "property_name",
    "property_order",
    "worst_verdict",
]

Array = NDArray[np.float64]


# ------------------------------------------------------------------------------------------
# results


@dataclass(frozen=True, eq=False)
class CurveResult:
    """One load case's curve and its metrics, kept for the report's plots.

    Attributes
    ----------
    direction : str
        Load case.
    strain, stress : ndarray, shape (n,)
        The curve, SI.
    metrics : CurveMetrics
        Modulus, yield, strength (:mod:`micromech.rve.curves`).
    source : str
        The history file.
    """

    direction: str
    strain: Array
    stress: Array
    metrics: Any
    source: str = ""


@dataclass(frozen=True, eq=False)
class CheckResult:
    """The check of one case: a verdict per property, the curves, and notes.

    Attributes
    ----------
    case : str
        Case name.
    path : Path or None
        Case file.
    architecture : str
        RVE architecture.
    volume_fraction : float
        Declared fibre fraction.
    arrangement : str
        Fibre arrangement.
    properties : Mapping of str to PropertyCheck
        Verdicts by property name.
    curves : Mapping of str to CurveResult
        Curves by load direction.
    notes : tuple of str
        Case-level remarks (size fit, stiffness symmetry, skipped items).
    inputs : tuple of Path
        The case file and every history file read (never written).
    stiffness : EffectiveStiffness or None
        The effective 6x6 stiffness, with its symmetry error and positive definiteness, where
        the case gives averaged load cases or a full matrix.
    stiffness_source : str or None
        ``"load_cases"`` (fitted to averaged stresses and strains) or ``"matrix"`` (given).
    caution : str
        The caution every output carries.
    not_graded : Mapping of str to str
        Properties a load case names but its curve does not give (a yield strength when the
        curve never crosses the offset line), with the reason; shown in the tables, not
        graded and not in the JSON ``properties``.
    """

    case: str
    path: Path | None
    architecture: str
    volume_fraction: float
    arrangement: str
    properties: Mapping[str, PropertyCheck]
    curves: Mapping[str, CurveResult] = field(default_factory=dict)
    notes: tuple[str, ...] = ()
    inputs: tuple[Path, ...] = ()
    stiffness: Any = None
    stiffness_source: str | None = None
    caution: str = CAUTION
    not_graded: Mapping[str, str] = field(default_factory=dict)

    @property
    def worst_verdict(self) -> str:
        """The most severe verdict over all properties."""
        return worst_verdict(p.verdict for p in self.properties.values())

    @property
    def exit_code(self) -> int:
        """1 when any property violates a bound, else 0 (for ``micromech check``)."""
        return 1 if self.worst_verdict == "violates_bounds" else 0

    def as_dict(self) -> dict[str, Any]:
        """Return the JSON form (the ``check`` contract of DESIGN.md, plus case details).

        Returns
        -------
        dict
            ``case``, ``case_file``, ``architecture``, ``volume_fraction``, ``arrangement``,
            ``curves``, ``properties``, ``worst_verdict``, ``stiffness`` (None, or the 6x6
            matrix in Pa with ``source``, ``symmetry_error``, ``positive_definite``,
            ``residual``, ``condition``, ``n_cases`` and ``constants``), ``notes``,
            ``caution``.
        """
        stiffness = None
        if self.stiffness is not None:
            stiffness = {"source": self.stiffness_source, **self.stiffness.as_dict()}
        return {
            "case": self.case,
            "case_file": None if self.path is None else str(self.path),
            "architecture": self.architecture,
            "volume_fraction": self.volume_fraction,
            "arrangement": self.arrangement,
            "curves": {d: c.metrics.as_dict() for d, c in self.curves.items()},
            "properties": {n: p.as_dict() for n, p in self.properties.items()},
            "worst_verdict": self.worst_verdict,
            "stiffness": stiffness,
            "notes": list(self.notes),
            "caution": self.caution,
        }


# ------------------------------------------------------------------------------------------
# reading the simulated results (what to expect: :mod:`micromech.rve.expected`)


def _read_curve(lc: Any, size: Sequence[float] | None) -> Any:
    """Read a load case's history (the case file gives force/displacement or stress/strain)."""
    from micromech.rve.ingest import load_curve

    return load_curve(lc.file, lc.direction, size, force=lc.force, displacement=lc.displacement,
                      stress=lc.stress, strain=lc.strain, lateral=lc.lateral,
                      delimiter=lc.delimiter, skip_rows=lc.skip_rows)


# ------------------------------------------------------------------------------------------
# the check


def check_case(
    case: Any,
    *,
    offset: float | None = None,
    tolerances: Mapping[str, float] | Sequence[str] | None = None,
    strain_range: tuple[float, float] | None = None,
) -> CheckResult:
    """Check the simulated RVE results of a case file.

    Parameters
    ----------
    case : Case or str or Path
        A loaded case (:func:`micromech.case.load_case`) or the path of a case file.
    offset : float, optional
        Strain offset of the yield line; default: the load case's, then ``[check]``'s, then
        0.002 (common practice, no source). A value given here overrides them all.
    tolerances : mapping or sequence of ``"NAME=VALUE"``, optional
        Relative tolerances per property around the best estimate; they replace the default
        bands (and ``[check] tolerance`` entries of the case).
    strain_range : (float, float), optional
        Strain range (low, high) of the modulus fit of every history, replacing the automatic
        search and the ranges given in the case (``strain_range`` of a load case or of
        ``[check]``).

    Returns
    -------
    CheckResult
        Verdicts, curves and notes; ``exit_code`` is 1 when a bound is violated.

    Raises
    ------
    CaseFileError
        If the case has no [rve] results or no composite to compare with; if ``[check]
        properties`` is empty, names a property the results do not give (the message says
        which load case would), or selects nothing that can be graded.
    InputError
        For a bad tolerance, offset or strain range, or a ``[check] properties`` name that is
        no property name (the nearest valid names are suggested).
    DataFileError
        For an unreadable history file.

    Examples
    --------
    >>> r = check_case("data/demo/crossply.toml")  # doctest: +SKIP
    >>> r.worst_verdict  # doctest: +SKIP
    'consistent'
    """
    from micromech.case import load_case
    from micromech.rve.curves import metrics_of_curve
    from micromech.rve.stiffness import stiffness_from_load_cases, stiffness_from_matrix

    if isinstance(case, str | Path):
        case = load_case(case)
    where = str(case.path or case.name or "case")
    rve = case.rve
    if rve is None or (not rve.load_cases and rve.stiffness is None):
        raise CaseFileError(f"{where}: no [rve] results to check (give [[rve.load_case]] "
                            "entries or [rve.stiffness])")
    if case.composite is None:
        raise CaseFileError(f"{where}: checking RVE results needs [fibre], [matrix] and "
                            "[composite] with a fraction")
    orientation = getattr(case.composite, "orientation", "aligned")
    if orientation != "aligned":
        raise CaseFileError(
            f"{where}: [composite] orientation = {orientation!r}: the RVE check grades aligned "
            "fibres and particles only (its tolerances were measured for aligned fibres); use "
            "`micromech estimate` for the orientation-averaged estimates and bounds"
        )
    if offset is not None and not (np.isfinite(offset) and 0.0 < offset < 1.0):
        raise InputError(f"offset = {offset!r} must be a strain between 0 and 1 (e.g. 0.002)")
    if strain_range is not None:
        strain_range = _check_strain_range(strain_range)
    tol = dict(parse_tolerances(case.check.get("tolerance", {})))
    if tolerances is not None:
        tol.update(parse_tolerances(tolerances))
    arch = rve.architecture
    size = rve.size
    notes: list[str] = []
    values: dict[str, float] = {}
    contexts: dict[str, Diagnosis] = {}
    curves: dict[str, CurveResult] = {}
    inputs: list[Path] = [] if case.path is None else [Path(case.path)]

    # 1. curves from histories
    averaged_stress: list[Array] = []
    averaged_strain: list[Array] = []
    for lc in rve.load_cases:
        if lc.mode == "averaged":
            averaged_stress.append(lc.stress_values)
            averaged_strain.append(lc.strain_values)
            continue
        d = lc.direction
        inputs.append(Path(lc.file))
        curve = _read_curve(lc, size)
        off = offset if offset is not None else (
            lc.offset if lc.offset is not None else case.check.get("offset", 0.002))
        rng = strain_range or lc.strain_range or case.check.get("strain_range")
        m = metrics_of_curve(curve, offset=off, fit_range=rng)
        curves[d] = CurveResult(d, curve.strain, curve.stress, m, str(lc.file))
        ctx = Diagnosis(direction=d, size=size, source=lc.mode)
        name = property_name(arch, d)
        values[name], contexts[name] = m.modulus, ctx
        for axis, nu in m.poisson.items():
            pname = property_name(arch, d, axis)
            values[pname], contexts[pname] = nu, replace(ctx, lateral=axis)
        if m.yield_strength is not None:
            values[f"yield_strength_{d}"] = abs(m.yield_strength)
        values[f"ultimate_strength_{d}"] = abs(m.ultimate_strength)
        contexts[f"yield_strength_{d}"] = contexts[f"ultimate_strength_{d}"] = ctx
        if not m.failed:
            notes.append(f"Load case {d}: the run stopped before failure, so "
                         f"ultimate_strength_{d} is only a lower limit.")

    # 2. stiffness from averaged load cases or a full matrix
    eff = eff_source = None
    if averaged_stress:
        eff = stiffness_from_load_cases(np.vstack(averaged_stress), np.vstack(averaged_strain))
        eff_source, src = "load_cases", "stress_strain"
    elif rve.stiffness is not None:
        eff = stiffness_from_matrix(rve.stiffness)
        eff_source, src = "matrix", "stiffness"
    if eff is not None:
        names = (_STACK_ALL if arch in _STACK_ARCH else _UD_ALL)
        for n in names:
            v = _const(eff.constants, n)
            if n not in values and v is not None:
                values[n] = float(v)
                d, lat = _direction_of(n)
                contexts[n] = Diagnosis(direction=d, lateral=lat, source=src)
        if eff.symmetry_error > 0.05:
            notes.append(f"The RVE stiffness is not symmetric ({100 * eff.symmetry_error:.1f} % "
                         "relative asymmetry): its load cases disagree (boundary conditions or "
                         "averaging); the constants use its symmetric part.")
        if not eff.positive_definite:
            notes.append("The symmetric part of the RVE stiffness is not positive definite: no "
                         "stable material has it; check the units and the load cases.")

    # yields the curves do not give (the offset line is never crossed): shown, not graded
    not_graded = {f"yield_strength_{d}": c.metrics.yield_note
                  for d, c in curves.items() if c.metrics.yield_strength is None}
    simulated = dict(values)
    wanted = case.check.get("properties")
    if wanted is not None:
        check_selection(wanted, values, not_graded, arch, where)
        values = {k: v for k, v in values.items() if k in wanted}
        not_graded = {k: v for k, v in not_graded.items() if k in wanted}

    # 3. grade
    elastic = [n for n in values if property_kind(n) != "strength"]
    moduli = [m for n in elastic if property_kind(n) == "poisson" for m in _moduli_of(arch, n)]
    expect = expected_properties(case, list(dict.fromkeys([*elastic, *moduli])))
    vf = float(case.composite.volume_fraction)
    keep = case.check.get("models")
    results: dict[str, PropertyCheck] = {}
    for n in elastic:
        e = expect[n]
        ctx = replace(contexts.get(n, Diagnosis()), fraction=vf, fraction_curve=e.fraction_curve,
                      constrained_modulus=e.constrained_modulus)
        est = dict(e.estimates)
        if keep:
            est = {k: v for k, v in est.items()
                   if k == e.best or k.removeprefix("stack_") in keep}
        results[n] = grade_property(
            n, values[n], lower_bound=e.lower_bound, upper_bound=e.upper_bound,
            hs_band=e.hs_band, estimates=est, best=e.best if e.best in est else None,
            band=e.band, tolerance=_tolerance_for(n, tol, arch), context=ctx,
        )
    m_yield, s_upper = _strength_limits(case)
    for n in (k for k in values if property_kind(k) == "strength"):
        direction = n.rsplit("_", 1)[-1]
        normal = direction in ("x", "y", "z")
        failed = n.startswith("yield") or curves[direction].metrics.failed
        lower = None
        if m_yield is not None and failed:
            # in shear the matrix yields at its von Mises shear yield stress, yield / sqrt(3)
            lower = m_yield if normal else m_yield / np.sqrt(3.0)
        results[n] = grade_property(
            n, values[n], lower_bound=lower,
            upper_bound=s_upper if normal else None, estimates={}, best=None,
            bounds_rigorous=False, context=contexts.get(n),
        )

    # 4. cross-checks
    _poisson_stability(results, simulated, expect, arch)
    _cross_checks(results, values, case, arch, size, contexts, notes)
    ordered = dict(sorted(results.items(), key=lambda kv: property_order(kv[0])))
    return CheckResult(
        case=case.name, path=case.path, architecture=arch, volume_fraction=vf,
        arrangement=case.composite.arrangement, properties=ordered, curves=curves,
        notes=tuple(notes), inputs=tuple(inputs), stiffness=eff,
        stiffness_source=eff_source,
        not_graded=dict(sorted(not_graded.items(), key=lambda kv: property_order(kv[0]))),
    )


def _check_strain_range(value: Any) -> tuple[float, float]:
    """Validate a strain range (low, high) with 0 <= low < high, both finite."""
    try:
        lo, hi = (float(v) for v in value)
    except (TypeError, ValueError):
        raise InputError(
            f"strain_range = {value!r} must be two strains (low, high), e.g. (0.0005, 0.0025)"
        ) from None
    if not (np.isfinite(lo) and np.isfinite(hi) and 0.0 <= lo < hi):
        raise InputError(f"strain_range = {value!r} must satisfy 0 <= low < high (finite)")
    return lo, hi


# ------------------------------------------------------------------------------------------
# the stability of the Poisson ratios


def _moduli_of(arch: str, name: str) -> tuple[str, str]:
    """Return the Young's moduli E_i, E_j of nu_ij (load axis i, lateral axis j)."""
    d, lat = _direction_of(name)
    assert d is not None and lat is not None
    return property_name(arch, d), property_name(arch, lat)


def _poisson_stability(
    results: dict[str, PropertyCheck], simulated: Mapping[str, float],
    expect: Mapping[str, Expectation], arch: str,
) -> None:
    """Hold every Poisson ratio to the stability limit (:func:`poisson_stability`).

    The moduli are the simulated ones where the case gives them and they lie inside their own
    rigorous bounds, else the best estimates: a modulus that violates its bounds is graded on
    its own and does not condemn the Poisson ratio as well.
    """
    for name, r in list(results.items()):
        if property_kind(name) != "poisson":
            continue
        moduli: list[tuple[str, float | None, str]] = []
        for m in _moduli_of(arch, name):
            e = expect.get(m)
            best = None if e is None else e.estimates.get(e.best)
            if m in simulated and (e is None or _within_bounds(simulated[m], e)):
                moduli.append((m, simulated[m], "simulated"))
            elif m in simulated:
                moduli.append((m, best, "best estimate; the simulated value violates its bounds"))
            else:
                moduli.append((m, best, "best estimate"))
        verdicts = {m: results[m].verdict for m, _, _ in moduli if m in results}
        results[name] = poisson_stability(r, moduli[0], moduli[1], verdicts)


def _within_bounds(value: float, e: Expectation) -> bool:
    """Whether a modulus lies inside its rigorous bounds (with the bound allowance)."""
    return ((e.lower_bound is None or value >= e.lower_bound * (1.0 - BOUND_SLACK))
            and (e.upper_bound is None or value <= e.upper_bound * (1.0 + BOUND_SLACK)))


def _tolerance_for(name: str, tol: Mapping[str, float], arch: str) -> float | None:
    if name in tol:
        return tol[name]
    if arch not in _STACK_ARCH and ud_base_name(name) in tol:
        return tol[ud_base_name(name)]
    return None


def _cross_checks(
    results: dict[str, PropertyCheck], values: Mapping[str, float], case: Any, arch: str,
    size: Sequence[float] | None, contexts: Mapping[str, Diagnosis], notes: list[str],
) -> None:
    stack = arch in _STACK_ARCH
    symmetric = True
    if stack:
        angles = _layup_angles(case)
        turned = sorted(((a + 90.0) % 180.0) for a in angles)
        symmetric = np.allclose(sorted(a % 180.0 for a in angles), turned)
    comp = case.composite
    spheres = (arch == "particulate" and comp.inclusion == "sphere"
               and comp.arrangement in ("random", "square"))
    for name, reasons in consistency_reasons(
        values, stack=stack, symmetric=symmetric, arrangement=comp.arrangement,
        isotropic=spheres,
    ).items():
        results[name] = results[name].with_reasons(reasons, "suspect")
    # one wrong cell size shows in all three normal load cases
    normal = [property_name(arch, d) for d in ("x", "y", "z")]
    if size is not None and all(
        n in results and results[n].best_estimate and contexts.get(n, Diagnosis()).source
        == "force_displacement" for n in normal
    ):
        ratios = {d: results[n].value / float(results[n].best_estimate or 1.0)
                  for d, n in zip(("x", "y", "z"), normal, strict=True)}
        fit = fit_size_error(ratios, size)
        if fit is not None:
            axis, factor = fit
            text = size_error_reason(axis, factor, size)
            notes.append(text)
            for n in normal:
                if results[n].verdict != "consistent":
                    results[n] = _with_cause(results[n], f"Across load cases: {text}")
            # a Poisson ratio divides a lateral strain by an axial one: the wrong edge scales it
            for i, j in ((i, j) for i in "xyz" for j in "xyz" if i != j and axis in (i, j)):
                name = property_name(arch, i, j)
                r = results.get(name)
                if (r is None or r.verdict == "consistent" or not r.best_estimate
                        or contexts.get(name, Diagnosis()).source != "force_displacement"):
                    continue
                f = factor if j == axis else 1.0 / factor
                if abs(np.log(r.value / r.best_estimate / f)) < np.log(1.15):
                    which = "lateral" if j == axis else "axial"
                    results[name] = _with_cause(r, (
                        f"Across load cases: {text} The {which} strain of {name} is taken over "
                        f"that edge, which scales {name} by {f:.3g}, as seen."))


def _with_cause(r: PropertyCheck, text: str) -> PropertyCheck:
    """Insert a cause first among the likely causes (after a unit slip)."""
    causes = [i for i, x in enumerate(r.reasons) if x.startswith("Likely cause")]
    at = len(r.reasons) if not causes else causes[0]
    if causes and "A unit slip" in r.reasons[at]:
        at += 1
    return replace(r, reasons=(*r.reasons[:at], text, *r.reasons[at:]))
