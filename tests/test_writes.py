"""Nothing lost: every file loadcheck writes is written whole or not at all.

Aircraft history writes are tested in tests/test_empty_record.py (crash and full disk); here:
charts, load sheets, mechanic records, exports, and the check log.
"""

from __future__ import annotations

import errno

import pytest

import loadcheck.files as files_module
from loadcheck.checklog import CheckLog
from loadcheck.cli import app
from loadcheck.errors import FileFormatError

from .helpers import sample


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
        (
            ["weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml")), "--sheet"],
            "record.html",
        ),
        (["show", str(sample("twin6/aircraft.toml")), "--chart"], "envelope.pdf"),
    ],
)
def test_old_content_survives_a_failed_write(runner, tmp_path, monkeypatch, how, args, name):
    target = tmp_path / name
    target.write_bytes(b"the old content")
    _crash(monkeypatch, how)
    result = runner.invoke(app, [*args, str(target)])
    assert result.exit_code == 2, result.output
    assert "unchanged" in result.output and name in result.output
    assert target.read_bytes() == b"the old content"
    assert [p.name for p in tmp_path.iterdir()] == [name]  # no temporary file left behind


def test_export_survives_a_failed_write(runner, tmp_path, monkeypatch):
    db = tmp_path / "records.sqlite3"
    with CheckLog(db) as log:
        log.add(aircraft_data={"a": 1}, fingerprint="f", inputs={}, result={"ok": True, "category": "normal"})
    out = tmp_path / "export.csv"
    out.write_text("previous export\n")
    _crash(monkeypatch, "crash")
    result = runner.invoke(app, ["log", "export", "--db", str(db), "--format", "csv", "--out", str(out)])
    assert result.exit_code == 2 and out.read_text() == "previous export\n"


def test_a_failed_batch_records_nothing_and_keeps_the_rest(tmp_path):
    db = tmp_path / "records.sqlite3"
    good = {"aircraft_data": {"a": 1}, "fingerprint": "f", "inputs": {}, "result": {"ok": True}}
    with CheckLog(db) as log:
        first = log.add(**good)
        with pytest.raises(FileFormatError, match="nothing of this batch was recorded"):
            log.add_many([good, {**good, "result": {"ok": True, "bad": {1, 2}}}])
        second = log.add(**good)
        assert [r.id for r in log.find()] == [first, second]


def test_a_corrupt_database_is_refused_not_overwritten(tmp_path):
    db = tmp_path / "records.sqlite3"
    db.write_bytes(b"this is not a database" * 100)
    with pytest.raises(FileFormatError, match="check log"):
        CheckLog(db)
    assert db.read_bytes() == b"this is not a database" * 100


# -- symlinks, special files, permissions (issue 14 item 4, issue 15 item 7) ---------------------


def _linked_trainer(tmp_path):
    """current.toml -> versions/v7.toml, as a fleet keeps versioned aircraft files."""
    import os
    import shutil

    versions = tmp_path / "versions"
    versions.mkdir()
    shutil.copy(sample("trainer4/aircraft.toml"), versions / "v7.toml")
    text = sample("trainer4/weighing.toml").read_text()  # the readings name the aircraft by its link
    (tmp_path / "weighing.toml").write_text(text.replace('aircraft = "aircraft.toml"', 'aircraft = "current.toml"'))
    link = tmp_path / "current.toml"
    os.symlink(os.path.join("versions", "v7.toml"), link)
    return link, versions / "v7.toml"


def test_weigh_write_goes_through_a_symlink_to_its_target(runner, tmp_path):
    from loadcheck import load_aircraft

    link, target = _linked_trainer(tmp_path)
    result = runner.invoke(app, ["weigh", str(link), str(tmp_path / "weighing.toml"), "--write", "--yes"])
    assert result.exit_code == 0, result.output
    assert link.is_symlink() and link.resolve() == target.resolve()
    assert load_aircraft(target).empty.weight == pytest.approx(1685.8, abs=0.05)
    assert "through the link" in result.output
    assert sorted(p.name for p in target.parent.iterdir()) == ["v7.toml"]  # no temporary file left


@pytest.mark.parametrize(
    "args",
    [
        ["weigh", str(sample("trainer4/aircraft.toml")), str(sample("trainer4/weighing.toml")), "--sheet"],
        ["check", str(sample("trainer4/within.toml")), "--sheet"],
    ],
)
def test_sheets_go_through_a_symlink(runner, tmp_path, args):
    import os

    (tmp_path / "real.html").write_text("old")
    os.symlink("real.html", tmp_path / "record.html")
    result = runner.invoke(app, [*args, str(tmp_path / "record.html")])
    assert result.exit_code in (0, 1), result.output
    assert (tmp_path / "record.html").is_symlink() and "<!DOCTYPE html>" in (tmp_path / "real.html").read_text()


