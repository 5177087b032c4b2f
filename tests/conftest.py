"""Test-wide settings: property-based tests are deterministic in CI and never time-bound.

The machines are shared and noisy, so hypothesis runs without a per-example deadline and without
the too-slow health check; under CI (``CI`` set) it also derandomises, so a red run can be
reproduced exactly and a green run is not a matter of luck.
"""

from __future__ import annotations

import os

from hypothesis import HealthCheck, settings

settings.register_profile(
    "micromech",
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow],
    derandomize=bool(os.environ.get("CI")),
    print_blob=True,
)
settings.load_profile("micromech")
