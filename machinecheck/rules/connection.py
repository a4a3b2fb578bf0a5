"""Connection to make, star-delta starting and locked-rotor current."""

from __future__ import annotations

from ..memo import IdentityMemo


def check(a) -> None:
    if not a.phases_ok:
        return
    c, rating = a.connection, a.rating
    if len(rating.connections) > 1:
        a.add("connection", "info", _connect(c, rating))
    if a.star_delta_possible is True:
        a.add("star-delta", "info",
              "star-delta starting possible: the delta voltage matches the supply")
    elif a.star_delta_possible is False:
        a.add("star-delta", "info",
              "no star-delta starting on this supply: the running connection is not delta at the "
              "supply voltage")
    if a.locked_rotor_current_a is not None:
        low, high = a.locked_rotor_current_a
        band = f"{low:.0f} A" if abs(high - low) < 0.5 else (
            f"{low:.0f}-{high:.0f} A" if high != float("inf") else f"{low:.0f} A or more")
        a.add("locked-rotor-current", "info",
              f"locked-rotor current at the site about {band} ({a.locked_rotor_basis}, scaled by "
              f"k = {a.flux_ratio:.3f}): size starters, generators and voltage dip for it")


#: connection -> (its rating, message): the text is the same at every site
_CONNECT = IdentityMemo()


def _connect(c, rating) -> str:
    kept = _CONNECT.get(c)
    if kept is not None and kept[0] is rating:
        return kept[1]
    others = ", ".join(
        f"{x.name or 'unnamed'} {x.voltage_min_v:g} V" for x in rating.connections if x is not c)
    current = f", {c.current_a:.1f} A rated" if c.current_a else ""
    message = (f"connect {c.name or 'for'} {c.voltage_min_v:g} V{current} (not {others}); set "
               "overloads for this connection's current")
    _CONNECT.put(c, (rating, message))
    return message
