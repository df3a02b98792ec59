"""Shell completion (issue 15, item 6): the options exist and the shell is answered."""

from __future__ import annotations

import os
import subprocess
import sys

import pytest

from loadcheck.cli import app

from .helpers import SAMPLES


def test_completion_options_are_offered(runner):
    text = runner.invoke(app, ["--help"]).output
    assert "--install-completion" in text and "--show-completion" in text


@pytest.mark.parametrize("shell", ["bash", "zsh", "fish"])
def test_show_completion_prints_the_script_for_the_shell_named(runner, shell, monkeypatch):
    # with shellingham installed (a dependency of typer's), --show-completion is a flag and the shell is
    # detected from the parent processes: the test names the shell it stands in, so that it says the same on
    # every machine (it failed where the tests ran under no shell it knows: "Shell  not supported.")
    import typer.completion

    monkeypatch.setattr(typer.completion, "_get_shell_name", lambda: shell)
    result = runner.invoke(app, ["--show-completion"])
    assert result.exit_code == 0, result.output
    assert "_LOADCHECK_COMPLETE" in result.output  # the script calls loadcheck back with this variable


def _completion(env_extra):
    env = {**os.environ, "PYTHONPATH": str(SAMPLES.parent), **env_extra}
    return subprocess.run(
        [sys.executable, "-m", "loadcheck"], capture_output=True, text=True, env=env, check=False, cwd=SAMPLES.parent
    )


@pytest.mark.parametrize(
    "shell, words",
    [
        ("bash", "complete -o default -F _loadcheck_completion loadcheck"),
        ("zsh", "#compdef loadcheck"),
        ("fish", "complete --command loadcheck"),
    ],
)
def test_a_script_for_each_shell(shell, words):
    # what --install-completion writes, asked for by name
    done = _completion({"_LOADCHECK_COMPLETE": f"source_{shell}"})
    assert done.returncode == 0, done.stderr
    assert words in done.stdout and "_LOADCHECK_COMPLETE" in done.stdout


@pytest.mark.parametrize(
    "words, cword, expected",
    [
        ("loadcheck ch", 1, "check"),
        ("loadcheck plan f", 2, "fuel"),
        ("loadcheck check --ca", 2, "--category"),
        ("loadcheck fleet c", 2, "check"),
    ],
)
def test_the_shell_gets_the_completions(words, cword, expected):
    # what bash does on TAB: call the program with the words typed so far
    done = _completion({"_LOADCHECK_COMPLETE": "complete_bash", "COMP_WORDS": words, "COMP_CWORD": str(cword)})
    assert done.returncode == 0, done.stderr
    assert expected in done.stdout.split()
