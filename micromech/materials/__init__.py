"""Constituent materials, the materials registry and the composite specification.

Public names: :class:`Isotropic`, :class:`TransverselyIsotropic`, :class:`Orthotropic`
(:data:`Material` is their union), :class:`Strengths`, :class:`Composite`, :class:`Registry`,
:func:`get_material`, :func:`list_materials`, :func:`load_material`.
"""

from micromech.materials.composite import (
    Composite,
    packing_limit,
    volume_fraction_from_weight,
    weight_fraction_from_volume,
)
from micromech.materials.models import (
    Isotropic,
    Material,
    Orthotropic,
    Strengths,
    TransverselyIsotropic,
    material_from_dict,
)
from micromech.materials.registry import (
    Registry,
    default_registry,
    get_material,
    list_materials,
    load_material,
)

__all__ = [
    "Composite",
    "Isotropic",
    "Material",
    "Orthotropic",
    "Registry",
    "Strengths",
    "TransverselyIsotropic",
    "default_registry",
    "get_material",
    "list_materials",
    "load_material",
    "material_from_dict",
    "packing_limit",
    "volume_fraction_from_weight",
    "weight_fraction_from_volume",
]
