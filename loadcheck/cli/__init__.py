"""The ``loadcheck`` command line: one module per user (pilot, mechanic, dispatcher).

Commands parse their arguments, call one library job and render its result; they hold no
arithmetic and no validation of their own. The library never imports this package.
"""

from __future__ import annotations

import gc
import os
import re
import sys
import types
from collections.abc import Callable

_START_UP_OBJECTS = 100_000
"""Objects a command may create before the cycle collector's first pass (start-up: the
imports and the models; a check makes about 40,000)."""


def _collect_after_start_up() -> None:
    """No cycle collection during start-up; the usual collections from the first one on.

    Start-up creates tens of thousands of objects (modules, functions, pydantic's schemas,
    numpy's types) that all live until the process ends: every pass of the collector over
    them (about 80 for a check, 20 ms of CPU) frees nothing. The first generation's
    threshold is raised until the first collection, which comes only once a command has
    created ``_START_UP_OBJECTS`` more objects than it freed (a long command: a fleet
    check, the desk); then the thresholds the process had are back, for the rest of the
    run. A threshold of 0 (collection disabled) or already higher is kept.
    """
    usual = gc.get_threshold()
    if not gc.isenabled() or usual[0] == 0 or usual[0] >= _START_UP_OBJECTS:
        return
    restored = False

    def restore(phase: str, info: dict[str, int]) -> None:
        nonlocal restored
        if not restored:
            restored = True
            gc.set_threshold(*usual)

    gc.callbacks.append(restore)
    gc.set_threshold(_START_UP_OBJECTS, *usual[1:])


_collect_after_start_up()
# The command line's numpy does small products only (the engine keeps large batches on
# one BLAS thread itself): a BLAS thread pool would only spin at start-up. Set before
# numpy loads; a value the user set is kept.
for _name in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_name, "1")
# pydantic looks for plugins among every installed distribution's entry points on the
# first validation (about 10 ms and the import of importlib.metadata); the command line
# uses none. A value the user set is kept.
os.environ.setdefault("PYDANTIC_DISABLE_PLUGINS", "1")


_PLUGINS_OFF = ("1", "true", "__all__")  # the values pydantic reads as "load no plugin"


class _PluginLoaderStandIn(types.ModuleType):
    """Stand-in for pydantic's plugin loader (``pydantic.plugin._loader``): no plugin while
    ``PYDANTIC_DISABLE_PLUGINS`` disables them; otherwise, and for any other name, the real
    loader, loaded then and handed over to."""

    def _real(self) -> types.ModuleType:
        import importlib

        if sys.modules.get(self.__name__) is self:
            del sys.modules[self.__name__]
        return importlib.import_module(self.__name__)

    def get_plugins(self) -> tuple[()] | object:
        """pydantic's ``get_plugins()``: none while plugins are disabled."""
        if os.environ.get("PYDANTIC_DISABLE_PLUGINS") in _PLUGINS_OFF:
            return ()
        return self._real().get_plugins()

    def __getattr__(self, attribute: str) -> object:
        if attribute.startswith("__"):  # the import system asks for __path__, __spec__, ...
            raise AttributeError(attribute)
        return getattr(self._real(), attribute)


def _plugin_loader_without_metadata() -> None:
    """Spare the start-up pydantic's plugin loader when plugins are disabled.

    ``pydantic.plugin._loader`` imports importlib.metadata (about 9 ms, with email and
    zipfile) as it loads, on the first model built, and then, plugins being disabled above,
    returns no plugin without using it. Its stand-in (:class:`_PluginLoaderStandIn`) gives
    the same answer while ``PYDANTIC_DISABLE_PLUGINS`` disables plugins, and otherwise (or
    for any other name) loads the real loader and hands over to it.
    """
    name = "pydantic.plugin._loader"
    if name not in sys.modules:
        sys.modules[name] = _PluginLoaderStandIn(name, _PluginLoaderStandIn.__doc__)


if os.environ.get("PYDANTIC_DISABLE_PLUGINS") in _PLUGINS_OFF:
    _plugin_loader_without_metadata()

import typer  # noqa: E402
from typer.models import CommandInfo  # noqa: E402


