"""IEC 60034-30-1 efficiency classes (IE code) of line-operated AC motors.

The nominal minimum efficiencies live in ``machinecheck/data/ie/`` (one CSV per table, each
naming its source, edition and table) and are read once. At 50 Hz the standard gives its limits
as an interpolation formula in log10 of the rated output; at 60 Hz it gives tables only, with the
midpoint rule between two rated outputs.

What is carried (see the data files' headers):

* 50 Hz, IE2-IE4: 2, 4, 6 and 8 poles, 0.12 kW to 1000 kW.
* 50 Hz, IE1: 2, 4 and 6 poles, 0.75 kW to 1000 kW (from memory of the standard).
* 60 Hz, IE2 and IE3: 2, 4 and 6 poles, 0.75 kW to 150 kW (from 0.65 kW by the midpoint rule).
* IE5 is not carried: IEC 60034-30-1:2014 defines IE1-IE4 only; no IE5 values could be
  confirmed from a published edition.

Anything else inside the standard's scope is "not carried" and anything outside it (rated
output below 0.12 kW or above 1000 kW, other pole numbers, other frequencies) is "out of scope":
both give NaN limits, never an extrapolated value.

The class marked on a plate is the motor's class. :func:`check_marked_class` sets the class the
plate efficiency reaches beside the marked one, so that a disagreement can be reported as a
finding of its own without replacing the marking. :func:`meets_class` answers "does this
efficiency reach class X" and uses the nesting of the classes where X itself is not carried.
"""

from __future__ import annotations

import bisect
import csv
import functools
import math
from dataclasses import dataclass
from importlib import resources

from ..errors import DomainError

CLASSES = ("IE1", "IE2", "IE3", "IE4")
POLES = (2, 4, 6, 8)
SCOPE_MIN_W = 120.0  # IEC 60034-30-1:2014 clause 1: rated output from 0.12 kW ...
SCOPE_MAX_W = 1_000_000.0  # ... up to 1000 kW
PLATEAU_FROM_W = 200_000.0  # 50 Hz: the 200 kW value applies from 200 kW up to 1000 kW
_LOW_RANGE_TOP_W = 750.0  # 50 Hz: the 0.12-0.55 kW coefficients below 0.75 kW
_EPS_W = 1e-6
# 60 Hz: the rated output listed below 0.75 kW in the standard's 60 Hz tables (from memory)
_NEXT_BELOW_60HZ_W = 550.0

_COEFFICIENTS_50HZ = "iec60034-30-1_50hz_coefficients.csv"
_TABLE_60HZ = "iec60034-30-1_60hz.csv"

Coefficients = tuple[float, float, float, float]


def _rows(name: str) -> list[dict[str, str]]:
    """Rows of a data file; lines starting with '#' are its header notes."""
    folder = resources.files("machinecheck").joinpath("data").joinpath("ie")
    text = folder.joinpath(name).read_text(encoding="utf-8")
    lines = [line for line in text.splitlines() if line.strip() and not line.startswith("#")]
    return list(csv.DictReader(lines))


@functools.cache
def coefficients_50hz() -> dict[tuple[str, int, bool], Coefficients]:
    """50 Hz interpolation coefficients, keyed by (class, poles, low range).

    ``low range`` is True for the 0.12-0.55 kW set, False for the 0.75-200 kW set.

    Returns
    -------
    dict : (efficiency class, poles, low range) -> (A, B, C, D) [%]

    References
    ----------
    .. [1] IEC 60034-30-1:2014, nominal efficiency limits at 50 Hz and their interpolation.
    .. [2] UK SI 2021/745, Schedule 16, Tables 27 and 28 (as EU 2019/1781, Annex I).
    """
    table: dict[tuple[str, int, bool], Coefficients] = {}
    for row in _rows(_COEFFICIENTS_50HZ):
        key = (row["efficiency_class"], int(row["poles"]), float(row["high_kw"]) < 0.75)
        table[key] = (float(row["a"]), float(row["b"]), float(row["c"]), float(row["d"]))
    return table


