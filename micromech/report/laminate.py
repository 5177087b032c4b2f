"""Terminal table and JSON dict for the ``micromech laminate`` command.

Both read a :class:`~micromech.laminate.analysis.LaminateAnalysis` and compute nothing new. The
JSON form follows DESIGN.md ("laminate"): SI units, A in N/m, B in N, D in N*m; a value that is
infinite (a ply that never fails along the load direction) is written as ``null``. Round-off
below 1e-12 of the largest term of a matrix or vector (B of a symmetric laminate, alpha_xy of a
balanced one, a thermal shear stress of a 0-degree ply) is written as 0.

Ply numbers: the text numbers plies from 1 at the bottom; the JSON keeps the 0-based list
position as ``index`` (also in ``critical_plies`` and the failure events) and adds the 1-based
``ply``.
"""

from __future__ import annotations

from typing import Any

import numpy as np

from micromech.laminate.analysis import LaminateAnalysis
from micromech.laminate.clt import LOAD_NAMES, POINTS
from micromech.laminate.envelope import DISPLAY_UNITS, Envelope
from micromech.laminate.failure import CRITERIA
from micromech.safety import CAUTION

__all__ = ["CAUTION", "envelope_intercepts_table", "laminate_json", "laminate_table"]


_LOAD_UNITS = {"Nx": ("N/mm", 1e-3), "Ny": ("N/mm", 1e-3), "Nxy": ("N/mm", 1e-3),
               "Mx": ("N*mm/mm", 1.0), "My": ("N*mm/mm", 1.0), "Mxy": ("N*mm/mm", 1.0)}


def _num(x: Any) -> float | None:
    v = float(x)
    return v if np.isfinite(v) else None


def _chop(a: np.ndarray, scale: float, rtol: float = 1e-12) -> np.ndarray:
    """Round-off below ``rtol * scale`` written as 0 (e.g. B of a symmetric laminate)."""
    a = np.asarray(a, dtype=float)
    return np.where(np.abs(a) <= rtol * scale, 0.0, a)


def _matrix(a: np.ndarray) -> list[list[float]]:
    return [[float(v) for v in row] for row in a]


def _abd_chopped(analysis: LaminateAnalysis) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    lam = analysis.laminate
    sA = float(np.max(np.abs(lam.A)))
    sD = float(np.max(np.abs(lam.D)))
    return _chop(lam.A, sA), _chop(lam.B, sA * lam.thickness), _chop(lam.D, sD)


_S_MATERIAL = ("s11", "s22", "s12")


def _named(v: np.ndarray, names: tuple[str, str, str]) -> dict[str, float]:
    return {n: float(x) for n, x in zip(names, v, strict=True)}


def _chopped(a: np.ndarray) -> np.ndarray:
    """Return the array with round-off below 1e-12 of its largest magnitude written as 0."""
    a = np.asarray(a, dtype=float)
    return _chop(a, float(np.max(np.abs(a))) if a.size else 0.0)


#: Per-ply keys that need loads; all present, null without loads.
_PLY_STRESS_KEYS = ("point", "stress_material", "stress_laminate", "strain_material",
                    "stress_material_thermal", "stress_material_points")


def _report_points(analysis: LaminateAnalysis) -> np.ndarray:
    """Point (0 bottom, 1 middle, 2 top) reported for each ply.

    The point that governs the analysis criterion; without strengths, the point with the largest
    stress magnitude in material axes.
    """
    if analysis.criterion in analysis.criteria:
        return analysis.ply_ratio()[1]
    assert analysis.response is not None
    s = analysis.response.total.stress_material
    return np.argmax(np.linalg.norm(s, axis=-1), axis=-1)


def _critical_plies(analysis: LaminateAnalysis) -> set[int]:
    if analysis.criterion not in analysis.criteria:
        return set()
    R = analysis.ply_ratio()[0]
    if not np.any(np.isfinite(R)):
        return set()
    return {int(i) for i in np.flatnonzero(R <= np.min(R) * (1.0 + 1e-9))}


