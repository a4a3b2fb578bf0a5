import json

import pytest
from click.testing import CliRunner

from machinecheck import __version__
from machinecheck.cli.main import main

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}


def run(*args):
    return CliRunner().invoke(main, list(args), env=ENV, catch_exceptions=False)


def test_version():
    result = run("--version")
    assert result.exit_code == 0
    assert __version__ in result.output


def test_demo_check_table():
    result = run("check")
    assert result.exit_code == 1  # the demo holds incompatible pairs
    for word in ("compatible", "conditional", "incompatible", "harrowgate", "Caution"):
        assert word in result.output
    assert "Traceback" not in result.output


def test_demo_json_contract():
    result = run("check", "--format", "json")
    doc = json.loads(result.output)
    assert doc["machinecheck"] == __version__
    first = doc["results"][0]
    for key in ("machine", "site", "verdict", "rating", "synchronous_speed_rpm",
                "expected_speed_rpm", "available_power_kw", "full_load_current_a", "flux_ratio",
                "findings"):
        assert key in first
    assert set(first["rating"]) >= {"frequency_hz", "voltage_v", "connection"}
    assert all(set(f) == {"code", "severity", "message"} for f in first["findings"])


def test_site_and_machine_filters():
    result = run("check", "--format", "json", "--site", "copperleigh", "--machine", "G-700")
    doc = json.loads(result.output)
    assert [(r["machine"], r["site"]) for r in doc["results"]] == [("G-700", "copperleigh")]
    assert result.exit_code == 0


def test_unknown_site_filter_is_usage_error():
    result = run("check", "--site", "copperlee")
    assert result.exit_code == 2
    assert "did you mean 'copperleigh'" in result.output


def test_one_off_issue_example():
    # The issue's one-off example: 50 hp 460 V 60 Hz 1775 rpm on 400 V 50 Hz.
    result = run("check", "--power", "50 hp", "--voltage", "460 V", "--frequency", "60 Hz",
                 "--speed", "1775 rpm", "--efficiency", "0.93", "--power-factor", "0.85",
                 "--supply-voltage", "400 V", "--supply-frequency", "50 Hz", "--standard", "IEC",
                 "--format", "json")
    r = json.loads(result.output)["results"][0]
    assert r["synchronous_speed_rpm"] == 1500
    assert 1475 <= r["expected_speed_rpm"] <= 1490
    assert r["available_power_kw"] <= 37.285 * 5 / 6
    assert r["verdict"] == "conditional"
    assert result.exit_code == 0


def test_one_off_bad_option_value_names_option():
    result = run("check", "--power", "50 A", "--voltage", "460", "--frequency", "60",
                 "--speed", "1775", "--supply-voltage", "400", "--supply-frequency", "50")
    assert result.exit_code == 2
    assert "--power" in result.output
    assert "Traceback" not in result.output


def test_speed_lookup():
    result = run("speed", "--poles", "6", "--frequency", "50")
    assert result.exit_code == 0
    assert "1000 rpm" in result.output


def test_speed_lookup_slip_adjusted():
    # practice notes Q2: 1460 rpm 50 Hz motor at 60 Hz, constant V/f -> about 1760 rpm.
    result = run("speed", "--frequency", "60 Hz", "--rated-speed", "1460 rpm",
                 "--rated-frequency", "50 Hz")
    assert "1800 rpm" in result.output and "1760 rpm" in result.output


def test_poles_lookup():
    result = run("poles", "--speed", "1460 rpm", "--frequency", "50 Hz")
    assert result.exit_code == 0
    assert result.output.startswith("4 poles")
    assert "2.7 %" in result.output


def test_current_lookup():
    result = run("current", "--power", "22 kW", "--voltage", "400 V", "--efficiency", "0.92",
                 "--power-factor", "0.85")
    assert result.exit_code == 0
    assert result.output.startswith("40.6 A")


def test_current_lookup_single_phase():
    # standards.md section 8: 1.5 kW single-phase 230 V, 0.80, 0.90 -> 9.06 A.
    result = run("current", "--power", "1.5 kW", "--voltage", "230", "--efficiency", "80 %",
                 "--power-factor", "0.9", "--phases", "1")
    assert result.output.startswith("9.1 A")


