"""The fleet runner: pieces checked by workers give exactly the document one process writes,
and anything a piece cannot judge alone is reported as the whole load reports it."""

import importlib.util
import os

import pytest
from click.testing import CliRunner

from machinecheck import fleet as runner
from machinecheck.cli.main import _demo_path, main
from machinecheck.inputs.catalog import tomllib

ENV = {"NO_COLOR": "1", "COLUMNS": "120"}


def _tomllib(text):
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError:
        return None


#: Whether the catalog reader is a TOML 1.0 reader (tomllib), not a TOML 1.1 one (newer tomli).
READS_TOML_1_0 = _tomllib('a = "\\e"\n') is None
TOML_1_1_READER = "this interpreter's TOML reader reads TOML 1.1"


def run(*args):
    return CliRunner().invoke(main, list(args), env=ENV)


@pytest.fixture
def small_pieces(monkeypatch):
    """Cut after every 3 machines and use workers even for the 12-machine demo."""
    monkeypatch.setattr(runner, "CHUNK_MACHINES", 3)
    monkeypatch.setattr(runner, "PARALLEL_PAIRS", 0)
    monkeypatch.setattr(runner, "workers_available", lambda: 2)


def _demo_text():
    with open(_demo_path("fleet.toml"), encoding="utf-8") as handle:
        return handle.read()


@pytest.mark.parametrize("fmt", ["json", "csv"])
def test_text_pieces_give_the_serial_document(small_pieces, tmp_path, fmt, monkeypatch):
    used = []
    original = runner.stream_files
    monkeypatch.setattr(runner, "stream_files", lambda *a, **k: used.append(1) or original(*a, **k))
    out = tmp_path / f"out.{fmt}"
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(_demo_text(), encoding="utf-8")
    assert runner.plan_file(str(catalog), _demo_text()).machines == 12
    parallel = run("check", str(catalog), "--format", fmt, "-o", str(out))
    serial = run("check", str(catalog), "--format", fmt)  # stdout: loaded whole, one process
    assert parallel.exit_code == serial.exit_code == 1
    assert out.read_text(encoding="utf-8") == serial.output
    assert used == [1]  # the pieces path was taken


_INLINE_LOAD = """
[[machine]]
id = "INLINE-1"
load = {type = "centrifugal", power = "9 kW"}
  [[machine.rating]]
  frequency = "50 Hz"
  voltage = "400 V"
  power = "11 kW"
  speed = "1460 rpm"
  current = "21 A"
  power_factor = 0.84
"""


def test_a_piece_with_an_inline_table_gives_the_serial_document(small_pieces, tmp_path):
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(_demo_text() + _INLINE_LOAD, encoding="utf-8")
    out = tmp_path / "out.json"
    parallel = run("check", str(catalog), "--format", "json", "-o", str(out))
    serial = run("check", str(catalog), "--format", "json")
    assert parallel.exit_code == serial.exit_code == 1
    assert "INLINE-1" in serial.output
    assert out.read_text(encoding="utf-8") == serial.output


def _with_machine(text, index, replace_from, replace_to):
    parts = text.split("[[machine]]")
    parts[index + 1] = parts[index + 1].replace(replace_from, replace_to, 1)
    return "[[machine]]".join(parts)


@pytest.mark.parametrize(("change", "needle"), [
    (lambda t: _with_machine(t, 7, 'frequency = "50 Hz"', 'frequency = "50 A"'),
     "is not a unit of frequency"),
    (lambda t: _with_machine(t, 9, 'id = "K-111"', 'id = "P-101"'), "duplicate id"),
    (lambda t: _with_machine(t, 5, 'id = "H-610"', 'id = "H-610\n'), "TOML syntax error"),
    (lambda t: t + '\n[[site]]\nid = "x"\n', "unknown key 'site'"),
    pytest.param(lambda t: t + _INLINE_LOAD.replace('kW"}', 'kW",}'), "TOML syntax error",
                 marks=pytest.mark.skipif(not READS_TOML_1_0, reason=TOML_1_1_READER)),
])
def test_a_problem_in_one_piece_is_reported_as_the_whole_load_reports_it(
        small_pieces, tmp_path, change, needle):
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(change(_demo_text()), encoding="utf-8")
    out = tmp_path / "out.json"
    parallel = run("check", str(catalog), "--format", "json", "-o", str(out))
    serial = run("check", str(catalog), "--format", "json")
    assert parallel.exit_code == serial.exit_code == 2
    assert needle in parallel.output
    assert parallel.output == serial.output
    assert not out.exists()


def test_a_table_after_the_machines_falls_back_to_the_whole_load(small_pieces, tmp_path):
    catalog = tmp_path / "fleet.toml"
    head, _, rest = _demo_text().partition("[[machine]]")
    catalog.write_text("[[machine]]" + rest + head, encoding="utf-8")  # [catalog] moved last
    out = tmp_path / "out.json"
    result = run("check", str(catalog), "--format", "json", "-o", str(out))
    assert result.exit_code == 1
    assert out.read_text(encoding="utf-8") == run("check", "--format", "json").output