def laminate_json(
    analysis: LaminateAnalysis, case: str = "", envelopes: list[Envelope] | None = None
) -> dict[str, Any]:
    """Build the JSON object of the laminate command (SI units).

    Parameters
    ----------
    analysis : LaminateAnalysis
        The results.
    case : str
        Case name.
    envelopes : list of Envelope, optional
        Failure envelopes to include.

    Returns
    -------
    dict
        Keys case, layup, angles, thickness, A, B, D, in_plane (free to bend, from ABD^-1),
        in_plane_restrained (from A^-1, as in a periodic stack), flexural, stack_3d,
        thermal_expansion, loads, criterion, f12_star, plies, critical_plies,
        first_ply_failure, last_ply_failure, (envelopes), notes, caution. Every ply has the
        same keys; those that need loads (point, stresses, strains) are null without loads.
    """
    lam = analysis.laminate
    plies: list[dict[str, Any]] = []
    critical = _critical_plies(analysis)
    points = _report_points(analysis) if analysis.response is not None else None
    fields = None
    if analysis.response is not None:
        tot, th = analysis.response.total, analysis.response.thermal
        fields = (_chopped(tot.stress_material), _chopped(tot.stress_laminate),
                  _chopped(tot.strain_material), _chopped(th.stress_material))
    for i, p in enumerate(lam.plies):
        entry: dict[str, Any] = {
            "index": i, "ply": i + 1, "angle": p.angle, "thickness": p.thickness,
            "z_bottom": float(lam.z[i]), "z_top": float(lam.z[i + 1]),
            "material": p.material.name,
        }
        entry.update(dict.fromkeys(_PLY_STRESS_KEYS))
        if fields is not None and points is not None:
            k = int(points[i])
            s_mat, s_lam, e_mat, s_th = fields
            entry["point"] = POINTS[k]
            entry["stress_material"] = _named(s_mat[i, k], _S_MATERIAL)
            entry["stress_laminate"] = _named(s_lam[i, k], ("sx", "sy", "sxy"))
            entry["strain_material"] = _named(e_mat[i, k], ("e11", "e22", "g12"))
            entry["stress_material_thermal"] = _named(s_th[i, k], _S_MATERIAL)
            entry["stress_material_points"] = {
                POINTS[j]: _named(s_mat[i, j], _S_MATERIAL) for j in range(3)
            }
        if analysis.criteria:
            crit: dict[str, Any] = {}
            for key, res in analysis.criteria.items():
                R = res.strength_ratio[i]
                j = int(np.argmin(R))
                crit[key] = {"index": _num(res.index[i, j]), "strength_ratio": _num(R[j]),
                             "mode": str(res.mode[i, j]), "point": POINTS[j]}
            entry["criteria"] = crit
        else:
            entry["criteria"] = None
        entry["critical"] = i in critical
        plies.append(entry)
    loads = {k: float(v) for k, v in zip(LOAD_NAMES, analysis.loads, strict=True)}
    loads["delta_T"] = analysis.delta_T
    A, B, D = _abd_chopped(analysis)
    out: dict[str, Any] = {
        "case": case,
        "layup": lam.code,
        "angles": [float(a) for a in lam.angles],
        "thickness": lam.thickness,
        "A": _matrix(A), "B": _matrix(B), "D": _matrix(D),
        "in_plane": analysis.in_plane.as_dict(),
        "in_plane_restrained": lam.in_plane_constants("restrained").as_dict(),
        "flexural": analysis.flexural.as_dict(),
        "stack_3d": analysis.stack.as_dict() if analysis.stack is not None else None,
        "thermal_expansion": (
            {k: float(v) for k, v in zip(("alpha_x", "alpha_y", "alpha_xy"),
                                         _chopped(lam.thermal_expansion()[:3]), strict=True)}
            if all(p.material.has_expansion for p in lam.plies) else None
        ),
        "loads": loads,
        "criterion": analysis.criterion,
        "f12_star": analysis.f12_star,
        "plies": plies,
        "critical_plies": sorted(critical),
        "first_ply_failure": analysis.first_ply.as_dict() if analysis.first_ply else None,
        "last_ply_failure": analysis.sequence.as_dict() if analysis.sequence else None,
    }
    if envelopes:
        out["envelopes"] = [e.as_dict() for e in envelopes]
    out["notes"] = list(analysis.notes)
    out["caution"] = CAUTION
    return out


def _fmt(x: float, width: int = 10, digits: int = 4) -> str:
    if not np.isfinite(x):
        return f"{'never':>{width}}" if x > 0 else f"{'-':>{width}}"
    return f"{x:>{width}.{digits}g}"


def _block(title: str, M: np.ndarray, factor: float) -> list[str]:
    rows = [title]
    for r in M * factor:
        rows.append("  " + "".join(f"{v:>14.5g}" for v in r))
    return rows


