"""The flight school's desk: a local web service over loadcheck's library jobs.

Pilots check and record loadings and plan fuel or payload; the dispatcher watches every
recorded check, verifies and exports them; the mechanic makes a new empty-weight record
from a weighing or an alteration. The same engine, fleet folder and check log as the
command line. The web stack (FastAPI, Jinja2, argon2) is imported only from this package,
and only when the desk is started; see docs/web.md.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

__all__ = ["create_app"]

if TYPE_CHECKING:
    from fastapi import FastAPI

    from .app import create_app  # the signature and the FastAPI answer, for the type checker
else:

    def create_app(*args: object, **kwargs: object) -> FastAPI:
        """The desk's ASGI application (:func:`loadcheck.web.app.create_app`); the web stack imported on first call."""
        from .app import create_app as make

        return make(*args, **kwargs)
