"""The materials registry: named constituents read from TOML files.

The bundled files live in ``data/materials/*.toml`` at the repository root. Users add their own
files or folders, passed to :class:`Registry` or listed in the environment variable
``MICROMECH_MATERIALS`` (paths separated by :data:`os.pathsep`). Each top-level table of a file is
one material, its table name the key::

    [my-epoxy]
    kind = "isotropic"          # isotropic | transversely_isotropic (ti) | orthotropic
    role = "matrix"             # fibre | matrix | ply | particle | other
    name = "toughened epoxy"
    source = "supplier sheet 2021, batch 7"
    E = "3.1 GPa"
    nu = 0.36
    density = "1.18 g/cm^3"
    alpha = "62e-6 1/K"
    strengths = { Xt = "75 MPa" }
    notes = { alpha = "measured below Tg" }

Keys are compared in lower case. A key defined twice (in any two files) is an error naming both.
"""

from __future__ import annotations

import os
import re
from collections.abc import Iterable, Iterator, Mapping
from functools import lru_cache
from pathlib import Path
from typing import Any

from micromech.errors import (
    DataFileError,
    InvalidMaterialError,
    MicromechError,
    RegistryError,
    suggest,
)
from micromech.materials.models import (
    Isotropic,
    Material,
    Orthotropic,
    TransverselyIsotropic,
    material_from_dict,
)
from micromech.resources import data_directory, read_toml

__all__ = [
    "ENV_VAR",
    "Registry",
    "bundled_directory",
    "default_registry",
    "get_material",
    "list_materials",
    "load_material",
]

#: Environment variable with extra registry files or folders (os.pathsep-separated).
ENV_VAR = "MICROMECH_MATERIALS"

_KEY_RE = re.compile(r"^[a-z0-9][a-z0-9._+-]*$")


def bundled_directory() -> Path:
    """Locate the folder of bundled registry files.

    Returns
    -------
    Path
        The first existing folder among ``<repo>/data/materials`` (next to the package),
        ``<prefix>/share/micromech/materials`` and ``./data/materials``.

    Raises
    ------
    RegistryError
        If none exists.
    """
    try:
        return data_directory("materials")
    except DataFileError as exc:
        raise RegistryError(str(exc)) from None


def _expand(path: Path | str) -> list[Path]:
    p = Path(path).expanduser()
    if p.is_dir():
        return sorted(p.rglob("*.toml"))
    if p.is_file():
        return [p]
    raise RegistryError(f"materials path {str(p)!r} does not exist (expected a .toml file or a "
                        "folder of them)")


