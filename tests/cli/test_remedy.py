import json

from click.testing import CliRunner

from machinecheck.cli.main import _demo_path, main


def run(*args):
    return CliRunner().invoke(main, list(args))


def _remedy_lines(output):
    return [line for line in output.splitlines() if line[:1].isdigit()]


def test_remedy_lists_every_option_ranked_with_the_caution():
    result = run("remedy", "F-210", "--site", "copperleigh")
    assert result.exit_code == 0, result.output
    assert "invented" in result.output.splitlines()[0]
    assert "F-210 on copperleigh: incompatible" in result.output
    lines = _remedy_lines(result.output)
    # a re-checked compatible remedy comes first
    assert lines[0].endswith("re-checked: compatible")
    assert any(" drive:" in line for line in lines)
    assert "insulation resistance and polarisation index per IEEE Std 43" in result.output
    assert "de-energise and lock out" in result.output.splitlines()[-1]


def test_priority_running_cost_puts_the_buck_boost_before_the_transformer():
    # C-330 (230 V low connection) on the 208 V site: both correct the voltage; a buck-boost
    # unit passes only the correction's share through its core (Chapman 5th ed. §2.9).
    args = ("remedy", "C-330", "--site", "fenwick-annex")
    by_cost = _remedy_lines(run(*args, "--priority", "running-cost").output)
    kinds = [line.split(":")[0].split(". ")[1] for line in by_cost]
    assert kinds.index("buck-boost") < kinds.index("transformer")
    assert _remedy_lines(run(*args).output)[0].endswith("compatible")


def test_remedy_with_files_and_a_compatible_pair():
    result = run("remedy", "C-330", _demo_path("fleet.toml"), "--sites", _demo_path("sites.toml"),
                 "--site", "copperleigh")
    assert result.exit_code == 0, result.output
    assert "no remedy needed" in result.output
    assert "invented" not in result.output.splitlines()[0]


def test_unknown_machine_or_priority_is_bad_input():
    result = run("remedy", "NOPE", "--site", "copperleigh")
    assert result.exit_code == 2
    assert "NOPE" in result.output
    assert run("remedy", "F-210", "--site", "copperleigh", "--priority", "price").exit_code == 2


def test_check_json_carries_remedies_and_regulation():
    result = run("check", "--format", "json")
    results = json.loads(result.output)["results"]
    for r in results:
        assert list(r)[-2:] == ["remedies", "regulation"]
        if r["verdict"] == "compatible":
            assert r["remedies"] == []
            continue
        kinds = [x["kind"] for x in r["remedies"]]
        assert kinds[-1] == "pre-energising-checklist"
        assert (any(x["verdict"] == "compatible" for x in r["remedies"])
                or "no-complete-fix" in kinds)
    eu = [r for r in results if r["site"] == "harrowgate"]
    assert all(r["regulation"] is None or r["regulation"]["region"] == "EU" for r in eu)
    k111 = next(r for r in eu if r["machine"] == "K-111")
    # IE2 below the IE3 asked from 1 July 2021 [EU 2019/1781 Annex I]
    assert k111["regulation"]["status"] == "does-not-comply"
    assert k111["regulation"]["required_class"] == "IE3"
    assert k111["regulation"]["applies_from"] == "2021-07-01"
