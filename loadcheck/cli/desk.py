"""The desk's commands: ``serve`` starts the local web service, ``users`` manages its accounts."""

from __future__ import annotations

import sys
from pathlib import Path
from typing import TYPE_CHECKING, Annotated

import typer

from ..errors import InputError, Problem
from .common import DbOpt, _console, app, input_errors

__all__ = ["users_app"]

if TYPE_CHECKING:
    from ..web.users import UserStore

UsersOpt = Annotated[
    Path | None,
    typer.Option(
        "--users", metavar="FILE", help="Accounts file (default: $LOADCHECK_USERS, else the user data folder)."
    ),
]


def _web_installed() -> None:
    """Refuse a desk command, naming what to install, where a package of the ``web`` extra is missing
    (the command stopped with an "internal error" of a module not found). The packages are the
    extra's own, as the installed package's metadata lists them (pyproject.toml, one list)."""
    import importlib.metadata as metadata
    import re

    try:
        wanted = [r for r in metadata.requires("loadcheck") or () if re.search(r"""extra\s*==\s*["']web["']""", r)]
    except metadata.PackageNotFoundError:  # run from a source tree that was never installed: nothing to tell
        return
    missing = []
    for requirement in wanted:
        name = re.match(r"[A-Za-z0-9._-]+", requirement)
        try:
            if name is not None:
                metadata.version(name.group(0))
        except metadata.PackageNotFoundError:
            missing.append(name.group(0) if name is not None else requirement)
    if missing:
        raise InputError(
            Problem(
                "",
                f"the desk needs the web extra, and {', '.join(missing)} {'is' if len(missing) == 1 else 'are'} "
                'not installed: from the repository, pip install -e ".[web]"',
            )
        )


def _store(users: Path | None) -> UserStore:
    from ..userdata import default_users_path
    from ..web.users import UserStore

    _web_installed()

    return UserStore(users if users is not None else default_users_path())


@app.command(short_help="The flight school's desk: a local web service.")
@input_errors
def serve(
    fleet: Annotated[Path, typer.Argument(metavar="FLEET_DIR", help="Fleet folder (aircraft files).")],
    db: DbOpt = None,
    users: UsersOpt = None,
    host: Annotated[
        str, typer.Option(metavar="ADDRESS", help="Address to listen on (loopback unless --allow-remote).")
    ] = "127.0.0.1",
    port: Annotated[int, typer.Option(min=1, max=65535, metavar="PORT", help="Port.")] = 8400,
    allow_remote: Annotated[
        bool, typer.Option("--allow-remote", help="Listen on a non-loopback address (put it behind TLS).")
    ] = False,
) -> None:
    """Start the flight school's desk: a local web service for pilots, dispatcher and mechanic.

    Example:

      loadcheck serve sample_aircraft --port 8400
    """
    _web_installed()
    from ..web.security import bind_caution

    caution = bind_caution(host, allow_remote)
    import uvicorn

    from ..userdata import default_log_path
    from ..web import create_app

    db = db or default_log_path()  # the command line's check log; the old variable, refused, stops here
    application = create_app(fleet, db=db, users=users, https_only=False)
    err = _console(stderr=True)
    if caution:
        err.print(caution, markup=False)
    err.print(f"the desk: http://{host}:{port}/ · fleet {fleet} · check log {db}", markup=False)
    uvicorn.run(application, host=host, port=port, log_level="warning", server_header=False)


users_app = typer.Typer(
    short_help="The desk's accounts.",
    help="The desk's accounts: each with one or more roles (pilot, dispatcher, mechanic).",
    no_args_is_help=True,
)
app.add_typer(users_app, name="users")

RoleOpt = Annotated[
    list[str], typer.Option("--role", "-r", metavar="ROLE", help="pilot, dispatcher or mechanic; repeat for several.")
]
StdinOpt = Annotated[bool, typer.Option("--password-stdin", help="Read the password from standard input (one line).")]


def _password(from_stdin: bool) -> str:
    if from_stdin:
        return sys.stdin.readline().rstrip("\r\n")
    if not sys.stdin.isatty():
        raise InputError(
            Problem(
                "--password-stdin", "standard input is not a terminal: give --password-stdin and the password on it"
            )
        )
    return str(typer.prompt("Password", hide_input=True, confirmation_prompt=True))


@users_app.command("add")
@input_errors
def users_add(
    name: Annotated[str, typer.Argument(metavar="NAME", help="Account name.")],
    role: RoleOpt = [],  # noqa: B006
    password_stdin: StdinOpt = False,
    users: UsersOpt = None,
) -> None:
    """Add an account (the password is stored only as an argon2 hash).

    Example:

      echo 'a long pass phrase' | loadcheck users add robin --role pilot --password-stdin
    """
    store = _store(users)
    account = store.add(name, _password(password_stdin), role)
    _console(stderr=True).print(f"account {account.name} added: {', '.join(account.roles)}", markup=False)


@users_app.command("list")
@input_errors
def users_list(users: UsersOpt = None) -> None:
    """List the accounts and their roles."""
    for account in _store(users).accounts():
        typer.echo(f"{account.name}\t{', '.join(account.roles)}")


@users_app.command("remove")
@input_errors
def users_remove(
    name: Annotated[str, typer.Argument(metavar="NAME", help="Account name.")], users: UsersOpt = None
) -> None:
    """Remove an account (its recorded checks stay in the record)."""
    _store(users).remove(name)
    _console(stderr=True).print(f"account {name} removed", markup=False)


@users_app.command("passwd")
@input_errors
def users_passwd(
    name: Annotated[str, typer.Argument(metavar="NAME", help="Account name.")],
    password_stdin: StdinOpt = False,
    users: UsersOpt = None,
) -> None:
    """Give an account a new password."""
    _store(users).set_password(name, _password(password_stdin))
    _console(stderr=True).print(f"password of {name} changed", markup=False)