class Registry(Mapping[str, Material]):
    """A read-only mapping of registry keys to validated materials.

    Parameters
    ----------
    paths : iterable of str or Path
        Extra registry files or folders (folders are searched for ``*.toml`` recursively).
    bundled : bool
        Whether to read the bundled ``data/materials`` files.
    use_env : bool
        Whether to read the paths in the ``MICROMECH_MATERIALS`` environment variable.

    Raises
    ------
    RegistryError
        On a malformed file, a bad key, a missing path or a key defined twice (naming both files).
    InvalidMaterialError
        On invalid constants (the message names the file and key).

    Examples
    --------
    >>> reg = Registry()
    >>> reg["e-glass"].kind
    'isotropic'
    """

    def __init__(
        self, paths: Iterable[Path | str] = (), *, bundled: bool = True, use_env: bool = True
    ) -> None:
        files: list[Path] = []
        if bundled:
            files.extend(sorted(bundled_directory().glob("*.toml")))
        if use_env:
            for part in os.environ.get(ENV_VAR, "").split(os.pathsep):
                if part.strip():
                    files.extend(_expand(part.strip()))
        if isinstance(paths, str | Path):
            paths = [paths]
        for p in paths:
            files.extend(_expand(p))
        self._raw: dict[str, dict[str, Any]] = {}
        self._file: dict[str, Path] = {}
        self._materials: dict[str, Material] = {}
        seen: set[Path] = set()
        for f in files:
            rf = f.resolve()
            if rf in seen:
                continue
            seen.add(rf)
            self._add_file(rf)

    def _add_file(self, path: Path) -> None:
        data = read_toml(path, RegistryError)
        for raw_key, entry in data.items():
            key = raw_key.strip().lower()
            if not isinstance(entry, dict):
                raise RegistryError(
                    f"{path}: top-level key {raw_key!r} must be a table of constants "
                    f"([{raw_key}] ...), got {entry!r}"
                )
            if not _KEY_RE.match(key):
                raise RegistryError(
                    f"{path}: key {raw_key!r} must be letters, digits and . _ + - only"
                )
            if key in self._file:
                raise RegistryError(
                    f"material key {key!r} is defined twice: in {self._file[key]} and in {path}"
                )
            if "use" in entry:
                raise RegistryError(f"{path}: [{raw_key}] 'use' is only allowed in case files")
            d = dict(entry)
            d.setdefault("key", key)
            d.setdefault("name", key)
            try:
                mat = material_from_dict(d, label=f"[{raw_key}]")
            except MicromechError as exc:
                raise type(exc)(f"{path}: {exc}") from None
            self._raw[key] = d
            self._file[key] = path
            self._materials[key] = mat

    def _known(self, key: str) -> str:
        """Return the stored form of a known key (lower case); raise for an unknown one."""
        k = str(key).strip().lower()
        if k not in self._materials:
            raise RegistryError(
                f"unknown material {key!r}{suggest(k, self._materials)} (`micromech materials` "
                f"lists the "
                f"{len(self._materials)} known keys)"
            )
        return k

    # Mapping interface
    def __getitem__(self, key: str) -> Material:
        return self._materials[self._known(key)]

    def __iter__(self) -> Iterator[str]:
        return iter(sorted(self._materials))

    def __len__(self) -> int:
        return len(self._materials)

    def __contains__(self, key: object) -> bool:
        return isinstance(key, str) and key.strip().lower() in self._materials

    def get_material(self, key: str) -> Material:
        """Return the material stored under ``key`` (case-insensitive).

        Parameters
        ----------
        key : str
            Registry key, e.g. ``"e-glass"``.

        Returns
        -------
        Material
            The validated material.

        Raises
        ------
        RegistryError
            For an unknown key, suggesting the nearest keys.
        """
        return self[key]

    def raw(self, key: str) -> dict[str, Any]:
        """Return the entry as written in its file (with ``key`` and ``name`` filled in).

        Parameters
        ----------
        key : str
            Registry key.

        Returns
        -------
        dict
            A copy of the TOML table.
        """
        return dict(self._raw[self._known(key)])

    def source_file(self, key: str) -> Path:
        """Return the file that defines ``key``.

        Parameters
        ----------
        key : str
            Registry key.

        Returns
        -------
        Path
            Absolute path of the TOML file.
        """
        return self._file[self._known(key)]

    def resolve(self, value: Any, label: str = "material") -> Material:
        """Turn a registry key, an inline table, or ``use = KEY`` plus overrides into a material.

        Parameters
        ----------
        value : str, dict or Material
            ``"e-glass"``; ``{"E": "72 GPa", "nu": 0.22}``; or ``{"use": "e-glass",
            "E": "74 GPa"}`` (the registry entry with single fields replaced; replacing one of
            ``nu``/``G`` or ``nu23``/``G23`` drops the other so that it is derived again).
        label : str
            Where the value comes from, for messages (e.g. ``"[fibre]"``).

        Returns
        -------
        Material
            The validated material.

        Raises
        ------
        RegistryError
            For an unknown key.
        InvalidMaterialError
            For invalid constants or overrides.
        """
        if isinstance(value, Isotropic | TransverselyIsotropic | Orthotropic):
            return value
        if isinstance(value, str):
            return self[value]
        if not isinstance(value, dict):
            raise InvalidMaterialError(
                f"{label}: expected a registry key or a table of constants, got {value!r}"
            )
        if "use" not in value:
            return material_from_dict(dict(value), label=label)
        overrides = dict(value)
        key = overrides.pop("use")
        if not isinstance(key, str):
            raise InvalidMaterialError(f"{label}: use = {key!r} must be a registry key (text)")
        try:
            base = self[key]
        except RegistryError as exc:
            raise RegistryError(f"{label}: {exc}") from None
        if "kind" in overrides and overrides["kind"] != base.kind:
            raise InvalidMaterialError(
                f"{label}: kind = {overrides['kind']!r} conflicts with {key!r} which is "
                f"{base.kind}; give all constants inline instead of use = {key!r}"
            )
        overrides.pop("kind", None)
        if not overrides:
            return base
        allowed = set(type(base).model_fields)
        for k in overrides:
            if k not in allowed:
                raise InvalidMaterialError(
                    f"{label}: unknown key {k!r} for {base.kind} material {key!r}"
                    f"{suggest(k, sorted(allowed))}"
                )
        if "notes" not in overrides:
            overrides["notes"] = {
                **base.notes,
                **{k: f"overridden in {label}; the registry value is replaced"
                   for k in overrides if k not in ("name", "source", "role", "key")},
            }
        if isinstance(overrides.get("strengths"), dict) and base.strengths is not None:
            overrides["strengths"] = {**base.strengths.as_dict(), **overrides["strengths"]}
        try:
            out: Material = base.replaced(**overrides)
        except MicromechError as exc:
            raise type(exc)(f"{label}: {exc}") from None
        return out


@lru_cache(maxsize=8)
def _cached_default(env_value: str) -> Registry:
    return Registry()


def default_registry() -> Registry:
    """Return the registry of bundled files plus ``MICROMECH_MATERIALS`` (cached per env value).

    Returns
    -------
    Registry
        The shared default registry.
    """
    return _cached_default(os.environ.get(ENV_VAR, ""))


def get_material(key: str, registry: Registry | None = None) -> Material:
    """Return a registry material by key.

    Parameters
    ----------
    key : str
        Registry key, e.g. ``"carbon-standard"``.
    registry : Registry, optional
        Registry to use; the default registry when not given.

    Returns
    -------
    Material
        The validated material.

    Raises
    ------
    RegistryError
        For an unknown key, suggesting the nearest keys.

    Examples
    --------
    >>> round(get_material("epoxy").E / 1e9, 2)
    3.5
    """
    return (registry or default_registry())[key]


def list_materials(registry: Registry | None = None) -> list[Material]:
    """Return all registry materials, sorted by key.

    Parameters
    ----------
    registry : Registry, optional
        Registry to use; the default registry when not given.

    Returns
    -------
    list of Material
        One per key (each with ``.key`` set).
    """
    reg = registry or default_registry()
    return [reg[k] for k in reg]


def load_material(
    value: Any, label: str = "material", registry: Registry | None = None
) -> Material:
    """Build a material from a registry key, an inline table, or ``use = KEY`` plus overrides.

    Parameters
    ----------
    value : str, dict or Material
        See :meth:`Registry.resolve`.
    label : str
        Where the value comes from, for messages.
    registry : Registry, optional
        Registry for keys; the default registry when not given. An inline table without ``use``
        does not read the registry at all.

    Returns
    -------
    Material
        The validated material.

    Raises
    ------
    RegistryError
        For an unknown key.
    InvalidMaterialError
        For invalid constants.
    """
    if isinstance(value, dict) and "use" not in value and registry is None:
        return material_from_dict(dict(value), label=label)
    return (registry or default_registry()).resolve(value, label=label)
