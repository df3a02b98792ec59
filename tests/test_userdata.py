"""Where the user's files are by default: an environment variable, else the user data folder
(docs/cli.md, "The check log"; docs/web.md, the accounts file)."""

from __future__ import annotations

import subprocess
import sys

import pytest
from platformdirs import user_data_path

from loadcheck.errors import InputError
from loadcheck.userdata import default_log_path, default_users_path, log_path, user_file


def test_the_variable_names_the_file(tmp_path, monkeypatch):
    monkeypatch.setenv("LOADCHECK_LOG", str(tmp_path / "mine.sqlite3"))
    monkeypatch.setenv("LOADCHECK_USERS", str(tmp_path / "people.json"))
    assert default_log_path() == tmp_path / "mine.sqlite3"
    assert default_users_path() == tmp_path / "people.json"


def test_without_the_variable_the_file_is_in_the_user_data_folder(monkeypatch):
    # the folder is platformdirs' (the reference for each system's user data folder), never one of our own making
    for variable in ("LOADCHECK_LOG", "LOADCHECK_RECORDS", "LOADCHECK_USERS"):  # rename.py: keep
        monkeypatch.delenv(variable, raising=False)
    folder = user_data_path("loadcheck", appauthor=False)
    assert default_log_path() == folder / "records.sqlite3"
    assert default_users_path() == folder / "users.json"
    monkeypatch.setenv("LOADCHECK_USERS", "")  # an empty value counts as unset
    assert default_users_path() == folder / "users.json"


def test_an_old_variable_set_to_another_file_is_refused_naming_both(tmp_path, monkeypatch):
    monkeypatch.setenv("OLD_NAME", str(tmp_path / "a"))
    monkeypatch.delenv("NEW_NAME", raising=False)
    with pytest.raises(InputError) as raised:
        user_file("NEW_NAME", "x.json", old_variable="OLD_NAME")
    (problem,) = raised.value.problems
    assert problem.field == "$OLD_NAME" and "NEW_NAME" in problem.message and problem.value == str(tmp_path / "a")
    monkeypatch.setenv("NEW_NAME", str(tmp_path / "b"))
    with pytest.raises(InputError, match="different files"):
        user_file("NEW_NAME", "x.json", old_variable="OLD_NAME")
    monkeypatch.setenv("NEW_NAME", str(tmp_path / "a"))  # both name the same file: nothing is passed over
    assert user_file("NEW_NAME", "x.json", old_variable="OLD_NAME") == tmp_path / "a"


def test_log_path_records_only_when_asked_and_refuses_db_without_it(tmp_path, monkeypatch):
    monkeypatch.setenv("LOADCHECK_LOG", str(tmp_path / "env.sqlite3"))
    assert log_path(False, None) is None
    assert log_path(True, None) == tmp_path / "env.sqlite3"
    assert log_path(True, tmp_path / "given.sqlite3") == tmp_path / "given.sqlite3"
    with pytest.raises(InputError) as raised:
        log_path(False, tmp_path / "given.sqlite3")
    assert raised.value.problems[0].field == "--db"


def test_the_check_logs_names_are_the_same_functions():
    from loadcheck import checklog
    from loadcheck.web import users

    assert checklog.default_path is default_log_path and checklog.log_path is log_path
    assert users.default_users_path is default_users_path


def test_asking_where_the_log_is_loads_neither_sqlite_nor_the_check_log():
    code = (
        "import sys; from loadcheck.userdata import log_path\n"
        "assert log_path(False, None) is None\n"
        "print(sorted(m for m in ('sqlite3', 'loadcheck.checklog', 'platformdirs') if m in sys.modules))"
    )
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert done.stdout.strip() == "[]", done.stdout + done.stderr
