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
    click.echo(json.dumps(obj, indent=2, allow_nan=False, default=_json_default))


def _json_default(o: Any) -> Any:
    import numpy as np

    if isinstance(o, np.ndarray):
        return o.tolist()
    if isinstance(o, np.generic):
        return o.item()
    raise TypeError(f"not JSON serialisable: {type(o).__name__}")


@click.group(cls=_Group, context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="micromech")
def cli() -> None:
    """Size fibre composites before an RVE model, and check its results after.

    Estimates and bounds are not design allowables: qualified test data, the applicable codes
    and a licensed engineer decide.
    """


# --- materials (registry) -------------------------------------------------------------------


# --- estimate (homogenize) ------------------------------------------------------------------


# --- laminate -------------------------------------------------------------------------------


# --- rve geometry ---------------------------------------------------------------------------


# --- size (design) --------------------------------------------------------------------------


# --- check (rve results) --------------------------------------------------------------------


# --- demo -----------------------------------------------------------------------------------


def main(argv: list[str] | None = None) -> None:
    """Entry point of the console script."""
    cli.main(args=argv, prog_name="micromech")


if __name__ == "__main__":  # pragma: no cover
    main(sys.argv[1:])
