"""The command group: ``machinecheck`` and its commands, each in its own module.

Commands parse options, call the library and hand the results to a renderer; how a command
ends (errors, signals, closed streams) is :mod:`machinecheck.cli.guard`'s business, and
:mod:`machinecheck.cli.output` is the only module that writes a report.
"""

from __future__ import annotations

import sys
from typing import Any

import click

from .. import __version__
from ..report.text import visible
from .check import check
from .files import convert, schema, validate
from .guard import run_guarded, say
from .lookups import current, poles, speed
from .remedy import remedy
from .sources import demo_path
from .supply_lookups import dip, drop, protect

__all__ = ["main", "demo_path", "_demo_path"]

#: Kept for callers of the earlier name.
_demo_path = demo_path


class Group(click.Group):
    """The command group; every command runs under :func:`run_guarded`, and a usage error
    shows the user's text made visible."""

    def invoke(self, ctx: click.Context) -> Any:
        return run_guarded(ctx, self)

    def main(self, args: Any = None, prog_name: str | None = None,
             complete_var: str | None = None, standalone_mode: bool = True,
             **extra: Any) -> Any:
        if not standalone_mode:
            return super().main(args, prog_name, complete_var, False, **extra)
        try:
            status = super().main(args, prog_name, complete_var, False, **extra)
        except click.ClickException as exc:
            show_usage_error(exc)
            sys.exit(exc.exit_code)
        except click.Abort:
            say("Aborted.")
            sys.exit(1)
        sys.exit(status if isinstance(status, int) else 0)


def show_usage_error(exc: click.ClickException) -> None:
    """Click's usage-error text, with the user's strings made visible."""
    context = getattr(exc, "ctx", None)
    if isinstance(context, click.Context):
        say(visible(context.get_usage()))
        say(f"Try '{visible(context.command_path)} -h' for help.\n")
    say(f"Error: {visible(exc.format_message())}")


def _show_version(ctx: click.Context, _param: click.Parameter, value: bool) -> None:
    if value and not ctx.resilient_parsing:
        click.echo(f"machinecheck, version {__version__}")
        ctx.exit()


@click.group(cls=Group, context_settings={"help_option_names": ["-h", "--help"],
                                          "max_content_width": 100})
@click.option("--version", is_flag=True, expose_value=False, is_eager=True,
              callback=_show_version, help="Show the version and exit.")
def main() -> None:
    """Check motor and generator nameplates against site supplies.

    Run `machinecheck check` with no arguments for the bundled demo fleet and sites.
    """


for _command in (check, speed, poles, current, validate, convert, schema, remedy):
    main.add_command(_command)
main.add_command(dip)
main.add_command(drop)
main.add_command(protect)
