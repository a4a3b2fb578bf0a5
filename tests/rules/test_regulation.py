import datetime as dt
from pathlib import Path

import pytest

from machinecheck.errors import InputError
from machinecheck.rules import regulation as rg

D = dt.date
HP_W = 745.7


DATE = D(2024, 1, 1)


def facts(kw, *, poles=4, phases=3, date=DATE, cls="IE3", kinds=(), movement="new",
          freqs=(50.0,), volts=400.0, exemptions=()):
    return rg.MachineFacts(power_w=kw * 1000, poles=poles, phases=phases,
                           rated_frequencies_hz=freqs, rated_voltage_v=volts, placing_date=date,
                           movement=movement, kinds=frozenset(kinds), efficiency_class=cls,
                           exemptions_claimed=exemptions)


@pytest.fixture(scope="module")
def eu():
    return rg.builtin_pack("EU")


@pytest.fixture(scope="module")
def us():
    return rg.builtin_pack("us")


def test_packs_name_source_and_version(eu, us):
    assert "2019/1781" in eu.source and "2021/341" in eu.source
    assert "10 CFR" in us.source and "88 FR 36066" in us.source
    assert eu.text_version and us.text_version


# [EU 2019/1781 Annex I §1] from 1 July 2021: IE3 for 0.75-1000 kW, IE2 for 0.12-0.75 kW,
# three-phase 2/4/6/8 poles.
@pytest.mark.parametrize("kw,required", [(0.12, "IE2"), (0.55, "IE2"), (0.75, "IE3"),
                                         (11.0, "IE3"), (1000.0, "IE3")])
def test_eu_2021_tier(eu, kw, required):
    f = rg.assess(eu, facts(kw, date=D(2022, 1, 1)))
    assert f.required_class == required
    assert f.applies_from == D(2021, 7, 1)


def test_eu_before_2021_no_requirement_of_this_regulation(eu):
    f = rg.assess(eu, facts(11.0, date=D(2021, 6, 30), cls="IE1"))
    assert f.status == rg.NOT_APPLICABLE
    assert "2021-07-01 IE3" in f.message


def test_eu_outside_scope(eu):
    # [EU 2019/1781 Art. 2(1)(a)]: 0.12-1000 kW, 2-8 poles, 50 V < U <= 1000 V.
    assert rg.assess(eu, facts(1200.0)).status == rg.NOT_APPLICABLE
    assert rg.assess(eu, facts(0.09)).status == rg.NOT_APPLICABLE
    assert rg.assess(eu, facts(11.0, poles=10)).status == rg.NOT_APPLICABLE
    assert rg.assess(eu, facts(11.0, volts=3300)).status == rg.NOT_APPLICABLE


# [EU 2019/1781 Annex I §1] from 1 July 2023: IE4 for 75-200 kW with 2, 4 or 6 poles, not
# brake motors, Ex eb or other explosion-protected motors.
@pytest.mark.parametrize("kw,poles,kinds,required", [
    (75.0, 4, (), "IE4"), (200.0, 2, (), "IE4"), (110.0, 6, (), "IE4"),
    (110.0, 8, (), "IE3"), (250.0, 4, (), "IE3"), (55.0, 4, (), "IE3"),
    (110.0, 4, ("brake",), "IE3"), (110.0, 4, ("ex-other",), "IE3"),
])
def test_eu_2023_ie4_tier(eu, kw, poles, kinds, required):
    f = rg.assess(eu, facts(kw, poles=poles, kinds=kinds, date=D(2023, 7, 1), cls="IE4"))
    assert f.required_class == required
    assert f.status == rg.COMPLIES


def test_eu_ie3_motor_of_110kw_fails_after_july_2023(eu):
    assert rg.assess(eu, facts(110.0, date=D(2023, 6, 30))).status == rg.COMPLIES
    f = rg.assess(eu, facts(110.0, date=D(2023, 7, 1)))
    assert f.status == rg.FAILS
    assert "IE4" in f.message and "Annex I" in f.message


def test_eu_ex_eb_and_single_phase_from_2023(eu):
    # [EU 2019/1781 Annex I §1] from 1 July 2023: IE2 for Ex eb motors 0.12-1000 kW and
    # single-phase motors from 0.12 kW; Ex eb motors are outside the 2021 tier.
    assert rg.assess(eu, facts(110.0, kinds=("ex-eb",), date=D(2022, 1, 1))).status == rg.NOT_APPLICABLE
    f = rg.assess(eu, facts(110.0, kinds=("ex-eb",), date=D(2023, 7, 1), cls="IE2"))
    assert (f.required_class, f.status) == ("IE2", rg.COMPLIES)
    f = rg.assess(eu, facts(0.37, phases=1, date=D(2023, 7, 1), cls="IE1"))
    assert (f.required_class, f.status) == ("IE2", rg.FAILS)
    assert rg.assess(eu, facts(0.37, phases=1, date=D(2022, 1, 1))).status == rg.NOT_APPLICABLE


def test_eu_used_machine_imported_and_moved(eu):
    # [Blue Guide 2022 §2.3]: importing a used motor is placing it on the Union market;
    # moving one within the Union is not.
    f = rg.assess(eu, facts(110.0, movement="imported", date=D(2026, 3, 1), cls="IE3"))
    assert f.status == rg.FAILS
    assert "placing it on the Union market" in f.message
    f = rg.assess(eu, facts(110.0, movement="moved-within", cls="IE1"))
    assert f.status == rg.NOT_APPLICABLE
    assert "not placing it on the market" in f.message