@functools.cache
def table_60hz() -> dict[tuple[str, int], tuple[tuple[float, ...], tuple[float, ...]]]:
    """60 Hz nominal minimum efficiencies, keyed by (class, poles).

    Returns
    -------
    dict : (efficiency class, poles) -> (rated outputs [W] ascending, efficiencies [-])

    References
    ----------
    .. [1] IEC 60034-30-1:2014, nominal efficiency limits at 60 Hz.
    .. [2] 42 U.S.C. 6313(b)(1) (IE2 = EPAct levels); 10 CFR 431.25 Table 1 (IE3 = NEMA Premium).
    """
    cells: dict[tuple[str, int], list[tuple[float, float]]] = {}
    for row in _rows(_TABLE_60HZ):
        key = (row["efficiency_class"], int(row["poles"]))
        cells.setdefault(key, []).append((1000.0 * float(row["kw"]),
                                          float(row["efficiency_pct"]) / 100.0))
    out = {}
    for key, pairs in cells.items():
        pairs.sort()
        out[key] = (tuple(p for p, _ in pairs), tuple(e for _, e in pairs))
    return out


def _check_class(efficiency_class: str) -> str:
    name = efficiency_class.strip().upper()
    if name not in CLASSES:
        raise DomainError(f"efficiency class must be one of {', '.join(CLASSES)}, got "
                          f"{efficiency_class!r}")
    return name


def _nominal_frequency(frequency_hz: float) -> int | None:
    for nominal in (50, 60):
        if abs(frequency_hz - nominal) < 0.5:
            return nominal
    return None


def in_scope(power_w: float, poles: int, frequency_hz: float) -> bool:
    """Whether a rating lies inside the scope of IEC 60034-30-1.

    Parameters
    ----------
    power_w : rated output [W]
    poles : number of poles [-]
    frequency_hz : rated frequency [Hz]

    Returns
    -------
    bool : True for 0.12 kW to 1000 kW, 2, 4, 6 or 8 poles, 50 Hz or 60 Hz.

    References
    ----------
    .. [1] IEC 60034-30-1:2014, clause 1 (Scope).
    """
    return (SCOPE_MIN_W - _EPS_W <= power_w <= SCOPE_MAX_W + _EPS_W and poles in POLES
            and _nominal_frequency(frequency_hz) is not None)


def round_to_tenth_percent(efficiency_pct: float) -> float:
    """Round an efficiency in percent to 0.1 %, halves upwards [%]."""
    return math.floor(efficiency_pct * 10.0 + 0.5) / 10.0


def _limit_50hz(name: str, power_w: float, poles: int) -> float:
    p_w = min(power_w, PLATEAU_FROM_W)
    coef = coefficients_50hz().get((name, poles, p_w < _LOW_RANGE_TOP_W - _EPS_W))
    if coef is None:
        return math.nan
    x = math.log10(p_w / 1000.0)
    a, b, c, d = coef
    return round_to_tenth_percent(a * x ** 3 + b * x ** 2 + c * x + d) / 100.0


def _limit_60hz(name: str, power_w: float, poles: int) -> float:
    cell = table_60hz().get((name, poles))
    if cell is None:
        return math.nan
    ratings, values = cell
    if power_w < ratings[0] - _EPS_W:
        # Below the first carried output the midpoint rule still gives its value down to the
        # midpoint with the standard's next lower output (0.55 kW below 0.75 kW): 1 hp plates
        # (745.7 W) take the 0.75 kW value.
        midpoint = (_NEXT_BELOW_60HZ_W + ratings[0]) / 2.0
        return values[0] if power_w >= midpoint - _EPS_W else math.nan
    if power_w > ratings[-1] + _EPS_W:
        return math.nan
    i = bisect.bisect_left(ratings, power_w - _EPS_W)
    if ratings[i] - power_w > _EPS_W:  # between two rated outputs: the midpoint rule
        midpoint = (ratings[i - 1] + ratings[i]) / 2.0
        if power_w < midpoint - _EPS_W:
            i -= 1
    return values[i]


