"""Regional efficiency regulations for motors: which rule applies, from when, and the verdict.

A region's rules travel as a data pack (TOML) naming its source, the version of the text and
its dates; the packs shipped are ``eu`` (Regulation (EU) 2019/1781 as amended by (EU) 2021/341)
and ``us`` (10 CFR 431 Subpart B). A user adds a region with a file of the same keys, read by
:func:`load_pack`: ``[pack]`` (source, text version, how used machines are treated, scope),
``[classes]`` (class name = rank), ``[[tier]]`` (a class asked of a power, pole, phase,
frequency and kind range from a date; ``confirmed = false`` leaves the verdict to the user)
and ``[[exemption]]`` (claimed by the user, never assumed). docs/regulation-packs.md lists
every key. Where several tiers in force match a machine, the one asking the highest class
applies (a later tier raises the class for part of an earlier tier's range).
"""

from __future__ import annotations

import datetime as dt
import math
import sys
from collections.abc import Callable
from dataclasses import dataclass
from importlib import resources
from pathlib import Path
from typing import Any, cast

from ..errors import InputError

#: The project's error type, seen with its signature (errors.py is not annotated yet).
_input_error = cast(Callable[..., InputError], InputError)

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover - exercised on Python 3.10 only
    import tomli as tomllib  # type: ignore[import-not-found, unused-ignore]

BUILTIN_REGIONS = ("eu", "us")
MOVEMENTS = ("new", "imported", "moved-within")
KINDS = ("brake", "ex-eb", "ex-other", "fire-pump")

#: Statuses of a finding, from the user's point of view.
COMPLIES = "complies"
FAILS = "does-not-comply"
NOT_APPLICABLE = "not-applicable"
EXEMPT = "exempt-claimed"
JUDGEMENT = "user-judgement"
CLASS_UNKNOWN = "class-unknown"


@dataclass(frozen=True, slots=True)
class Tier:
    """One requirement of a pack: a class asked of a range of motors from a date."""

    id: str
    clause: str
    from_date: dt.date
    required_class: str
    min_kw: float
    max_kw: float
    min_inclusive: bool = True
    max_inclusive: bool = True
    phases: tuple[int, ...] = ()
    poles: tuple[int, ...] = ()
    frequencies_hz: tuple[float, ...] = ()
    kinds_excluded: tuple[str, ...] = ()
    kinds_only: tuple[str, ...] = ()
    confirmed: bool = True


@dataclass(frozen=True, slots=True)
class Exemption:
    """An exemption a user may claim for a machine."""

    id: str
    clause: str
    text: str
    confirmed: bool


@dataclass(frozen=True, slots=True)
class Pack:
    """A region's efficiency rules as read from its data file."""

    region: str
    title: str
    source: str
    text_version: str
    applies_to: str
    used_import_covered: str
    used_import: str
    used_moved: str
    scope_note: str
    classes: dict[str, int]
    tiers: tuple[Tier, ...]
    exemptions: tuple[Exemption, ...]
    file: str
    min_voltage_v: float | None = None
    min_voltage_inclusive: bool = True
    max_voltage_v: float | None = None

    def rank(self, efficiency_class: str) -> int | None:
        """Rank of a class name in this pack, or None when the pack does not know it."""
        wanted = efficiency_class.strip().casefold()
        for name, rank in self.classes.items():
            if name.casefold() == wanted:
                return rank
        return None


@dataclass(frozen=True, slots=True)
class MachineFacts:
    """What the regulation check needs to know of a machine, in SI units.

    Parameters
    ----------
    power_w : rated output [W]
    poles : number of poles [-]
    phases : 1 or 3
    rated_frequencies_hz : the frequencies the plate is rated for [Hz]
    rated_voltage_v : highest rated voltage on the plate [V]
    placing_date : date the machine is (or was) placed on this market: manufacture or import
    movement : "new" (bought new for this market), "imported" (a used machine brought in from
        outside the market) or "moved-within" (a used machine moved inside the market)
    kinds : special kinds among :data:`KINDS` ("brake", "ex-eb", "ex-other", "fire-pump")
    efficiency_class : the class marked on the plate, or None
    exemptions_claimed : ids of pack exemptions the user claims for this machine
    """

    power_w: float
    poles: int
    phases: int
    rated_frequencies_hz: tuple[float, ...]
    rated_voltage_v: float
    placing_date: dt.date
    movement: str = "new"
    kinds: frozenset[str] = frozenset()
    efficiency_class: str | None = None
    exemptions_claimed: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True)