def _load_text(vec: np.ndarray) -> str:
    parts = []
    for name, v in zip(LOAD_NAMES, vec, strict=True):
        if v != 0.0:
            unit, f = _LOAD_UNITS[name]
            parts.append(f"{name} = {v * f:.5g} {unit}")
    return ", ".join(parts)


def _at_failure(resultants: np.ndarray, factor: float) -> str:
    """Resultants at a failure event, or why there are none."""
    if factor == 0.0:
        return "no load: the residual (thermal) stress alone exceeds the strength"
    if not np.isfinite(factor):
        return "never along this load direction"
    return _load_text(resultants)


def _plies_text(plies: Any) -> str:
    """Ply indices (0-based) as the 1-based numbers the text shows."""
    return ", ".join(str(int(i) + 1) for i in plies)


def laminate_table(analysis: LaminateAnalysis, case: str = "", ply_origin: str = "") -> str:
    """Render the laminate results as plain text (no colour codes).

    Plies are numbered from 1 at the bottom.

    Parameters
    ----------
    analysis : LaminateAnalysis
        The results.
    case : str
        Case name for the heading.
    ply_origin : str
        Where the ply constants and strengths come from (see
        :func:`micromech.laminate.ply_origin`); default: the ply material names.

    Returns
    -------
    str
        The report: ABD, constants, ply table with strength ratios and the critical ply
        marked ``<<``, first- and last-ply failure, notes and the caution.
    """
    lam = analysis.laminate
    out: list[str] = []
    head = f"Laminate {lam.code or '(angles as listed)'}: {lam.n_plies} plies, " \
           f"h = {lam.thickness * 1e3:.4g} mm"
    if case:
        head += f"   [{case}]"
    out.append(head)
    names = sorted({p.material.name or "unnamed" for p in lam.plies})
    out.append(f"Ply material: {ply_origin or ', '.join(names)}")
    out.append("Angles (deg, bottom to top): " + "/".join(f"{a:g}" for a in lam.angles))
    out.append("")
    A, B, D = _abd_chopped(analysis)
    out += _block("A (N/mm)", A, 1e-3)
    out += _block("B (N)", B, 1.0)
    out += _block("D (N*mm)", D, 1e3)
    out.append("")
    out.append(f"{'constants':<22}{'Ex (GPa)':>10}{'Ey (GPa)':>10}{'Gxy (GPa)':>11}"
               f"{'nuxy':>8}{'nuyx':>8}")
    rows = [("in-plane (free)", analysis.in_plane)]
    restrained = lam.in_plane_constants("restrained")
    if not np.isclose(restrained.Ex, analysis.in_plane.Ex, rtol=1e-9):
        rows.append(("in-plane (restrained)", restrained))
    rows.append(("flexural (free)", analysis.flexural))
    for label, c in rows:
        out.append(f"{label:<22}{c.Ex / 1e9:>10.4g}{c.Ey / 1e9:>10.4g}{c.Gxy / 1e9:>11.4g}"
                   f"{c.nuxy:>8.4f}{c.nuyx:>8.4f}")
    if analysis.stack is not None:
        s = analysis.stack.as_dict()
        out.append("3D stack (periodic)   " + "  ".join(
            f"{k} = {float(s[k]) / 1e9:.4g} GPa" for k in ("Ex", "Ey", "Ez")))  # type: ignore
        out.append("                      " + "  ".join(
            f"{k} = {float(s[k]) / 1e9:.4g} GPa" for k in ("Gxy", "Gxz", "Gyz")))  # type: ignore
        out.append("                      " + "  ".join(
            f"{k} = {float(s[k]):.4f}" for k in ("nuxy", "nuxz", "nuyz")))  # type: ignore
    if analysis.response is not None:
        out.append("")
        text = _load_text(analysis.loads)
        if analysis.delta_T:
            text = (text + ", " if text else "") + f"delta_T = {analysis.delta_T:g} K"
        out.append(f"Loads: {text}")
        out += _ply_table(analysis)
    if analysis.first_ply is not None:
        e = analysis.first_ply
        out.append("")
        out.append(
            f"First-ply failure ({analysis.criterion}): load factor {_fmt(e.load_factor, 0)} "
            f"-> {_at_failure(np.asarray(e.resultants), e.load_factor)}; plies "
            f"{_plies_text(e.plies)} ({', '.join(sorted(set(e.modes)))})"
        )
    if analysis.sequence is not None and analysis.sequence.events:
        seq = analysis.sequence
        out.append(f"Ply discount ({seq.criterion}), thermal part held fixed:")
        out.append(f"  {'event':>5}{'load factor':>13}  plies (mode)")
        for n, e in enumerate(seq.events, 1):
            desc = ", ".join(f"{int(i) + 1} ({m})" for i, m in zip(e.plies, e.modes, strict=True))
            out.append(f"  {n:>5}{_fmt(e.load_factor, 13)}  {desc}")
        end = "laminate collapsed" if seq.collapsed else "remaining plies do not fail"
        out.append(f"  last-ply failure: load factor {_fmt(seq.last_ply_factor, 0)} "
                   f"-> {_at_failure(analysis.loads * seq.last_ply_factor, seq.last_ply_factor)}"
                   f" ({end})")
    if analysis.notes:
        out.append("")
        out += [f"note: {n}" for n in analysis.notes]
    out.append("")
    out.append(CAUTION)
    return "\n".join(out)


