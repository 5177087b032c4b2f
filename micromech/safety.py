"""The caution every report, table and plot carries."""

from __future__ import annotations

__all__ = ["CAUTION"]

#: Printed with every table, report and plot: results feed structural decisions.
CAUTION: str = (
    "Estimates and bounds are not design allowables: qualified test data, the applicable codes "
    "and a licensed engineer decide."
)
