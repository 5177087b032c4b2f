"""Classical laminate theory: ABD, laminate constants, ply strains and stresses.

The ply-level algebra (Q, transformations, Q-bar, ply CTEs in laminate axes) lives in
:mod:`micromech.laminate.plane` and is re-exported here.

Conventions. Ply angles are measured from the laminate x axis towards y (counter-clockwise
about z), in degrees. Plies are stacked from z = -h/2 (the first ply of the code) to z = +h/2.
In-plane vectors are ordered (x, y, xy) or (1, 2, 12) with engineering shear strain; resultants
are (Nx, Ny, Nxy, Mx, My, Mxy) in N/m and N (N*m/m). Strains and stresses are given at three
points of every ply: bottom (z_{k-1}), middle and top (z_k).

Thermal loading: with ply CTEs alpha (material axes) and a uniform temperature change dT, the
thermal resultants are N_T = sum Qbar_k alpha_k dT t_k and M_T = sum Qbar_k alpha_k dT
(z_k^2 - z_{k-1}^2) / 2; the mid-plane strains and curvatures solve
[N + N_T; M + M_T] = ABD [eps0; kappa]; the stress is Qbar (eps - alpha dT). Strains reported
are the total strains (what a gauge bonded to the ply reads), free thermal expansion included.

References
----------
.. [1] Kaw, A. K. (2006). *Mechanics of Composite Materials*, 2nd ed., CRC Press: Eq. (2.93)
   (reduced stiffness), Eqs. (2.94)-(2.104) (transformation, Q-bar), Eqs. (4.28)-(4.29) (ABD),
   Sec. 4.5 (laminate engineering constants), Sec. 4.6 (hygrothermal loads).
   Equation and section numbers are cited from memory; check them against the edition at hand.
.. [2] Jones, R. M. (1999). *Mechanics of Composite Materials*, 2nd ed., Taylor & Francis,
   Ch. 4 (classical lamination theory).
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Any

import numpy as np
from numpy.typing import ArrayLike, NDArray

from micromech.errors import InputError
from micromech.laminate.layup import parse_layup
from micromech.laminate.plane import (
    reduced_stiffness,
    strain_transformation,
    stress_transformation,
    transformed_expansion,
    transformed_reduced_stiffness,
)
from micromech.laminate.ply import Ply, PlyMaterial
from micromech.units import parse_quantity

if TYPE_CHECKING:  # pragma: no cover
    from micromech.laminate.stack import StackResult

__all__ = [
    "POINTS",
    "LOAD_NAMES",
    "reduced_stiffness",
    "stress_transformation",
    "strain_transformation",
    "transformed_reduced_stiffness",
    "transformed_expansion",
    "abd_matrices",
    "load_vector",
    "LaminateConstants",
    "PlyFields",
    "LaminateResponse",
    "Laminate",
]

Array = NDArray[np.float64]

#: Names of the three points at which ply strains and stresses are given.
POINTS: tuple[str, str, str] = ("bottom", "middle", "top")

#: Force and moment resultants, in the order of the ABD system.
LOAD_NAMES: tuple[str, ...] = ("Nx", "Ny", "Nxy", "Mx", "My", "Mxy")

_LOAD_KINDS = dict.fromkeys(LOAD_NAMES[:3], "force_per_length") | dict.fromkeys(
    LOAD_NAMES[3:], "moment_per_length"
)


def _f(x: ArrayLike) -> Array:
    return np.asarray(x, dtype=np.float64)


# --- laminate level -----------------------------------------------------------------------------


def abd_matrices(Qbar: ArrayLike, z: ArrayLike) -> tuple[Array, Array, Array]:
    """Extensional, coupling and bending stiffness of a stack of plies.

    Parameters
    ----------
    Qbar : array_like, shape (..., n, 3, 3)
        Transformed reduced stiffness of each ply, Pa.
    z : array_like, shape (..., n + 1)
        Ply interface coordinates from bottom to top, m (z_0 = -h/2 for the usual mid-plane).

    Returns
    -------
    A : ndarray, shape (..., 3, 3)
        sum Qbar_k (z_k - z_{k-1}), N/m.
    B : ndarray, shape (..., 3, 3)
        sum Qbar_k (z_k^2 - z_{k-1}^2) / 2, N.
    D : ndarray, shape (..., 3, 3)
        sum Qbar_k (z_k^3 - z_{k-1}^3) / 3, N*m.

    References
    ----------
    Kaw (2006), Eqs. (4.28)-(4.29); Jones (1999), Sec. 4.2.
    """
    Qbar, z = _f(Qbar), _f(z)
    z0, z1 = z[..., :-1], z[..., 1:]
    w1 = (z1 - z0)[..., None, None]
    w2 = ((z1**2 - z0**2) / 2.0)[..., None, None]
    w3 = ((z1**3 - z0**3) / 3.0)[..., None, None]
    return (Qbar * w1).sum(-3), (Qbar * w2).sum(-3), (Qbar * w3).sum(-3)


def load_vector(
    loads: Mapping[str, Any] | ArrayLike | None, delta_T: float | None = None
) -> tuple[Array, float]:
    """Read force and moment resultants and a temperature change.

    Parameters
    ----------
    loads : mapping, array_like or None
        A mapping with any of ``Nx, Ny, Nxy`` (N/m or strings such as ``"100 N/mm"``),
        ``Mx, My, Mxy`` (N*m/m = N, or strings) and ``delta_T`` (K); or an array of shape
        (..., 6) in the order Nx, Ny, Nxy, Mx, My, Mxy (SI); or None (no load).
    delta_T : float, optional
        Temperature change, K; overrides a ``delta_T`` in ``loads``.

    Returns
    -------
    resultants : ndarray, shape (..., 6)
        Nx, Ny, Nxy (N/m), Mx, My, Mxy (N).
    delta_T : float
        Temperature change, K (the override; else the mapping's; else 0).

    Raises
    ------
    InputError
        For an unknown key or an array whose last axis is not 6.
    """
    vec, dT = _read_loads(loads)
    return vec, dT if delta_T is None else float(delta_T)


def _read_loads(loads: Mapping[str, Any] | ArrayLike | None) -> tuple[Array, float]:
    if loads is None:
        return np.zeros(6), 0.0
    if isinstance(loads, Mapping):
        valid = (*LOAD_NAMES, "delta_T")
        for k in loads:
            if k not in valid:
                raise InputError(f"loads: unknown key {k!r}; valid keys are {', '.join(valid)}")
        vec = np.array([
            parse_quantity(loads[k], _LOAD_KINDS[k], f"loads.{k}") if k in loads else 0.0
            for k in LOAD_NAMES
        ])
        dT = loads.get("delta_T", 0.0)
        dT = parse_quantity(dT, "temperature_change", "loads.delta_T") if dT is not None else 0.0
        if not (np.all(np.isfinite(vec)) and np.isfinite(dT)):
            raise InputError(f"loads: resultants and delta_T must be finite, got {dict(loads)}")
        return vec, float(dT)
    vec = _f(loads)
    if vec.shape[-1:] != (6,):
        raise InputError(
            f"loads: expected a mapping or an array of shape (..., 6) (Nx, Ny, Nxy, Mx, My, Mxy), "
            f"got shape {vec.shape}"
        )
    if not np.all(np.isfinite(vec)):
        raise InputError("loads: resultants must be finite")
    return vec, 0.0


@dataclass(frozen=True)
class LaminateConstants:
    """Apparent engineering constants of a laminate (in-plane or flexural).

    Attributes
    ----------
    Ex, Ey, Gxy : float
        Moduli, Pa.
    nuxy, nuyx : float
        Poisson ratios.
    kind : str
        ``"in_plane"`` or ``"flexural"``.
    bending : str
        ``"free"`` (from the inverse of the full ABD: the laminate may bend or stretch freely)
        or ``"restrained"`` (from A^-1 or D^-1 alone). Equal for symmetric laminates.
    """

    Ex: float
    Ey: float
    Gxy: float
    nuxy: float
    nuyx: float
    kind: str
    bending: str

    def as_dict(self) -> dict[str, float]:
        """Return ``{"Ex", "Ey", "Gxy", "nuxy", "nuyx"}`` (SI).

        Returns
        -------
        dict
            The constants.
        """
        return {"Ex": self.Ex, "Ey": self.Ey, "Gxy": self.Gxy, "nuxy": self.nuxy,
                "nuyx": self.nuyx}


@dataclass(frozen=True, eq=False)
class PlyFields:
    """Mid-plane deformation and ply strains and stresses for one load state.

    Attributes
    ----------
    midplane_strain : ndarray, shape (..., 3)
        eps_x0, eps_y0, gamma_xy0.
    curvature : ndarray, shape (..., 3)
        kappa_x, kappa_y, kappa_xy, 1/m.
    strain_laminate, strain_material : ndarray, shape (..., n, 3, 3)
        Total strains per ply, per point (bottom, middle, top), per component, in laminate
        axes (x, y, xy) and material axes (1, 2, 12).
    stress_laminate, stress_material : ndarray, shape (..., n, 3, 3)
        Stresses, Pa, same layout.
    """

    midplane_strain: Array
    curvature: Array
    strain_laminate: Array
    stress_laminate: Array
    strain_material: Array
    stress_material: Array


@dataclass(frozen=True, eq=False)
class LaminateResponse:
    """Response of a laminate to resultants and a temperature change.

    Attributes
    ----------
    loads : ndarray, shape (..., 6)
        Applied Nx, Ny, Nxy (N/m), Mx, My, Mxy (N).
    delta_T : float
        Temperature change, K.
    z : ndarray, shape (n, 3)
        z of the bottom, middle and top of every ply, m.
    total : PlyFields
        Loads and temperature change together.
    mechanical : PlyFields
        The part due to the resultants alone.
    thermal : PlyFields
        The residual part due to the temperature change alone (``total = mechanical +
        thermal``).
    """

    loads: Array
    delta_T: float
    z: Array
    total: PlyFields
    mechanical: PlyFields
    thermal: PlyFields


def _as_material_list(
    material: Any, n: int, what: str, model: str = "mori_tanaka", strengths: Any = None
) -> list[PlyMaterial]:
    """Return one ply material per ply, from one source or a list or tuple of sources.

    A source is anything :meth:`PlyMaterial.coerce` takes.
    """
    if not isinstance(material, list | tuple):
        one = PlyMaterial.coerce(material, model=model, strengths=strengths)
        return [one] * n
    if len(material) != n:
        raise InputError(f"{what}: {len(material)} materials given for {n} plies")
    made: dict[int, PlyMaterial] = {}  # a source listed for several plies is converted once
    out = []
    for m in material:
        if id(m) not in made:
            made[id(m)] = PlyMaterial.coerce(m, model=model, strengths=strengths)
        out.append(made[id(m)])
    return out


def _invert_abd(ABD: Array, t: Array) -> Array:
    """Invert the 6x6 laminate stiffness, refusing one that is singular in floating point."""
    inv: Array | None
    try:
        inv = np.asarray(np.linalg.inv(ABD), dtype=np.float64)
    except np.linalg.LinAlgError:
        inv = None
    if inv is None or not (np.all(np.isfinite(ABD)) and np.all(np.isfinite(inv))):
        raise InputError(
            f"laminate: the ABD matrix cannot be inverted for ply thicknesses from "
            f"{t.min():g} to {t.max():g} m (total {t.sum():g} m): the bending stiffness "
            "D ~ h^3 under- or overflows; give thicknesses in metres of a realistic size "
            "(e.g. '0.125 mm')"
        )
    return inv


def _as_thickness_list(thickness: Any, n: int, what: str) -> list[Any]:
    if isinstance(thickness, (str, int, float, np.floating)) or np.ndim(thickness) == 0:
        return [thickness] * n
    ts = list(thickness)
    if len(ts) != n:
        raise InputError(f"{what}: {len(ts)} thicknesses given for {n} plies")
    return ts


@dataclass(frozen=True, eq=False)
class Laminate:
    """A stack of plies, bottom (z = -h/2) to top (z = +h/2), with its ABD matrices.

    Parameters
    ----------
    plies : sequence of Ply
        The plies, bottom to top. Materials and thicknesses may differ (hybrids).
    code : str, optional
        The laminate code it came from, for reports.

    Raises
    ------
    InputError
        If there are no plies.

    References
    ----------
    Kaw (2006), Ch. 4; Jones (1999), Ch. 4.

    Examples
    --------
    >>> m = PlyMaterial(E1=181e9, E2=10.3e9, nu12=0.28, G12=7.17e9)
    >>> lam = Laminate.from_code("[0/90]s", m, 0.125e-3)
    >>> bool(abs(lam.B).max() < 1e-6)
    True
    """

    plies: tuple[Ply, ...]
    code: str = ""
    _arrays: dict[str, Array] = field(init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        plies = tuple(self.plies)
        if not plies:
            raise InputError("laminate: needs at least one ply")
        for i, p in enumerate(plies):
            if not isinstance(p, Ply):
                raise InputError(f"laminate: ply {i + 1} (from 1 at the bottom) is a "
                                 f"{type(p).__name__}, expected a Ply")
        object.__setattr__(self, "plies", plies)
        t = np.array([p.thickness for p in plies])
        z = np.concatenate([[0.0], np.cumsum(t)]) - t.sum() / 2.0
        angles = np.array([p.angle for p in plies])
        Q = np.stack([p.material.reduced_stiffness() for p in plies])
        Qbar = transformed_reduced_stiffness(Q, angles)
        alpha = transformed_expansion(np.stack([p.material.expansion() for p in plies]), angles)
        with np.errstate(over="ignore", under="ignore", invalid="ignore"):
            A, B, D = abd_matrices(Qbar, z)  # extreme thicknesses are refused just below
            ABD = np.block([[A, B], [B, D]])
            abd_inv = _invert_abd(ABD, t)
        arrays = {
            "t": t, "z": z, "angles": angles, "Q": Q, "Qbar": Qbar, "alpha": alpha,
            "A": A, "B": B, "D": D, "ABD": ABD, "abd_inv": abd_inv,
            "zpts": np.stack([z[:-1], 0.5 * (z[:-1] + z[1:]), z[1:]], -1),
            "T": stress_transformation(angles), "Te": strain_transformation(angles),
        }
        for v in arrays.values():
            v.setflags(write=False)
        object.__setattr__(self, "_arrays", arrays)

    # -- constructors ----------------------------------------------------------------------
    @classmethod
    def from_angles(
        cls,
        angles: Sequence[float] | ArrayLike,
        material: Any,
        thickness: float | str | Sequence[float | str],
        code: str = "",
        *,
        model: str = "mori_tanaka",
        strengths: Any = None,
    ) -> Laminate:
        """Build a laminate from ply angles, one material (or one per ply) and thickness(es).

        Parameters
        ----------
        angles : sequence of float
            Ply angles in degrees, bottom to top.
        material : PlyMaterial, Composite, ElasticConstants, str or material, or a list of them
            One ply source for all plies, or a list (or tuple) with one per ply (hybrid
            laminates). A composite is estimated with ``model`` (constituents -> ply ->
            laminate in one call); a string is a registry key (see
            :meth:`PlyMaterial.coerce`).
        thickness : float, str or sequence
            One ply thickness (m or a unit string), or one per ply.
        code : str, optional
            Label kept for reports.
        model : str
            Estimate used for composite sources.
        strengths : PlyStrengths, mapping or object, optional
            Strengths attached to every ply made from a source (replacing its own).

        Returns
        -------
        Laminate
            The laminate.

        Examples
        --------
        >>> from micromech.materials import Composite, Isotropic
        >>> c = Composite(Isotropic(E="72 GPa", nu=0.22), Isotropic(E="3.5 GPa", nu=0.35), 0.55)
        >>> lam = Laminate.from_angles([0.0, 90.0, 90.0, 0.0], c, "0.25 mm")
        >>> lam.plies[0].material.name
        'mori_tanaka estimate'
        """
        angles = [float(a) for a in np.atleast_1d(_f(angles))]
        n = len(angles)
        mats = _as_material_list(material, n, "laminate", model, strengths)
        ts = _as_thickness_list(thickness, n, "laminate")
        return cls(tuple(Ply(m, a, t) for m, a, t in zip(mats, angles, ts, strict=True)), code)

    @classmethod
    def from_code(
        cls,
        code: str,
        material: Any,
        thickness: float | str | Sequence[float | str],
        *,
        model: str = "mori_tanaka",
        strengths: Any = None,
    ) -> Laminate:
        """Build a laminate from a laminate code such as ``"[0/+-45/90]s"``.

        Parameters
        ----------
        code : str
            Laminate code (see :func:`~micromech.laminate.layup.parse_layup`).
        material : PlyMaterial, Composite, ElasticConstants, str or material, or a list of them
            One ply source, or a list with one per ply of the expanded code (see
            :meth:`from_angles`).
        thickness : float, str or sequence
            Ply thickness, or one per ply.
        model : str
            Estimate used for composite sources.
        strengths : PlyStrengths, mapping or object, optional
            Strengths attached to plies made from a source.

        Returns
        -------
        Laminate
            The laminate.
        """
        return cls.from_angles(parse_layup(code), material, thickness, code=code, model=model,
                               strengths=strengths)

    def with_materials(self, materials: Sequence[PlyMaterial]) -> Laminate:
        """Return the same stack with other ply materials (e.g. discounted after failure).

        Parameters
        ----------
        materials : sequence of PlyMaterial
            One per ply.

        Returns
        -------
        Laminate
            The new laminate.
        """
        mats = _as_material_list(materials, self.n_plies, "with_materials")
        return Laminate(
            tuple(Ply(m, p.angle, p.thickness) for m, p in zip(mats, self.plies, strict=True)),
            self.code,
        )

    # -- geometry and stiffness ------------------------------------------------------------
    @property
    def n_plies(self) -> int:
        """Number of plies."""
        return len(self.plies)

    @property
    def angles(self) -> Array:
        """Ply angles, degrees, shape (n,)."""
        return self._arrays["angles"]

    @property
    def thicknesses(self) -> Array:
        """Ply thicknesses, m, shape (n,)."""
        return self._arrays["t"]

    @property
    def thickness(self) -> float:
        """Total thickness h, m."""
        return float(self._arrays["t"].sum())

    @property
    def z(self) -> Array:
        """Interface coordinates z_0 = -h/2 ... z_n = +h/2, m, shape (n + 1,)."""
        return self._arrays["z"]

    @property
    def z_points(self) -> Array:
        """Heights z of the bottom, middle and top of each ply, m, shape (n, 3)."""
        return self._arrays["zpts"]

    @property
    def Q(self) -> Array:
        """Reduced stiffness of each ply in material axes, Pa, shape (n, 3, 3)."""
        return self._arrays["Q"]

    @property
    def Qbar(self) -> Array:
        """Transformed reduced stiffness of each ply in laminate axes, Pa, shape (n, 3, 3)."""
        return self._arrays["Qbar"]

    @property
    def A(self) -> Array:
        """Extensional stiffness, N/m, shape (3, 3)."""
        return self._arrays["A"]

    @property
    def B(self) -> Array:
        """Coupling stiffness, N, shape (3, 3)."""
        return self._arrays["B"]

    @property
    def D(self) -> Array:
        """Bending stiffness, N*m, shape (3, 3)."""
        return self._arrays["D"]

    @property
    def ABD(self) -> Array:
        """The 6x6 laminate stiffness [[A, B], [B, D]]."""
        return self._arrays["ABD"]

    @property
    def abd_inverse(self) -> Array:
        """The 6x6 laminate compliance [[a, b], [b^T, d]] = ABD^-1."""
        return self._arrays["abd_inv"]

    @property
    def expansion_laminate_axes(self) -> Array:
        """Ply CTEs in laminate axes (alpha_x, alpha_y, alpha_xy), 1/K, shape (n, 3)."""
        return self._arrays["alpha"]

    # -- constants -------------------------------------------------------------------------
    def in_plane_constants(self, bending: str = "free") -> LaminateConstants:
        """In-plane engineering constants Ex, Ey, Gxy, nuxy, nuyx of the laminate.

        Parameters
        ----------
        bending : {"free", "restrained"}
            "free" reads the constants from the in-plane block of ABD^-1 (the laminate may
            bend under in-plane load, as a test coupon does); "restrained" from A^-1 (as in a
            periodic 3D stack). They agree for symmetric laminates.

        Returns
        -------
        LaminateConstants
            Ex = 1 / (h a11), Ey = 1 / (h a22), Gxy = 1 / (h a66), nuxy = -a12 / a11,
            nuyx = -a12 / a22.

        References
        ----------
        Kaw (2006), Eqs. (4.35)-(4.38) (from memory); Daniel and Ishai (2006), Sec. 8.3.
        """
        return self._constants("in_plane", bending, 1.0, self.thickness)

    def flexural_constants(self, bending: str = "free") -> LaminateConstants:
        """Flexural engineering constants of the laminate.

        Parameters
        ----------
        bending : {"free", "restrained"}
            "free" uses the bending block of ABD^-1, "restrained" uses D^-1.

        Returns
        -------
        LaminateConstants
            Ex = 12 / (h^3 d11), Ey = 12 / (h^3 d22), Gxy = 12 / (h^3 d66),
            nuxy = -d12 / d11, nuyx = -d12 / d22.

        References
        ----------
        Kaw (2006), Eqs. (4.39)-(4.42) (from memory).
        """
        return self._constants("flexural", bending, 12.0, self.thickness**3)

    def _constants(self, kind: str, bending: str, num: float, den: float) -> LaminateConstants:
        """Moduli num / (den c_ii) and Poisson ratios -c12 / c_ii of a block c of compliance.

        The block is that of ABD^-1 ("free") or the inverse of A or D ("restrained").
        """
        if bending == "free":
            inv = self.abd_inverse
            c = inv[:3, :3] if kind == "in_plane" else inv[3:, 3:]
        elif bending == "restrained":
            c = np.asarray(np.linalg.inv(self.A if kind == "in_plane" else self.D),
                           dtype=np.float64)
        else:
            raise InputError(f"bending: expected 'free' or 'restrained', got {bending!r}")
        return LaminateConstants(
            Ex=float(num / (den * c[0, 0])), Ey=float(num / (den * c[1, 1])),
            Gxy=float(num / (den * c[2, 2])), nuxy=float(-c[0, 1] / c[0, 0]),
            nuyx=float(-c[0, 1] / c[1, 1]), kind=kind, bending=bending,
        )

    def thermal_resultants(self, delta_T: float) -> Array:
        """Thermal force and moment resultants (N_T, M_T) for a temperature change.

        Parameters
        ----------
        delta_T : float
            Temperature change, K.

        Returns
        -------
        ndarray, shape (6,)
            N_T (N/m) and M_T (N).

        Raises
        ------
        InputError
            If delta_T is not zero and a ply lacks alpha1 or alpha2.

        References
        ----------
        Kaw (2006), Eqs. (4.46)-(4.47) (from memory); Jones (1999), Sec. 4.5.
        """
        dT = float(delta_T)
        if dT != 0.0:
            for i, p in enumerate(self.plies):
                if not p.material.has_expansion:
                    raise InputError(
                        f"ply {i + 1} of {self.n_plies} from the bottom "
                        f"({p.material.name or 'unnamed'}): alpha1 and alpha2 are "
                        f"needed for a temperature change (delta_T = {dT:g} K)"
                    )
        NT = np.einsum("nij,nj->i", self.Qbar, self._arrays["alpha"] * self.thicknesses[:, None])
        z = self.z
        w2 = (z[1:] ** 2 - z[:-1] ** 2) / 2.0
        MT = np.einsum("nij,nj->i", self.Qbar, self._arrays["alpha"] * w2[:, None])
        return np.concatenate([NT, MT]) * dT

    def thermal_expansion(self) -> Array:
        """Free thermal deformation of the laminate per kelvin.

        Returns
        -------
        ndarray, shape (6,)
            Mid-plane strains (alpha_x, alpha_y, alpha_xy, 1/K) and curvatures (1/(m K)) of
            the unloaded laminate under a unit temperature change.
        """
        return np.asarray(self.abd_inverse @ self.thermal_resultants(1.0), dtype=np.float64)

    # -- response --------------------------------------------------------------------------
    def _fields(self, rhs: Array, delta_T: float) -> PlyFields:
        ar = self._arrays
        strains = np.einsum("ij,...j->...i", ar["abd_inv"], rhs)
        e0, k = strains[..., :3], strains[..., 3:]
        eps = e0[..., None, None, :] + ar["zpts"][..., None] * k[..., None, None, :]
        mech = eps - ar["alpha"][:, None, :] * delta_T
        sig = np.einsum("nij,...npj->...npi", ar["Qbar"], mech)
        return PlyFields(
            midplane_strain=e0,
            curvature=k,
            strain_laminate=eps,
            stress_laminate=sig,
            strain_material=np.einsum("nij,...npj->...npi", ar["Te"], eps),
            stress_material=np.einsum("nij,...npj->...npi", ar["T"], sig),
        )

    def response(
        self, loads: Mapping[str, Any] | ArrayLike | None = None, delta_T: float | None = None
    ) -> LaminateResponse:
        """Mid-plane strains, curvatures and ply strains and stresses under load.

        Parameters
        ----------
        loads : mapping, array_like or None
            Resultants (see :func:`load_vector`); an array of shape (..., 6) gives a batch of
            load cases. A mapping may carry ``delta_T``.
        delta_T : float, optional
            Temperature change, K; overrides a ``delta_T`` in ``loads``.

        Returns
        -------
        LaminateResponse
            Total, mechanical and thermal (residual) parts.

        References
        ----------
        Kaw (2006), Eqs. (4.16), (4.31) and Sec. 4.6; Jones (1999), Sec. 4.2.
        """
        vec, dT = load_vector(loads, delta_T)
        thermal_rhs = self.thermal_resultants(dT)
        mech = self._fields(vec, 0.0)
        therm = self._fields(np.broadcast_to(thermal_rhs, (6,)), dT)
        total = PlyFields(*(getattr(mech, f) + getattr(therm, f) for f in (
            "midplane_strain", "curvature", "strain_laminate", "stress_laminate",
            "strain_material", "stress_material")))
        return LaminateResponse(
            loads=vec, delta_T=dT, z=self.z_points, total=total, mechanical=mech, thermal=therm
        )

    # -- 3D ---------------------------------------------------------------------------------
    def ply_stiffness_3d(self) -> Array:
        """Three-dimensional stiffness of every ply rotated into laminate axes, Pa.

        Returns
        -------
        ndarray, shape (n, 6, 6)
            Voigt order xx, yy, zz, yz, xz, xy.

        Raises
        ------
        InputError
            If a ply lacks its 3D constants (G23 or nu23).
        """
        from micromech import tensors

        C = np.stack([p.material.stiffness() for p in self.plies])
        return tensors.rotate_stiffness(C, tensors.rotation_about_axis(3, self.angles))

    def stack_constants(self) -> StackResult:
        """3D effective constants of the periodic stack of these plies (see ``stack_constants``).

        Returns
        -------
        StackResult
            Effective constants and 6x6 stiffness.
        """
        from micromech.laminate.stack import stack_constants

        return stack_constants(self.ply_stiffness_3d(), self.thicknesses / self.thickness)
