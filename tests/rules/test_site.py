"""rules.site: voltage unbalance, altitude and ambient temperature."""

import pytest

from machinecheck.rules import site
from rules.pairs import by_code, records

NEMA_50HP = {"frequency": "60 Hz", "voltage": "460 V", "power": "50 hp", "speed": "1775 rpm"}


def _found(**fields):
    return by_code(site.check(*records(NEMA_50HP, dict(frequency="60 Hz", voltage="460 V",
                                                       standard="NEMA", **fields))))


def test_unbalance_from_line_voltages_is_derated():
    # 460/467/450 V: average 459, largest deviation 9 V -> 1.96 % [NEMA MG 1-2016 §14.36];
    # derate about 0.95 at 2 % [NEMA MG 1-2016 Fig. 14-1].
    warning = _found(line_voltages=["460 V", "467 V", "450 V"])["voltage-unbalance"]
    assert warning.severity == "warning"
    assert warning.message.startswith("voltage unbalance 1.96 %: derate to 0.95")


@pytest.mark.parametrize(("unbalance", "severity"), [
    ("0.5 %", "info"),     # 1 % or less: no derating [NEMA MG 1-2016 Fig. 14-1]
    ("6 %", "problem"),    # above 5 %: operation not recommended [NEMA MG 1-2016 §14.36]
])
def test_unbalance_bands(unbalance, severity):
    assert _found(unbalance=unbalance)["voltage-unbalance"].severity == severity


def test_altitude_and_ambient_derate():
    # 2000 m and 50 degC -> 0.86 (common practice table, no published source).
    warning = _found(altitude="2000 m", ambient="50 degC")["site-conditions"]
    assert warning.severity == "warning"
    assert warning.message.endswith("derate to 0.86 (common practice table)")


def test_beyond_the_table_is_a_problem():
    # IEC 60034-1 gives no correction above 4000 m: by agreement [IEC 60034-1:2022 cl. 6]
    # (from memory).
    assert _found(altitude="5000 m")["site-conditions"].severity == "problem"


def test_a_rated_site_finds_nothing():
    assert _found() == {}