def test_eu_exemption_is_claimed_not_assumed(eu):
    f = rg.assess(eu, facts(11.0, cls="IE1", exemptions=("integrated",)))
    assert f.status == rg.EXEMPT and "Article 2(2)(a)" in f.message
    f = rg.assess(eu, facts(11.0, cls="IE1", exemptions=("replacement",)))
    assert f.status == rg.EXEMPT and "not checked" in f.message
    with pytest.raises(InputError):
        rg.assess(eu, facts(11.0, exemptions=("hobby",)))


def test_eu_class_unknown(eu):
    assert rg.assess(eu, facts(11.0, cls=None)).status == rg.CLASS_UNKNOWN
    assert rg.assess(eu, facts(11.0, cls="NEMA Premium")).status == rg.CLASS_UNKNOWN


# [10 CFR 431.25] NEMA Premium for 1-500 hp from 1 June 2016, 60 Hz polyphase, 2-8 poles.
@pytest.mark.parametrize("kw", [1 * HP_W / 1000, 0.75, 50 * HP_W / 1000, 500 * HP_W / 1000, 375.0])
def test_us_2016_premium(us, kw):
    # A rating in hp and its standard kilowatt equivalent (1 hp / 0.75 kW, 500 hp / 375 kW)
    # are both in scope [10 CFR 431.25].
    f = rg.assess(us, facts(kw, freqs=(60.0,), volts=460, date=D(2020, 1, 1),
                            cls="NEMA Premium"))
    assert (f.required_class, f.status) == ("NEMA Premium", rg.COMPLIES)
    assert f.applies_from == D(2016, 6, 1)
    f = rg.assess(us, facts(kw, freqs=(60.0,), volts=460, date=D(2020, 1, 1), cls="IE2"))
    assert f.status == rg.FAILS


def test_us_scope(us):
    # 50 Hz-only motors, above 600 V, below 1 hp and single-phase are outside §431.25.
    assert rg.assess(us, facts(11.0, freqs=(50.0,), volts=400)).status == rg.NOT_APPLICABLE
    assert rg.assess(us, facts(11.0, freqs=(60.0,), volts=4160)).status == rg.NOT_APPLICABLE
    assert rg.assess(us, facts(0.55, freqs=(60.0,), volts=460)).status == rg.NOT_APPLICABLE
    assert rg.assess(us, facts(11.0, freqs=(50.0, 60.0), volts=460)).required_class == "NEMA Premium"


def test_us_2027_rule_is_flagged_unconfirmed(us):
    # [88 FR 72347] compliance with the 2023 standards on and after 1 June 2027; what they
    # require is from memory, so the verdict is left to the user.
    f = rg.assess(us, facts(150 * HP_W / 1000, freqs=(60.0,), volts=460, date=D(2026, 1, 1),
                            cls="NEMA Premium"))
    assert f.status == rg.COMPLIES
    assert "2027-06-01 IE4" in f.message
    f = rg.assess(us, facts(150 * HP_W / 1000, freqs=(60.0,), volts=460, date=D(2027, 6, 1),
                            cls="NEMA Premium"))
    assert f.status == rg.JUDGEMENT and f.applies_from == D(2027, 6, 1)


def test_us_used_import_is_left_to_the_user(us):
    f = rg.assess(us, facts(11.0, freqs=(60.0,), volts=460, movement="imported", cls="IE3"))
    assert f.status == rg.JUDGEMENT
    assert rg.assess(us, facts(11.0, freqs=(60.0,), volts=460, movement="moved-within",
                               cls="IE1")).status == rg.NOT_APPLICABLE


def test_user_pack(tmp_path: Path):
    text = """
[pack]
region = "XL"
title = "Invented rules"
source = "Invented regulation 1/2030"
text_version = "draft"
applies_to = "sale"
used_import_covered = "no"
used_import = "used imports are not covered"
used_moved = "moves are not covered"
scope_note = "three-phase 1-100 kW"
[classes]
IE2 = 2
IE3 = 3
[[tier]]
id = "xl-1"
clause = "Art. 1"
from = 2030-01-01
required_class = "IE3"
min_kw = 1
max_kw = 100
phases = [3]
"""
    path = tmp_path / "xl.toml"
    path.write_text(text, encoding="utf-8")
    pack = rg.load_pack(path)
    assert rg.assess(pack, facts(11.0, date=D(2030, 1, 1), cls="IE2")).status == rg.FAILS
    assert rg.assess(pack, facts(11.0, movement="imported", cls="IE2")).status == rg.NOT_APPLICABLE
    path.write_text(text.replace('required_class = "IE3"', 'required_class = "IE9"'),
                    encoding="utf-8")
    with pytest.raises(InputError) as err:
        rg.load_pack(path)
    assert "tier[0].required_class" in str(err.value)
    with pytest.raises(InputError):
        rg.builtin_pack("XX")


def test_pack_errors_name_the_key(tmp_path: Path):
    path = tmp_path / "bad.toml"
    path.write_text('[pack]\nregion = "XX"\n', encoding="utf-8")
    with pytest.raises(InputError) as err:
        rg.load_pack(path)
    assert err.value.key == "classes"
    shipped = Path(rg.__file__).parent.parent / "data" / "regulations" / "eu.toml"
    path.write_text(shipped.read_text(encoding="utf-8").replace('region = "EU"', "region = 3"),
                    encoding="utf-8")
    with pytest.raises(InputError) as err:
        rg.load_pack(path)
    assert err.value.key == "pack.region"
    assert "wrong type" in str(err.value)