def test_export_goes_through_a_symlink(runner, tmp_path):
    import os

    db = tmp_path / "records.sqlite3"
    with CheckLog(db) as log:
        log.add(aircraft_data={"a": 1}, fingerprint="f", inputs={}, result={"ok": True, "category": "normal"})
    (tmp_path / "real.csv").write_text("old\n")
    os.symlink("real.csv", tmp_path / "export.csv")
    result = runner.invoke(
        app, ["log", "export", "--db", str(db), "--format", "csv", "--out", str(tmp_path / "export.csv")]
    )
    assert result.exit_code == 0 and (tmp_path / "export.csv").is_symlink()
    assert (tmp_path / "real.csv").read_text().startswith("id,checked_at")


@pytest.mark.parametrize("through_link", [False, True])
@pytest.mark.parametrize("command", ["record-sheet", "load-sheet", "export"])
def test_a_fifo_is_refused_not_replaced_or_read(runner, tmp_path, command, through_link):
    import os

    fifo = tmp_path / "pipe.html"
    os.mkfifo(fifo)
    name = fifo
    if through_link:
        name = tmp_path / "link.html"
        os.symlink("pipe.html", name)
    if command == "record-sheet":
        args = [
            "weigh",
            str(sample("trainer4/aircraft.toml")),
            str(sample("trainer4/weighing.toml")),
            "--sheet",
            str(name),
        ]
    elif command == "load-sheet":
        args = ["check", str(sample("trainer4/within.toml")), "--sheet", str(name)]
    else:
        db = tmp_path / "records.sqlite3"
        with CheckLog(db) as log:
            log.add(aircraft_data={"a": 1}, fingerprint="f", inputs={}, result={"ok": True})
        args = ["log", "export", "--db", str(db), "--out", str(name)]
    result = runner.invoke(app, args)
    assert result.exit_code == 2, result.output
    assert "FIFO" in result.output and "nothing was written" in result.output
    import stat

    assert stat.S_ISFIFO(os.stat(fifo).st_mode)


# -- crash and full disk on the new write paths: symlink target, confirmation, override ---------


def _write_path(tmp_path, monkeypatch, path_kind):
    """Set up one of the new write paths; return (aircraft path, file that must stay whole, arguments, stdin)."""
    import shutil

    import loadcheck.cli.mechanic as mechanic_cli

    if path_kind == "symlink":
        link, target = _linked_trainer(tmp_path)
        return target, ["weigh", str(link), str(tmp_path / "weighing.toml"), "--write", "--yes"], None
    shutil.copy(sample("trainer4/aircraft.toml"), tmp_path / "aircraft.toml")
    readings = tmp_path / "weighing.toml"
    text = sample("trainer4/weighing.toml").read_text()
    if path_kind == "confirmation":
        monkeypatch.setattr(mechanic_cli, "_interactive", lambda: True)
        readings.write_text(text)
        return tmp_path / "aircraft.toml", ["weigh", str(tmp_path / "aircraft.toml"), str(readings), "--write"], "y\n"
    readings.write_text(text.replace("reading = 598.0", "reading = 798.0"))  # an implausible change: needs --force
    return (
        tmp_path / "aircraft.toml",
        ["weigh", str(tmp_path / "aircraft.toml"), str(readings), "--write", "--yes", "--force"],
        None,
    )


@pytest.mark.parametrize("how", ["crash", "disk_full"])
@pytest.mark.parametrize("path_kind", ["symlink", "confirmation", "override"])
def test_new_write_paths_survive_a_crash_and_a_full_disk(runner, tmp_path, monkeypatch, how, path_kind):
    whole, args, answer = _write_path(tmp_path, monkeypatch, path_kind)
    before = whole.read_bytes()
    _crash(monkeypatch, how)
    result = runner.invoke(app, args, input=answer)
    assert result.exit_code == 2, result.output
    assert "unchanged" in result.output and "Traceback" not in result.output
    assert whole.read_bytes() == before
    assert not [p for p in whole.parent.iterdir() if p.name.endswith(".tmp")]
    if path_kind == "symlink":
        assert (tmp_path / "current.toml").is_symlink()