@functools.lru_cache(maxsize=4096)  # the same rating set meets every site
def minimum_efficiency(efficiency_class: str, power_w: float, poles: int,
                       frequency_hz: float) -> float:
    """Nominal minimum full-load efficiency of an IE class [-].

    50 Hz: eta_N [%] = A x^3 + B x^2 + C x + D with x = log10(P_N / 1 kW), rounded to 0.1 %;
    coefficients for 0.12-0.55 kW below 0.75 kW, for 0.75-200 kW from 0.75 kW; from 200 kW up
    to 1000 kW the 200 kW value. At the rated outputs the standard lists, the formula gives its
    table values. 60 Hz: the table value at a listed rated output; between two listed outputs
    the higher output's value at or above their midpoint, the lower output's value below it.

    Parameters
    ----------
    efficiency_class : "IE1", "IE2", "IE3" or "IE4"
    power_w : rated output [W]
    poles : number of poles [-]
    frequency_hz : rated frequency [Hz], 50 or 60

    Returns
    -------
    float : minimum efficiency [-], as a fraction (0.914 for 91.4 %). NaN when the rating is
        outside the scope of IEC 60034-30-1 (see :func:`in_scope`) or the class is not carried
        for it (see the module notes); never extrapolated.

    Raises
    ------
    DomainError : the class is not one of IE1-IE4.

    Notes
    -----
    Between 0.55 kW and 0.75 kW the sources name no coefficient set; the 0.12-0.55 kW set is used
    up to 0.75 kW.

    References
    ----------
    .. [1] IEC 60034-30-1:2014, Ed. 1.0, Rotating electrical machines - Part 30-1: Efficiency
       classes of line operated AC motors (IE code), nominal efficiency limits (50 Hz and 60 Hz
       tables) and their interpolation.
    .. [2] UK SI 2021/745, Schedule 16, Tables 27 and 28 (50 Hz coefficients) and paragraph 5
       (60 Hz midpoint rule); they reproduce Commission Regulation (EU) 2019/1781, Annex I.
    .. [3] 42 U.S.C. 6313(b)(1) and 10 CFR 431.25, Table 1 (the 60 Hz IE2 and IE3 levels).
    """
    name = _check_class(efficiency_class)
    if not in_scope(power_w, poles, frequency_hz):
        return math.nan
    if _nominal_frequency(frequency_hz) == 50:
        return _limit_50hz(name, power_w, poles)
    return _limit_60hz(name, power_w, poles)


@functools.lru_cache(maxsize=4096)  # the same rating set meets every site
def efficiency_class_of(efficiency: float, power_w: float, poles: int,
                        frequency_hz: float) -> str | None:
    """Highest IE class whose nominal minimum the efficiency meets.

    Parameters
    ----------
    efficiency : rated full-load efficiency [-], as a fraction
    power_w : rated output [W]
    poles : number of poles [-]
    frequency_hz : rated frequency [Hz], 50 or 60

    Returns
    -------
    str or None : "IE1" ... "IE4"; None when the efficiency is below IE1, when the rating is
        out of scope, or when the answer would rest on a class not carried for this rating
        (for example IE4 at 60 Hz for a motor that meets IE3).

    References
    ----------
    .. [1] IEC 60034-30-1:2014 (as :func:`minimum_efficiency`).
    """
    highest_met, settled = _class_bounds(efficiency, power_w, poles, frequency_hz)
    return highest_met if settled else None


def _class_status(efficiency: float, power_w: float, poles: int,
                  frequency_hz: float) -> list[bool | None]:
    """Per class IE1..IE4: True met, False missed, None not carried (or out of scope)."""
    status: list[bool | None] = []
    for name in CLASSES:
        limit = minimum_efficiency(name, power_w, poles, frequency_hz)
        status.append(None if math.isnan(limit) else efficiency + 1e-9 >= limit)
    return status


def _class_bounds(efficiency: float, power_w: float, poles: int,
                  frequency_hz: float) -> tuple[str | None, bool]:
    """Highest carried class the efficiency meets, and whether no uncarried class could be higher.

    The classes are nested (each minimum above the one below), so the answer lies between the
    highest carried class met and the lowest carried class missed; it is settled when no class
    in between is uncarried.
    """
    status = _class_status(efficiency, power_w, poles, frequency_hz)
    low = max((i for i, s in enumerate(status) if s is True), default=-1)
    high = min((i for i, s in enumerate(status) if s is False and i > low), default=len(CLASSES))
    settled = all(status[i] is not None for i in range(low + 1, high))
    return (CLASSES[low] if low >= 0 else None), settled