class RegulationFinding:
    """Which rule applies to a machine, from when, and whether it complies."""

    status: str
    message: str
    region: str
    source: str
    tier: Tier | None = None
    required_class: str | None = None
    applies_from: dt.date | None = None
    upcoming: tuple[Tier, ...] = ()


# --- reading a pack ---------------------------------------------------------------------------

def _need(table: dict[str, Any], key: str, kind: type | tuple[type, ...], file: str,
          where: str) -> Any:
    path = f"{where}.{key}" if where else key
    if key not in table:
        raise _input_error(f"missing key {key!r}", file=file, key=path)
    value = table[key]
    if (isinstance(value, bool) and kind is not bool) or not isinstance(value, kind):
        raise _input_error(f"{key!r} has the wrong type ({type(value).__name__})", file=file,
                           key=path)
    return value


def _opt(table: dict[str, Any], key: str, kind: type | tuple[type, ...], default: Any,
         file: str, where: str) -> Any:
    return _need(table, key, kind, file, where) if key in table else default


def _tier(entry: dict[str, Any], index: int, file: str, classes: dict[str, int]) -> Tier:
    where = f"tier[{index}]"
    min_kw = float(_need(entry, "min_kw", (int, float), file, where))
    max_kw = float(_need(entry, "max_kw", (int, float), file, where))
    if not (0.0 <= min_kw <= max_kw and math.isfinite(max_kw)):
        raise _input_error("min_kw must be 0 or more and not above max_kw", file=file, key=where)
    required = str(_need(entry, "required_class", str, file, where))
    if required.casefold() not in {c.casefold() for c in classes}:
        raise _input_error(f"required_class {required!r} is not in [classes]", file=file,
                         key=f"{where}.required_class")
    from_date = _need(entry, "from", dt.date, file, where)
    if isinstance(from_date, dt.datetime):
        raise _input_error("'from' must be a date without a time", file=file, key=f"{where}.from")
    return Tier(
        id=str(_need(entry, "id", str, file, where)),
        clause=str(_need(entry, "clause", str, file, where)),
        from_date=from_date,
        required_class=required,
        min_kw=min_kw,
        max_kw=max_kw,
        min_inclusive=bool(_opt(entry, "min_inclusive", bool, True, file, where)),
        max_inclusive=bool(_opt(entry, "max_inclusive", bool, True, file, where)),
        phases=tuple(int(p) for p in _opt(entry, "phases", list, [], file, where)),
        poles=tuple(int(p) for p in _opt(entry, "poles", list, [], file, where)),
        frequencies_hz=tuple(float(f) for f in _opt(entry, "frequencies_hz", list, [], file, where)),
        kinds_excluded=tuple(str(k) for k in _opt(entry, "kinds_excluded", list, [], file, where)),
        kinds_only=tuple(str(k) for k in _opt(entry, "kinds_only", list, [], file, where)),
        confirmed=bool(_opt(entry, "confirmed", bool, True, file, where)),
    )


def parse_pack(text: str, file: str) -> Pack:
    """Read a pack from TOML text; a wrong or missing key raises :class:`InputError`."""
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise _input_error(f"TOML syntax error: {exc}", file=file) from None
    head = _need(data, "pack", dict, file, "")
    classes_raw = _need(data, "classes", dict, file, "")
    classes: dict[str, int] = {}
    for name, rank in classes_raw.items():
        if isinstance(rank, bool) or not isinstance(rank, int):
            raise _input_error("class ranks must be integers", file=file, key=f"classes.{name}")
        classes[str(name)] = rank
    covered = str(_need(head, "used_import_covered", str, file, "pack"))
    if covered not in ("yes", "no", "unclear"):
        raise _input_error("used_import_covered must be yes, no or unclear", file=file,
                         key="pack.used_import_covered")
    tiers = tuple(_tier(entry, i, file, classes)
                  for i, entry in enumerate(_opt(data, "tier", list, [], file, "")))
    exemptions = tuple(
        Exemption(id=str(_need(e, "id", str, file, f"exemption[{i}]")),
                  clause=str(_need(e, "clause", str, file, f"exemption[{i}]")),
                  text=str(_need(e, "text", str, file, f"exemption[{i}]")),
                  confirmed=bool(_opt(e, "confirmed", bool, True, file, f"exemption[{i}]")))
        for i, e in enumerate(_opt(data, "exemption", list, [], file, "")))
    min_v = _opt(head, "min_voltage_v", (int, float), None, file, "pack")
    max_v = _opt(head, "max_voltage_v", (int, float), None, file, "pack")
    return Pack(
        region=str(_need(head, "region", str, file, "pack")),
        title=str(_need(head, "title", str, file, "pack")),
        source=str(_need(head, "source", str, file, "pack")),
        text_version=str(_need(head, "text_version", str, file, "pack")),
        applies_to=str(_need(head, "applies_to", str, file, "pack")),
        used_import_covered=covered,
        used_import=str(_need(head, "used_import", str, file, "pack")),
        used_moved=str(_need(head, "used_moved", str, file, "pack")),
        scope_note=str(_need(head, "scope_note", str, file, "pack")),
        classes=classes,
        tiers=tiers,
        exemptions=exemptions,
        file=file,
        min_voltage_v=None if min_v is None else float(min_v),
        min_voltage_inclusive=bool(_opt(head, "min_voltage_inclusive", bool, True, file, "pack")),
        max_voltage_v=None if max_v is None else float(max_v),
    )