def test_multi_line_strings_are_never_cut():
    text = '[[machine]]\nid = "A"\ndescription = """\n[[machine]]\n"""\n[[machine]]\nid = "B"\n'
    assert runner.plan_file("x.toml", text) is None
    assert runner.plan_file("x.toml", text.replace('"""', '"')) is not None


def _dies(job):
    import os

    os._exit(3)  # a worker killed mid-run (as by the out-of-memory killer)


@pytest.mark.parametrize("to_file", [True, False])
def test_a_dead_worker_ends_the_run_cleanly(small_pieces, tmp_path, monkeypatch, to_file):
    monkeypatch.setattr(runner, "_work", _dies)
    monkeypatch.setattr(runner, "_work_text", _dies)
    catalog = tmp_path / "fleet.toml"
    catalog.write_text(_demo_text(), encoding="utf-8")
    out = tmp_path / "out.json"
    args = ["check", str(catalog), "--format", "json"] + (["-o", str(out)] if to_file else [])
    result = run(*args)
    assert result.exit_code == 2
    assert "worker process ended unexpectedly" in result.output
    assert "Traceback" not in result.output
    assert not out.exists()


# ----------------------------------------------------------------------------- parse_piece

def _same(a, b):
    return a == b or repr(a) == repr(b)  # repr: nan is not equal to itself


def _corpus_and_demo():
    folder = os.path.join(os.path.dirname(__file__), "inputs", "corpus")
    texts = {}
    for name in sorted(os.listdir(folder)):
        with open(os.path.join(folder, name), encoding="utf-8", errors="replace") as handle:
            texts[name] = handle.read()
    for name in ("fleet.toml", "sites.toml"):
        with open(_demo_path(name), encoding="utf-8") as handle:
            texts[name] = handle.read()
    return texts


def _generated_catalog(count):
    path = os.path.join(os.path.dirname(__file__), "..", "benchmarks", "generate.py")
    spec = importlib.util.spec_from_file_location("generate", path)
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module.catalog(count)


def test_pieces_read_as_tomllib_reads_them():
    # the fast reader (rtoml) and tomllib must agree on every file we ship or test with
    texts = _corpus_and_demo()
    texts["generated"] = _generated_catalog(60)
    for name, text in texts.items():
        assert _same(runner.parse_piece(text), _tomllib(text)), name


#: TOML 1.1 reads these, TOML 1.0 refuses them.
TOML_1_1_ONLY = ['a = {b = 1,}\n', 'a = {b = 1,\n c = 2}\n', 'a = "\\e"\n', 'a = "\\x41"\n',
                 'a = 07:32\n', 'a = 1979-05-27T07:32\n', '\ufeffa = 1\n']


@pytest.mark.parametrize("text", TOML_1_1_ONLY)
def test_a_piece_reads_toml_1_1_as_the_catalog_reader_does(text):
    """tomllib (Python 3.11-) reads TOML 1.0 and refuses these, so a piece must refuse them
    too; tomli 2.5 and later (Python 3.10) reads TOML 1.1, and a piece then reads them alike."""
    if READS_TOML_1_0:
        assert _tomllib(text) is None
    assert _same(runner.parse_piece(text), _tomllib(text))


@pytest.mark.parametrize("text", [
    # TOML 1.0 errors both refuse
    'a = 1\na = 2\n', '[t]\n[t]\n', 'a = "\\q"\n', 'a = 01\n', 'a = 2021-02-30\n', 'a b = 1\n',
    'a = [1]\n[[a]]\n', 'a = 1 b = 2\n', '[[machine]\n', 'id = "x\n',
])
def test_what_tomllib_refuses_a_piece_refuses(text):
    assert _tomllib(text) is None
    assert runner.parse_piece(text) is None


@pytest.mark.parametrize("text", [
    'a = {b = 1, c = "x"}\n', 'a = 1979-05-27T07:32:00Z\n', 'a = 07:32:00.5\n', 'a = "12:30 shift"\n',
    'a = "back\\\\slash"\n', "a = 'C:\\x\\e'\n", 'a = nan\n', 'a = 1e1_0\n', 'a = [\n1,\n2,\n]\n',
])
def test_what_tomllib_reads_a_piece_reads_alike(text):
    assert _tomllib(text) is not None
    assert _same(runner.parse_piece(text), _tomllib(text))


def test_pieces_without_the_fast_reader(monkeypatch):
    monkeypatch.setattr(runner, "rtoml", None)
    text = _generated_catalog(5)
    assert runner.parse_piece(text) == _tomllib(text)
    assert runner.parse_piece("a = 1\na = 2\n") is None


@pytest.mark.parametrize("text", [
    "[[machine]]\nid = 'A'\n[[machine]]\n",
    "\n[[ machine ]] # first\n  [[machine]]\n[[machine.rating]]\n[[machine]]x\n[[machine]]",
    "[[machines]]\n[[site]]\n\n[[\tmachine\t]]\t\n[[machine]]\r\n[[machine]]\n\n",
    "", "[[", "\n[[", "id = 1\n[[machine]]  # a\n[[machine]]#b\n",
])
def test_machine_headers_are_found_where_the_expression_finds_them(text):
    expected = [m.start() for m in runner._MACHINE_HEADER.finditer(text)]
    assert runner.machine_header_starts(text) == expected