def _plain_argument_help() -> None:
    """Help that reads well: an argument shows as its metavar alone (``FILES...``, never
    ``{FILES}`` or ``FILES <list[Path]>``; its help text says what it is). Newer typer
    releases brace a required argument in the usage line and add its Python type beside
    it; the help of every command here names each argument in words instead."""
    import typer.core

    argument = typer.core.TyperArgument
    if hasattr(argument, "_usage_display_name"):

        def usage(self: typer.core.TyperArgument) -> str:
            name = self.metavar or self.name.upper()
            name = name if self.required else f"[{name}]"
            return name + ("..." if self.nargs != 1 else "")

        _replace(argument, _usage_display_name=usage)
    if hasattr(argument, "display_type_rich"):
        _replace(argument, display_type_rich=lambda self, ctx: None)
    option = typer.core.TyperOption
    shown = option.display_type_rich if hasattr(option, "display_type_rich") else None
    if shown is not None:
        words = {"str": "TEXT", "int": "INTEGER", "float": "NUMBER", "path": "PATH"}

        def option_type(self: typer.core.TyperOption, ctx: typer.Context) -> str | None:
            text = shown(self, ctx)
            if self.metavar is not None or text is None:
                return text
            match = re.fullmatch(
                r"<(?:list\[)?([^\]>]+)\]?>(\.\.\.)?", text
            )  # '<path>', '<list[str]>' as 'PATH', 'TEXT'
            return text if match is None else words.get(match.group(1), match.group(1).upper())

        _replace(option, display_type_rich=option_type)


def _replace(cls: type, **methods: Callable[..., object]) -> None:
    """Put ``methods`` in place of a typer class's own (help display only: typer offers no hook for
    it; :func:`_plain_argument_help` checks that each exists first)."""
    for name, method in methods.items():
        setattr(cls, name, method)


_plain_argument_help()

from . import desk, dispatcher, mechanic, pilot  # noqa: E402  (each registers its commands)
from .common import app  # noqa: E402

__all__ = ["app", "main"]

_USERS = [pilot.__name__, mechanic.__name__, dispatcher.__name__, desk.__name__]
# help lists the pilot's commands first, then the mechanic's, then the dispatcher's
app.registered_commands.sort(key=lambda c: _USERS.index(c.callback.__module__))
app.registered_groups.sort(key=lambda g: ["plan", "fleet", "log", "users"].index(g.name or ""))


def _command_name(command: CommandInfo) -> str:
    """A command's name as typed: its own, else its function's with dashes (typer's rule)."""
    if command.name:
        return command.name
    return command.callback.__name__.replace("_", "-") if command.callback is not None else ""


def _just(name: str) -> typer.Typer | None:
    """The application with only the command ``name`` (and the version option), or None.

    typer builds every command of an application each time it starts; building just the
    one asked for keeps a plain ``loadcheck check`` quick to start (benchmarks/startup.py).
    """
    import copy

    small = copy.copy(app)
    small.registered_commands = [c for c in app.registered_commands if _command_name(c) == name]
    small.registered_groups = [g for g in app.registered_groups if g.name == name]
    return small if small.registered_commands or small.registered_groups else None


def main() -> None:
    """Entry point of the console script.

    Output into a pipe that the reader closed early (``loadcheck check ... | head -1``) ends the
    process as any Unix tool ends there, by SIGPIPE: never exit 1 ("limit exceeded") or 2 with
    "internal error" for a result that was not read (common practice).
    """
    import signal

    if hasattr(signal, "SIGPIPE"):
        signal.signal(signal.SIGPIPE, signal.SIG_DFL)
    words = [w for w in sys.argv[1:] if not w.startswith("-")]
    first = sys.argv[1] if len(sys.argv) > 1 else ""
    chosen = _just(words[0]) if words and first == words[0] else None
    try:
        (chosen or app)(prog_name="loadcheck")
    finally:
        # The process ends here. The interpreter's collections at exit would go over every
        # object once more (about 5 % of a check's instructions) only to find what the
        # operating system frees anyway: frozen, they are not traversed. Every file and the
        # check log are closed by then (with blocks); the output streams are flushed at exit.
        gc.freeze()


if __name__ == "__main__":  # pragma: no cover
    main()
