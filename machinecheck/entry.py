"""The ``machinecheck`` command: plain lookups answered at once, everything else through click.

A commissioning engineer's lookup (``machinecheck speed --poles 4 --frequency 50``) should cost
little more than starting Python; importing click alone costs about 30 ms, three times the
interpreter. So a lookup whose options are all plain ``--name value`` pairs of that command is
answered here; anything else (help, a misspelt option, a bad value) goes to the click commands,
which report it as usual.
"""

from __future__ import annotations

import os
import sys

#: command -> {option: (parameter name, type)}; required options of each command.
LOOKUPS = {
    "speed": {"--poles": ("poles", int), "--frequency": ("frequency", str),
              "--rated-speed": ("rated_speed", str), "--rated-frequency": ("rated_frequency", str)},
    "poles": {"--speed": ("speed_text", str), "--frequency": ("frequency", str)},
    "current": {"--power": ("power", str), "--voltage": ("voltage", str),
                "--phases": ("phases", str), "--efficiency": ("efficiency", str),
                "--power-factor": ("power_factor", str)},
}
REQUIRED = {"speed": ("frequency",), "poles": ("speed_text", "frequency"),
            "current": ("power", "voltage")}


def plain_options(command: str, args: list[str]) -> dict | None:
    """The options of a plain lookup as keyword arguments, or None to leave it to click."""
    known = LOOKUPS[command]
    options: dict = {}
    position = 0
    while position < len(args):
        token = args[position]
        name, _, value = token.partition("=")
        if name not in known:
            return None
        if not value:
            if position + 1 >= len(args) or args[position + 1].startswith("--"):
                return None
            value = args[position + 1]
            position += 1
        position += 1
        parameter, kind = known[name]
        if parameter in options:
            return None
        if kind is int:
            try:
                value = int(value)
            except ValueError:
                return None
        options[parameter] = value
    if any(required not in options for required in REQUIRED[command]):
        return None
    if options.get("phases", "3") not in ("1", "3"):
        return None
    return options


def main() -> None:
    args = sys.argv[1:]
    if args and args[0] in LOOKUPS:
        options = plain_options(args[0], args[1:])
        if options is not None:
            from . import lookups
            from .errors import MachinecheckError

            function = {"speed": lookups.speed_lines, "poles": lookups.poles_lines,
                        "current": lookups.current_lines}[args[0]]
            try:
                lines = function(**options)
            except (MachinecheckError, TypeError, ValueError):
                pass  # click reports it, with the usual wording and exit status
            else:
                sys.stdout.write("".join(line + "\n" for line in lines))
                return
    from .cli import main as click_main

    click_main(prog_name="machinecheck")


def run() -> None:
    """The console script: :func:`main`, then out without the interpreter's teardown.

    Once the report is written and both streams are flushed, the process holds nothing that
    needs finalising; after a fleet run the final collection and module teardown otherwise
    keep the user waiting about 0.1 s. Where a stream cannot be flushed (a closed pipe), the
    usual exit reports it.
    """
    try:
        main()
        code = 0
    except SystemExit as exc:
        code = exc.code
    if code is None:
        code = 0
    elif not isinstance(code, int):
        sys.stderr.write(f"{code}\n")
        code = 1
    try:
        sys.stdout.flush()
        sys.stderr.flush()
    except (OSError, ValueError):
        sys.exit(code)
    os._exit(code)