def meets_class(efficiency: float, efficiency_class: str, power_w: float, poles: int,
                frequency_hz: float) -> bool | None:
    """Whether an efficiency reaches an IE class, using the nesting of the classes.

    Where the class's own limit is not carried, the answer still follows when the efficiency
    misses a carried lower class (then it misses this one too) or meets a carried higher class
    (then it meets this one too).

    Parameters
    ----------
    efficiency : rated full-load efficiency [-], as a fraction
    efficiency_class : "IE1" ... "IE4"
    power_w : rated output [W]
    poles : number of poles [-]
    frequency_hz : rated frequency [Hz]

    Returns
    -------
    bool or None : None when it cannot be told (out of scope, or no carried class decides).

    References
    ----------
    .. [1] IEC 60034-30-1:2014 (as :func:`minimum_efficiency`).
    """
    rank = class_rank(efficiency_class) - 1
    status = _class_status(efficiency, power_w, poles, frequency_hz)
    if status[rank] is not None:
        return status[rank]
    if any(s is False for s in status[:rank]):
        return False
    if any(s is True for s in status[rank + 1:]):
        return True
    return None


@dataclass(frozen=True)
class ClassCheck:
    """The marked IE class beside the class the plate efficiency reaches.

    Attributes
    ----------
    marked : class marked on the plate, or None
    computed : class the plate efficiency reaches (:func:`efficiency_class_of`), or None
    at_least : highest carried class the plate efficiency meets, or None; equals ``computed``
        when that is settled, and is a lower bound when a higher class is not carried
    marked_minimum : nominal minimum of the marked class [-]; NaN when unknown
    meets_marked : whether the plate efficiency reaches the marked class (:func:`meets_class`);
        None when it cannot be told
    agrees : whether the class the plate efficiency reaches equals the marked one; False also
        when it is known to lie below or above the marked class without being settled exactly;
        None when it cannot be told
    """

    marked: str | None
    computed: str | None
    at_least: str | None
    marked_minimum: float
    meets_marked: bool | None
    agrees: bool | None


def check_marked_class(marked_class: str | None, efficiency: float | None, power_w: float,
                       poles: int, frequency_hz: float) -> ClassCheck:
    """Compare the marked IE class with the class the plate efficiency reaches.

    The marked class stays the motor's class; this only reports how the plate efficiency
    compares with it.

    Parameters
    ----------
    marked_class : class marked on the plate ("IE1" ... "IE4"), or None
    efficiency : rated full-load efficiency [-], or None when the plate gives none
    power_w : rated output [W]
    poles : number of poles [-]
    frequency_hz : rated frequency [Hz]

    Returns
    -------
    ClassCheck

    References
    ----------
    .. [1] IEC 60034-30-1:2014 (as :func:`minimum_efficiency`).
    """
    marked = _check_class(marked_class) if marked_class is not None else None
    at_least, settled = (_class_bounds(efficiency, power_w, poles, frequency_hz)
                         if efficiency is not None else (None, False))
    computed = at_least if settled else None
    minimum = (minimum_efficiency(marked, power_w, poles, frequency_hz)
               if marked is not None else math.nan)
    meets = (meets_class(efficiency, marked, power_w, poles, frequency_hz)
             if marked is not None and efficiency is not None else None)
    agrees: bool | None = None
    if marked is not None and computed is not None:
        agrees = computed == marked
    elif meets is False or (marked is not None and at_least is not None
                            and class_rank(at_least) > class_rank(marked)):
        agrees = False  # below the marked class, or above it, though not settled exactly
    return ClassCheck(marked, computed, at_least, minimum, meets, agrees)


def class_rank(efficiency_class: str) -> int:
    """Order of a class: IE1 -> 1 ... IE4 -> 4."""
    return CLASSES.index(_check_class(efficiency_class)) + 1