def load_pack(path: str | Path) -> Pack:
    """Read a user's pack from a file (same keys as the shipped packs)."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8-sig")
    except OSError as exc:
        raise _input_error(f"cannot read the pack: {exc.strerror}", file=str(p)) from None
    return parse_pack(text, str(p))


def builtin_pack(region: str) -> Pack:
    """The pack shipped for ``region`` ("EU" or "US", any case)."""
    name = region.strip().lower()
    if name not in BUILTIN_REGIONS:
        raise _input_error(f"no efficiency pack for region {region!r}; shipped: "
                         f"{', '.join(r.upper() for r in BUILTIN_REGIONS)}, or give a pack file",
                         key="region")
    folder = resources.files("machinecheck").joinpath("data").joinpath("regulations")
    resource = folder.joinpath(f"{name}.toml")
    return parse_pack(resource.read_text(encoding="utf-8"), f"{name}.toml")


# --- the check --------------------------------------------------------------------------------

def _in_range(value: float, low: float, high: float, low_in: bool, high_in: bool) -> bool:
    eps = 1e-9 * max(1.0, abs(high))
    above = value >= low - eps if low_in else value > low + eps
    below = value <= high + eps if high_in else value < high - eps
    return above and below


def _matches(tier: Tier, m: MachineFacts) -> bool:
    kw = m.power_w / 1000.0
    if not _in_range(kw, tier.min_kw, tier.max_kw, tier.min_inclusive, tier.max_inclusive):
        return False
    if tier.phases and m.phases not in tier.phases:
        return False
    if tier.poles and m.poles not in tier.poles:
        return False
    if tier.frequencies_hz and not any(abs(f - g) < 0.5 for f in m.rated_frequencies_hz
                                       for g in tier.frequencies_hz):
        return False
    if any(k in m.kinds for k in tier.kinds_excluded):
        return False
    return not (tier.kinds_only and not any(k in m.kinds for k in tier.kinds_only))


def _in_voltage_scope(pack: Pack, m: MachineFacts) -> bool:
    v = m.rated_voltage_v
    if pack.min_voltage_v is not None:
        if pack.min_voltage_inclusive and v < pack.min_voltage_v:
            return False
        if not pack.min_voltage_inclusive and v <= pack.min_voltage_v:
            return False
    return not (pack.max_voltage_v is not None and v > pack.max_voltage_v)


def _check_facts(m: MachineFacts) -> None:
    if m.movement not in MOVEMENTS:
        raise _input_error(f"movement must be one of {', '.join(MOVEMENTS)}, got {m.movement!r}",
                         key="movement")
    unknown = sorted(k for k in m.kinds if k not in KINDS)
    if unknown:
        raise _input_error(f"unknown motor kind {unknown[0]!r}; known: {', '.join(KINDS)}",
                         key="kinds")
    if not (m.power_w > 0 and math.isfinite(m.power_w)):
        raise _input_error(f"power must be positive, got {m.power_w!r} W", key="power")


def assess(pack: Pack, m: MachineFacts) -> RegulationFinding:
    """Which of the pack's rules applies to the machine, from which date, and the verdict.

    Parameters
    ----------
    pack : the region's rules (:func:`builtin_pack` or :func:`load_pack`)
    m : the machine's facts

    Returns
    -------
    RegulationFinding : status is one of "complies", "does-not-comply", "not-applicable",
        "exempt-claimed", "user-judgement" (the text is not explicit, or the tier was not
        confirmed against it) and "class-unknown" (no class marked, or one the pack does not
        know); the message says why, with the clause.

    References
    ----------
    .. [1] Regulation (EU) 2019/1781 as amended by (EU) 2021/341, Articles 1 and 2, Annex I.
    .. [2] 10 CFR 431.25; 79 FR 30933 (2014); 88 FR 36066 and 88 FR 72347 (2023).
    .. [3] The "Blue Guide" on the implementation of EU product rules 2022 (2022/C 247/01),
       section 2.3 (placing on the market; used products imported).
    """
    _check_facts(m)

    def finding(status: str, message: str, **kw: Any) -> RegulationFinding:
        return RegulationFinding(status=status, message=message, region=pack.region,
                                 source=pack.source, **kw)

    if m.movement == "moved-within":
        return finding(NOT_APPLICABLE, pack.used_moved)
    if m.movement == "imported" and pack.used_import_covered == "no":
        return finding(NOT_APPLICABLE, pack.used_import)
    claimed = [e for e in pack.exemptions if e.id in m.exemptions_claimed]
    unknown = [c for c in m.exemptions_claimed if c not in {e.id for e in pack.exemptions}]
    if unknown:
        raise _input_error(f"exemption {unknown[0]!r} is not in the {pack.region} pack; known: "
                         f"{', '.join(e.id for e in pack.exemptions) or 'none'}", key="exemptions")
    if claimed:
        e = claimed[0]
        note = "" if e.confirmed else " (the wording of this exemption was not checked against the text)"
        return finding(EXEMPT, f"exemption claimed: {e.text} ({e.clause}){note}; its conditions "
                       "are for the user to confirm")
    if not _in_voltage_scope(pack, m):
        return finding(NOT_APPLICABLE, f"rated voltage {m.rated_voltage_v:g} V is outside the "
                       f"scope: {pack.scope_note}")
    matching = [t for t in pack.tiers if _matches(t, m)]
    in_force = [t for t in matching if t.from_date <= m.placing_date]
    upcoming = tuple(sorted((t for t in matching if t.from_date > m.placing_date),
                            key=lambda t: t.from_date))
    later = "".join(f"; from {t.from_date.isoformat()} {t.required_class} ({t.clause})"
                    for t in upcoming)
    if not in_force:
        return finding(NOT_APPLICABLE, f"no requirement of the {pack.region} pack applies to this "
                       f"machine on {m.placing_date.isoformat()} ({pack.scope_note}){later}",
                       upcoming=upcoming)

    def strength(t: Tier) -> tuple[int, dt.date]:
        return pack.rank(t.required_class) or 0, t.from_date

    tier = max(in_force, key=strength)
    head = (f"{pack.region}: {tier.required_class} required from {tier.from_date.isoformat()} "
            f"({tier.clause}){later}")
    kw: dict[str, Any] = {"tier": tier, "required_class": tier.required_class,
                          "applies_from": tier.from_date, "upcoming": upcoming}
    caveats = []
    if m.movement == "imported":
        caveats.append(pack.used_import)
    if not tier.confirmed:
        caveats.append("this tier's content was not confirmed against the text: check "
                       f"{tier.clause} before relying on it")
    tail = "".join(f"; {c}" for c in caveats)
    if m.efficiency_class is None:
        return finding(CLASS_UNKNOWN, f"{head}; the plate marks no efficiency class{tail}", **kw)
    have = pack.rank(m.efficiency_class)
    if have is None:
        return finding(CLASS_UNKNOWN, f"{head}; class {m.efficiency_class!r} is not one the pack "
                       f"knows ({', '.join(pack.classes)}){tail}", **kw)
    ok = have >= (pack.rank(tier.required_class) or 0)
    verdict = f"marked {m.efficiency_class}: " + ("meets it" if ok else "below it")
    judgement = (not tier.confirmed
                 or (m.movement == "imported" and pack.used_import_covered != "yes"))
    if judgement:
        return finding(JUDGEMENT, f"{head}; {verdict}{tail}; the judgement is the user's", **kw)
    return finding(COMPLIES if ok else FAILS, f"{head}; {verdict}{tail}", **kw)