def test_current_lookup_needs_efficiency():
    result = run("current", "--power", "22 kW", "--voltage", "400 V")
    assert result.exit_code == 2
    assert "--efficiency" in result.output


def test_lookup_bad_unit():
    result = run("speed", "--poles", "4", "--frequency", "60 A")
    assert result.exit_code == 2
    assert "--frequency" in result.output and "frequency" in result.output


def test_lookup_odd_poles():
    result = run("speed", "--poles", "3", "--frequency", "50")
    assert result.exit_code == 2


def test_validate_demo():
    from machinecheck.cli.main import _demo_path

    result = run("validate", _demo_path("fleet.toml"), _demo_path("sites.toml"))
    assert result.exit_code == 0
    assert "12 machines" in result.output and "4 sites" in result.output


def test_validate_reports_every_problem(write):
    path = write("bad.toml", """
[[machine]]
id = "A"
poles = 3
  [[machine.rating]]
  frequency = "50 A"
  voltage = "400 V"
  power = "5 kW"
  speed = "1440 rpm"
""")
    result = run("validate", path)
    assert result.exit_code == 2
    lines = [x for x in result.output.splitlines() if x.startswith("machinecheck: error")]
    assert len(lines) == 2
    assert "bad.toml:4" in result.output and "poles" in result.output
    assert "bad.toml:6" in result.output and "rating[1].frequency" in result.output


def test_output_file_written_atomically(tmp_path):
    out = tmp_path / "report.json"
    result = run("check", "--format", "json", "--output", str(out))
    assert result.exit_code == 1
    assert json.loads(out.read_text())["results"]
    assert [p.name for p in tmp_path.iterdir()] == ["report.json"]


def test_output_refuses_input_file(tmp_path):
    from machinecheck.cli.main import _demo_path

    catalog = tmp_path / "fleet.toml"
    with open(_demo_path("fleet.toml"), encoding="utf-8") as handle:
        catalog.write_text(handle.read())
    before = catalog.read_text()
    result = run("check", str(catalog), "--output", str(catalog))
    assert result.exit_code == 2
    assert catalog.read_text() == before


def test_output_in_missing_folder(tmp_path):
    result = run("check", "--output", str(tmp_path / "nope" / "r.txt"))
    assert result.exit_code == 2
    assert "does not exist" in result.output


@pytest.mark.parametrize("args", [["check", "--format", "pdf"], ["nosuch"], ["speed"]])
def test_usage_errors_exit_2(args):
    assert run(*args).exit_code == 2


def test_markdown_report_tables_are_well_formed():
    result = run("check", "--format", "markdown", "--matrix")
    lines = result.output.splitlines()
    assert lines[0] == "# machinecheck demo report: an invented fleet against invented sites"
    tables = [line for line in lines if line.startswith("|")]
    header_cols = None
    for line in tables:
        cols = line.count("|") - line.count("\\|")
        if line.startswith("|---") or header_cols is None:
            header_cols = cols if header_cols is None else header_cols
        assert cols >= 3
    assert "## Fleet matrix" in result.output
    assert "Caution" in lines[-1]


def test_csv_report_parses_back():
    import csv
    import io

    result = run("check", "--format", "csv")
    rows = list(csv.DictReader(io.StringIO(result.output)))
    caution = rows.pop()
    assert caution["machine"].startswith("Caution:") and not caution["verdict"]
    assert len(rows) == 12 * 4
    assert {r["verdict"] for r in rows} == {"compatible", "conditional", "incompatible"}
    assert all(r["machine"] and r["site"] for r in rows)


def test_table_matrix():
    result = run("check", "--matrix")
    assert "fleet matrix" in result.output
    assert "tor-camp" in result.output


def test_problems_only_keeps_non_compatible():
    result = run("check", "--format", "json", "--problems-only")
    verdicts = {r["verdict"] for r in json.loads(result.output)["results"]}
    assert "compatible" not in verdicts and verdicts


