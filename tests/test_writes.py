"""Nothing lost: every file loadcheck writes is written whole or not at all.

Aircraft history writes are tested in tests/test_mechanic.py (crash and full disk); here:
charts, load sheets, mechanic records, exports, and the record database.
"""

from __future__ import annotations

import errno

import pytest
from typer.testing import CliRunner

import loadcheck.files as files_module
from loadcheck.cli import app
from loadcheck.errors import FileFormatError
from loadcheck.records import RecordLog

from .helpers import sample

runner = CliRunner()


def _crash(monkeypatch, how: str) -> None:
    if how == "crash":
        def boom(*args, **kwargs):
            raise OSError(errno.EIO, "simulated crash before the rename")
        monkeypatch.setattr(files_module.os, "replace", boom)
    else:
        def full(*args, **kwargs):
            raise OSError(errno.ENOSPC, "No space left on device")
        monkeypatch.setattr(files_module.os, "fsync", full)


@pytest.mark.parametrize("how", ["crash", "disk_full"])
@pytest.mark.parametrize(
    "args, name",
    [
        (["check", str(sample("trainer4/within.toml")), "--chart"], "chart.png"),
        (["check", str(sample("trainer4/within.toml")), "--chart"], "chart.svg"),
        (["check", str(sample("trainer4/within.toml")), "--sheet"], "sheet.html"),
        (["weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml")), "--sheet"], "record.html"),
        (["show", str(sample("twin6/aircraft.toml")), "--chart"], "envelope.pdf"),
    ],
)
def test_old_content_survives_a_failed_write(tmp_path, monkeypatch, how, args, name):
    target = tmp_path / name
    target.write_bytes(b"the old content")
    _crash(monkeypatch, how)
    result = runner.invoke(app, [*args, str(target)])
    assert result.exit_code == 2, result.output
    assert "unchanged" in result.output and name in result.output
    assert target.read_bytes() == b"the old content"
    assert [p.name for p in tmp_path.iterdir()] == [name]  # no temporary file left behind


def test_export_survives_a_failed_write(tmp_path, monkeypatch):
    db = tmp_path / "records.sqlite3"
    with RecordLog(db) as log:
        log.add(aircraft_data={"a": 1}, fingerprint="f", inputs={}, result={"ok": True, "category": "normal"})
    out = tmp_path / "export.csv"
    out.write_text("previous export\n")
    _crash(monkeypatch, "crash")
    result = runner.invoke(app, ["records", "export", "--db", str(db), "--format", "csv", "--out", str(out)])
    assert result.exit_code == 2 and out.read_text() == "previous export\n"


def test_a_failed_batch_records_nothing_and_keeps_the_rest(tmp_path):
    db = tmp_path / "records.sqlite3"
    good = {"aircraft_data": {"a": 1}, "fingerprint": "f", "inputs": {}, "result": {"ok": True}}
    with RecordLog(db) as log:
        first = log.add(**good)
        with pytest.raises(FileFormatError, match="nothing of this batch was recorded"):
            log.add_many([good, {**good, "result": {"ok": True, "bad": {1, 2}}}])
        second = log.add(**good)
        assert [r.id for r in log.find()] == [first, second]


def test_a_corrupt_database_is_refused_not_overwritten(tmp_path):
    db = tmp_path / "records.sqlite3"
    db.write_bytes(b"this is not a database" * 100)
    with pytest.raises(FileFormatError, match="record database"):
        RecordLog(db)
    assert db.read_bytes() == b"this is not a database" * 100
