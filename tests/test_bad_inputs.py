"""The bad-input corpus (tests/bad_inputs/): every malformed file gives exit 2, a message
naming the file and the field, no traceback, and leaves every file untouched."""

from __future__ import annotations

import copy
import hashlib
import re
import shutil
import tomllib
from pathlib import Path
from typing import Any

import pytest
import tomlkit

from loadcheck.cli import app

from .helpers import SAMPLES, sample, sample_data

HERE = Path(__file__).parent / "bad_inputs"
CASES = tomllib.loads((HERE / "manifest.toml").read_text())["case"]


def _digest(folder: Path) -> dict[str, str]:
    return {str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in sorted(folder.rglob("*")) if p.is_file()}


def test_the_corpus_is_large_enough():
    assert len(CASES) >= 60
    assert {c["kind"] for c in CASES} >= {"aircraft", "loading", "readings", "changes", "csv"}


@pytest.mark.parametrize("case", CASES, ids=[c["file"] for c in CASES])
def test_bad_input(runner, case, tmp_path, monkeypatch):
    monkeypatch.setenv("LOADCHECK_LOG", str(tmp_path / "records.sqlite3"))
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
    assert _digest(tmp_path) == before | {
        k: v for k, v in _digest(tmp_path).items() if k.endswith(".sqlite3") or "-wal" in k or "-shm" in k
    }
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
    result = runner.invoke(app, ["fleet", "check", str(SAMPLES), str(csv_file), "--no-log"])
    assert result.exit_code == 2 and "too large" in result.output and "big.csv" in result.output, result.output


def test_a_folder_and_a_missing_file(runner):
    assert "is a folder" in runner.invoke(app, ["check", str(SAMPLES)]).output
    assert "not found" in runner.invoke(app, ["check", "missing.toml"]).output


# -- a list or a table where a number belongs -----------------------------------------------
# found by the fuzz test of random loading documents: `[burn] trip_time = []` ended in
# "internal error (TypeError ...)" (tests/test_regressions.py keeps that case). The same
# class of bug for every number of every sample file, and for the burn fields the samples
# do not use: each replaced by a list or a table is a field error naming its dotted path.

WRONG_TYPES: list[Any] = [[], {}, [1.0]]
_NUMBER_WORDS = ("full", "school", "together")


def _number_fields(data: Any, prefix: str = "") -> list[str]:
    """Dotted paths of every number (or amount written as text, or fill word) in TOML data."""
    if isinstance(data, dict):
        return [p for k, v in data.items() for p in _number_fields(v, f"{prefix}.{k}" if prefix else k)]
    if isinstance(data, list):
        return [p for i, v in enumerate(data) for p in _number_fields(v, f"{prefix}[{i}]")]
    number = isinstance(data, (int, float)) and not isinstance(data, bool)
    text = isinstance(data, str) and ((data != "" and data[:1] in tuple("0123456789.-+")) or data in _NUMBER_WORDS)
    return [prefix] if number or text else []


def _replaced(data: dict[str, Any], dotted: str, value: Any) -> dict[str, Any]:
    out = copy.deepcopy(data)
    keys = [k for k in re.split(r"\.|\[(\d+)\]", dotted) if k]
    parent: Any = out
    for key in keys[:-1]:
        parent = parent[int(key)] if isinstance(parent, list) else parent[key]
    parent[int(keys[-1]) if isinstance(parent, list) else keys[-1]] = value
    return out


def _documents() -> list[tuple[str, str, dict[str, Any]]]:
    """(sample name, what it is, its data) for every sample file, and a loading with a trip time."""
    documents = []
    for path in sorted(SAMPLES.glob("*/*.toml")):
        name = path.relative_to(SAMPLES).as_posix()
        data = sample_data(name)
        kind = (
            "aircraft"
            if path.name == "aircraft.toml"
            else "readings"
            if "point" in data
            else "changes"
            if "change" in data
            else "loading"
        )
        documents.append((name, kind, data))
    timed = {"aircraft": "aircraft.toml", "load": {}, "burn": {"trip_time": "1:30", "rate": 9.5, "reserve": 5}}
    documents.append(("trainer4/timed.toml", "loading", timed))
    return documents


DOCUMENTS = _documents()


@pytest.mark.parametrize("name, kind, data", DOCUMENTS, ids=[d[0] for d in DOCUMENTS])
def test_a_list_or_a_table_where_a_number_belongs_is_a_field_error(runner, tmp_path, request, name, kind, data):
    # each number once, the wrong type taken in turn (--long: each number with every wrong type)
    every = request.config.getoption("--long")
    folder, filename = tmp_path / name.split("/")[0], name.split("/")[1]
    folder.mkdir()
    shutil.copy(SAMPLES / name.split("/")[0] / "aircraft.toml", folder / "aircraft.toml")
    fields = _number_fields(data)
    assert fields
    for index, field in enumerate(fields):
        for value in WRONG_TYPES if every else [WRONG_TYPES[index % len(WRONG_TYPES)]]:
            target = folder / ("bad_" + filename)
            target.write_text(tomlkit.dumps(_replaced(data, field, value)))
            args = {
                "aircraft": ["check", str(target)],
                "readings": ["weigh", str(folder / "aircraft.toml"), str(target)],
                "changes": ["alter", str(folder / "aircraft.toml"), str(target)],
                "loading": ["check", str(target)],
            }[kind]
            result = runner.invoke(app, args)
            output = result.output
            assert result.exit_code == 2, (field, value, output)
            assert "internal error" not in output and "Traceback" not in output, (field, value, output)
            shown = re.sub(r"^leg\[(\d+)\]\.", lambda m: f"leg {int(m[1]) + 2}, ", field)  # a leg as the user counts
            assert shown in output and "bad_" + filename in output, (field, value, output)