def _ply_table(analysis: LaminateAnalysis) -> list[str]:
    lam = analysis.laminate
    assert analysis.response is not None
    points = _report_points(analysis)
    critical = _critical_plies(analysis)
    crits = [c for c in CRITERIA if c in analysis.criteria]
    head1 = (f"{'ply':>4}{'angle':>7}{'z_bot':>8}{'z_top':>8}{'point':>8}"
             f"{'s11':>11}{'s22':>11}{'s12':>11}")
    head2 = (f"{'':>4}{'(deg)':>7}{'(mm)':>8}{'(mm)':>8}{'':>8}"
             f"{'(MPa)':>11}{'(MPa)':>11}{'(MPa)':>11}")
    if crits:
        head1 += "".join(f"{c:>12}" for c in crits) + f"  {'mode (' + analysis.criterion + ')':<24}"
        head2 += "".join(f"{'R':>12}" for _ in crits) + f"  {'':<24}"
        head1 += "crit"
    out = [head1, head2]
    s = analysis.response.total.stress_material
    s = _chop(s, float(np.max(np.abs(s))), 1e-9)
    for i, p in enumerate(lam.plies):
        k = int(points[i])
        row = (f"{i + 1:>4}{p.angle:>7g}{lam.z[i] * 1e3:>8.4g}{lam.z[i + 1] * 1e3:>8.4g}"
               f"{POINTS[k]:>8}" + "".join(f"{v / 1e6:>11.4g}" for v in s[i, k]))
        if crits:
            for c in crits:
                row += _fmt(float(np.min(analysis.criteria[c].strength_ratio[i])), 12)
            mode = analysis.criteria[analysis.criterion].mode[i, k]  # k: its governing point
            row += f"  {mode:<24}" + ("<<" if i in critical else "")
        out.append(row)
    key = "plies numbered from 1 at the bottom"
    if crits:
        key += ("; R = strength ratio (load multiplier to failure; thermal part held fixed); "
                "<< marks the critical ply")
    out.append(key)
    return out


def envelope_intercepts_table(envelopes: list[Envelope]) -> str:
    """Render the intercepts of failure envelopes on their axes, one row per criterion.

    Parameters
    ----------
    envelopes : list of Envelope
        Envelopes in the same two axes (e.g. one per criterion); at least one.

    Returns
    -------
    str
        A heading naming the axes and their units, then per envelope the first-ply failure
        loads along +A, -A, +B, -B (``never`` where that half axis never fails).
    """
    ax = envelopes[0].axes
    (fa, ua), (fb, ub) = (DISPLAY_UNITS[u] for u in envelopes[0].units)
    factors = {ax[0]: fa, ax[1]: fb}
    keys = (f"+{ax[0]}", f"-{ax[0]}", f"+{ax[1]}", f"-{ax[1]}")
    out = [f"First-ply failure envelope in {ax[0]} ({ua}), {ax[1]} ({ub}): intercepts on the "
           "axes", f"  {'criterion':<12}" + "".join(f"{k:>12}" for k in keys)]
    for e in envelopes:
        cells = ("never" if np.isinf(v) else f"{v:.4g}"
                 for v in (e.intercepts[k] * factors[k[1:]] for k in keys))
        out.append(f"  {e.criterion:<12}" + "".join(f"{c:>12}" for c in cells))
    return "\n".join(out)