def test_one_off_bare_numbers_and_site_options():
    # Bare numbers on the command line take the default unit (Hz, V, A, rpm).
    result = run("check", "--power", "10 hp", "--voltage", "230", "--voltage", "460",
                 "--connection", "low", "--connection", "high", "--current", "24", "--current",
                 "12", "--frequency", "60", "--speed", "1760", "--code-letter", "G",
                 "--service-factor", "1.15", "--efficiency", "0.917", "--power-factor", "0.85",
                 "--supply-voltage", "460", "--supply-frequency", "60", "--standard", "NEMA",
                 "--supply-unbalance", "2 %", "--altitude", "2000 m", "--ambient", "45 degC",
                 "--load-type", "centrifugal", "--load-power", "8 hp", "--format", "json")
    r = json.loads(result.output)["results"][0]
    assert r["rating"]["connection"] == "high"
    # NEMA MG 1 Fig. 14-1 at 2 % -> 0.95; common-practice table 2000 m, 45 degC -> 0.90
    assert r["derating"]["unbalance"] == pytest.approx(0.95, abs=0.01)
    assert r["derating"]["site"] == pytest.approx(0.90)
    assert r["code_current_a"] == 14  # NFPA 70 Table 430.250, 10 hp 460 V
    assert r["locked_rotor_current_a"]["basis"] == "code letter G"


def test_parallel_stream_matches_the_serial_one(monkeypatch):
    # Streamed formats are split over worker processes on a large fleet; the document must be
    # byte for byte the one a single process writes, and the tally the same.
    from machinecheck import fleet as runner
    from machinecheck.cli.main import _demo_path
    from machinecheck.inputs.catalog import load_catalog, load_sites

    machines = load_catalog(_demo_path("fleet.toml")).machines
    sites = load_sites(_demo_path("sites.toml"))
    monkeypatch.setattr(runner, "CHUNK_MACHINES", 3)
    monkeypatch.setattr(runner, "PARALLEL_PAIRS", 0)
    for fmt in ("json", "csv"):
        outputs = []
        for workers in (1, 2):
            tally = runner.Tally()
            text = b"".join(runner.stream(machines, sites, fmt, tally=tally, workers=workers,
                                          problems_only=fmt == "csv"))
            outputs.append((text, tally.counts, tally.shown))
        assert outputs[0] == outputs[1]
    assert outputs[0][1]["incompatible"] > 0


def test_streamed_json_equals_the_whole_document():
    from machinecheck.cli.main import _demo_path
    from machinecheck.engine.pipeline import assess_all
    from machinecheck.inputs.catalog import load_catalog, load_sites
    from machinecheck.report import json_

    results = assess_all(load_catalog(_demo_path("fleet.toml")).machines,
                         load_sites(_demo_path("sites.toml")))
    assert run("check", "--format", "json").output == json_.render(results)
    assert json.loads(json_.render([]))["results"] == []


def test_narrow_terminal_lists_findings_below_the_table():
    from machinecheck.cli.main import _demo_path
    from machinecheck.engine.pipeline import assess_all
    from machinecheck.inputs.catalog import load_catalog, load_sites
    from machinecheck.report import table

    results = assess_all(load_catalog(_demo_path("fleet.toml")).machines,
                         [s for s in load_sites(_demo_path("sites.toml")) if s.id == "harrowgate"])
    narrow = table.render(results, width=80, color=False)
    wide = table.render(results, width=120, color=False)
    assert "findings" not in narrow.splitlines()[3] and "findings" in wide
    assert "K-111 (incompatible):" in narrow
    assert max(len(line.rstrip()) for line in narrow.splitlines()) <= 80
    assert "incompatible" in narrow and "…" not in narrow.split("K-111 (")[0]


def test_output_temporary_files_are_new_and_private(tmp_path):
    import os
    import stat

    from machinecheck.cli.output import new_temporary

    target = str(tmp_path / "report.json")
    (fd1, one), (fd2, two) = new_temporary(str(tmp_path), target), new_temporary(str(tmp_path), target)
    os.close(fd1)
    os.close(fd2)
    assert one != two and os.path.dirname(one) == str(tmp_path)
    assert os.path.basename(one).startswith(".machinecheck-")
    assert stat.S_IMODE(os.stat(one).st_mode) == 0o600
