"""The bad-input corpus (tests/bad_inputs/): every malformed file gives exit 2, a message
naming the file and the field, no traceback, and leaves every file untouched."""

from __future__ import annotations

import hashlib
import shutil
import tomllib
from pathlib import Path

import pytest

from loadcheck.cli import app

from .helpers import SAMPLES, sample

HERE = Path(__file__).parent / "bad_inputs"
CASES = tomllib.loads((HERE / "manifest.toml").read_text())["case"]


def _digest(folder: Path) -> dict[str, str]:
    return {str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in sorted(folder.rglob("*")) if p.is_file()}


def test_the_corpus_is_large_enough():
    assert len(CASES) >= 60
    assert {c["kind"] for c in CASES} >= {"aircraft", "loading", "readings", "changes", "csv"}


@pytest.mark.parametrize("case", CASES, ids=[c["file"] for c in CASES])
def test_bad_input(runner, case, tmp_path, monkeypatch):
    monkeypatch.setenv("LOADCHECK_RECORDS", str(tmp_path / "records.sqlite3"))
    bad = tmp_path / case["file"]
    shutil.copy(HERE / case["file"], bad)
    shutil.copy(sample("trainer4/aircraft.toml"), tmp_path / "trainer.toml")
    trainer = str(tmp_path / "trainer.toml")
    before = _digest(tmp_path)
    samples_before = _digest(SAMPLES)
    kind = case["kind"]
    if kind == "aircraft":
        args = ["check", str(bad), "--load", "front=170"]
    elif kind == "loading":
        args = ["check", trainer, str(bad)]
    elif kind == "loading_alone":
        args = ["check", str(bad)]
    elif kind == "readings":
        args = ["weigh", trainer, str(bad), "--write"]
    elif kind == "changes":
        args = ["alter", trainer, str(bad), "--write"]
    else:
        args = ["fleet", "check", str(SAMPLES), str(bad)]
    result = runner.invoke(app, args)
    output = result.output
    assert result.exit_code == 2, output
    assert "Traceback" not in output and "internal error" not in output, output
    assert case["file"] in output, output
    for words in case["words"]:
        assert words in output, (words, output)
    assert _digest(tmp_path) == before | {k: v for k, v in _digest(tmp_path).items() if k.endswith(".sqlite3") or "-wal" in k or "-shm" in k}
    assert _digest(SAMPLES) == samples_before


def _sparse(path: Path, head: str, size: int) -> Path:
    """A file of ``size`` bytes that starts with ``head``: the rest is a hole (a sparse file
    where the file system has them), so nothing near ``size`` is written to the disk."""
    with open(path, "wb") as handle:
        handle.write(head.encode())
        handle.truncate(size)
    return path


def test_a_100_megabyte_file(runner, tmp_path):
    # the limits are 5 MiB for a TOML file (files.MAX_FILE_BYTES) and 50 MiB for a CSV
    # (fleet.MAX_CSV_BYTES); a file far above both is refused before it is read
    from loadcheck.files import MAX_FILE_BYTES
    from loadcheck.fleet import MAX_CSV_BYTES

    size = 100 * 1024 * 1024
    assert size > MAX_CSV_BYTES > MAX_FILE_BYTES
    big = _sparse(tmp_path / "big.toml", "# padding\n", size)
    result = runner.invoke(app, ["check", str(big)])
    assert result.exit_code == 2 and "too large" in result.output and "big.toml" in result.output, result.output
    csv_file = _sparse(tmp_path / "big.csv", "registration,front\nDEMO-4T,170\n", size)
    result = runner.invoke(app, ["fleet", "check", str(SAMPLES), str(csv_file), "--no-record"])
    assert result.exit_code == 2 and "too large" in result.output and "big.csv" in result.output, result.output


def test_a_folder_and_a_missing_file(runner):
    assert "is a folder" in runner.invoke(app, ["check", str(SAMPLES)]).output
    assert "not found" in runner.invoke(app, ["check", "missing.toml"]).output
