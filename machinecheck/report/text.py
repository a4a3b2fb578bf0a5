"""Text shown on a terminal: user strings made visible, and a plain-ASCII fallback.

A catalog's keys and values can hold control characters and escape sequences. Written raw to a
terminal they would move the cursor, change colours or retitle the window, so every
user-supplied string passes through :func:`visible` before it reaches a terminal. Files keep
the raw value, escaped as their format requires.
"""

from __future__ import annotations

import codecs

#: Characters a console without Unicode cannot encode, and their plain-ASCII spelling.
ASCII_SPELLING = {
    "±": "+/-", "×": "x", "°": "deg", "µ": "u", "²": "2", "³": "3", "·": ".", "…": "...",
    "–": "-", "—": "-", "‘": "'", "’": "'", "“": '"', "”": '"', "✗": "x", "✓": "v",
    "≤": "<=", "≥": ">=", "≈": "~", "→": "->", "←": "<-", "Ω": "ohm", "η": "eta",
    "\u00a0": " ", "\u2009": " ", "\u202f": " ",
    # rich's table borders
    "─": "-", "━": "-", "│": "|", "┃": "|", "┌": "+", "┐": "+", "└": "+", "┘": "+",
    "├": "+", "┤": "+", "┬": "+", "┴": "+", "┼": "+", "╭": "+", "╮": "+", "╰": "+", "╯": "+",
    "┏": "+", "┓": "+", "┗": "+", "┛": "+", "┡": "+", "┩": "+", "╇": "+", "┳": "+", "┻": "+",
    "╋": "+", "┣": "+", "┫": "+", "═": "=", "║": "|", "╞": "+", "╡": "+", "╪": "+",
}

#: The codec error handler that spells what an encoding lacks in plain ASCII (else "?").
ASCII_FALLBACK = "machinecheck-ascii"


def _spell(error: UnicodeError) -> tuple[str, int]:
    if not isinstance(error, UnicodeEncodeError):
        raise error
    piece = error.object[error.start:error.end]
    return "".join(ASCII_SPELLING.get(ch, "?") for ch in piece), error.end


codecs.register_error(ASCII_FALLBACK, _spell)


def visible(text: object, *, keep_newlines: bool = False) -> str:
    """``text`` with every control, format or escape character shown as a ``\\x..`` escape.

    Tabs and (when ``keep_newlines``) line feeds are kept; everything else that
    :meth:`str.isprintable` refuses (C0 and C1 controls, ESC, DEL, bidirectional overrides,
    line and paragraph separators) is replaced by its Python escape, so it is seen, not obeyed.
    """
    value = str(text)
    if value.isprintable():
        return value
    out = []
    for ch in value:
        if ch.isprintable() or ch == "\t" or (keep_newlines and ch == "\n"):
            out.append(ch)
        else:
            code = ord(ch)
            out.append(f"\\x{code:02x}" if code < 0x100 else
                       f"\\u{code:04x}" if code < 0x10000 else f"\\U{code:08x}")
    return "".join(out)


def visible_lines(text: str) -> str:
    """A rendered document made safe for a terminal: line breaks kept, the rest visible."""
    return visible(text, keep_newlines=True)
