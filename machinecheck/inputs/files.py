"""Reading input files: a size cap, special files, and the text encodings people save.

Every input is read through :func:`read_bytes`, which stops at :data:`MAX_INPUT_BYTES`: 64 MiB,
about 200,000 machines of TOML in one file (a larger fleet is split into several files). So an
endless input (``/dev/zero``, a pipe) is never read without bound.
"""

from __future__ import annotations

import os

from ..errors import InputError

#: Largest input file read, in bytes (64 MiB). Documented in docs/format.md.
MAX_INPUT_BYTES = 64 * 1024 * 1024
_CHUNK = 1024 * 1024

BOMS = ((b"\xef\xbb\xbf", "utf-8-sig", "UTF-8"), (b"\xff\xfe", "utf-16", "UTF-16"),
        (b"\xfe\xff", "utf-16", "UTF-16"))


def read_bytes(path: str | os.PathLike[str], limit: int = MAX_INPUT_BYTES) -> bytes:
    """The bytes of a file, at most ``limit``; every failure is an InputError naming the file."""
    name = os.fspath(path)
    if os.path.isdir(name):
        raise InputError("is a directory, expected a file", file=name)
    chunks: list[bytes] = []
    size = 0
    try:
        with open(name, "rb") as handle:
            while True:
                chunk = handle.read(min(_CHUNK, limit + 1 - size))
                if not chunk:
                    break
                chunks.append(chunk)
                size += len(chunk)
                if size > limit:
                    raise InputError(f"is larger than the input limit of {limit // 2 ** 20} MiB "
                                     "(an endless or wrong file?); split a larger catalog into "
                                     "several files", file=name)
    except FileNotFoundError:
        raise InputError("no such file", file=name) from None
    except PermissionError:
        raise InputError("cannot be read (permission denied)", file=name) from None
    except MemoryError:
        raise InputError("is too large to read into memory", file=name) from None
    except OSError as exc:
        raise InputError(f"cannot be read ({exc.strerror or exc})", file=name) from None
    return b"".join(chunks)


def _line_of(raw: bytes, position: int) -> int:
    return raw[:position].count(b"\n") + 1


def looks_utf16(raw: bytes) -> bool:
    """UTF-16 text without a byte-order mark: most of one byte column is zero."""
    sample = raw[:4096]
    if len(sample) < 4:
        return False
    even, odd = sample[0::2], sample[1::2]
    return max(even.count(0) / len(even), odd.count(0) / len(odd)) > 0.4


def decode_utf8(raw: bytes, name: str, what: str) -> str:
    """Text that must be UTF-8 (TOML); other encodings are named in the message."""
    for bom, _codec, label in BOMS[1:]:
        if raw.startswith(bom):
            raise InputError(f"is {label} text; {what} files must be UTF-8 (save it as UTF-8)",
                             file=name)
    if looks_utf16(raw):
        raise InputError(f"is UTF-16 text without a byte-order mark; {what} files must be UTF-8 "
                         "(save it as UTF-8)", file=name)
    if b"\x00" in raw:
        raise InputError(f"is a binary file, expected {what} text", file=name)
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError("is not UTF-8 text (save it as UTF-8)", file=name,
                         line=_line_of(raw, exc.start)) from None


def decode_any(raw: bytes, name: str) -> tuple[str, str]:
    """Text of a spreadsheet export: UTF-8 (with or without BOM), UTF-16 with BOM, or cp1252.

    Returns (text, encoding name). Failures name the encoding tried and the line.
    """
    for bom, codec, label in BOMS:
        if raw.startswith(bom):
            try:
                return raw.decode(codec), label + (" with byte-order mark" if codec != "utf-16"
                                                   else "")
            except UnicodeDecodeError as exc:
                raise InputError(f"starts with a {label} byte-order mark but is not {label} "
                                 f"text (byte {exc.start})", file=name) from None
    if looks_utf16(raw):
        raise InputError("is UTF-16 text without a byte-order mark: save it as UTF-8, or as "
                         "UTF-16 with a byte-order mark (\"Unicode text\")", file=name)
    if b"\x00" in raw:
        raise InputError("is a binary file, expected CSV text", file=name,
                         line=_line_of(raw, raw.index(b"\x00")))
    try:
        return raw.decode("utf-8"), "UTF-8"
    except UnicodeDecodeError:
        pass
    try:
        return raw.decode("cp1252"), "Windows-1252 (cp1252)"
    except UnicodeDecodeError as exc:
        raise InputError("is neither UTF-8 nor Windows-1252 (cp1252) text: save it as UTF-8",
                         file=name, line=_line_of(raw, exc.start)) from None
