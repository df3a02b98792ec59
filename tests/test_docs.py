"""The docs stay true (issue 15, item 9): the file-format reference is written from the models
and every field the models accept is in it; the docs link only to pages that exist."""

from __future__ import annotations

import re
import runpy
from pathlib import Path

import pytest

from loadcheck.aircraft import Aircraft
from loadcheck.loading import Loading

ROOT = Path(__file__).resolve().parent.parent
GENERATOR = runpy.run_path(str(ROOT / "docs" / "file_format_reference.py"))
PAGE = ROOT / "docs" / "file-format.md"


def test_file_format_reference_is_current():
    page = PAGE.read_text(encoding="utf-8")
    assert GENERATOR["updated"](page) == page, "run: python docs/file_format_reference.py"


def _paths(model, prefix=""):
    for name, info in model.model_fields.items():
        key = info.alias or name
        yield f"{prefix}{key}"
        inner, _ = GENERATOR["_model"](info.annotation)
        if inner is not None and inner is not model:
            yield from _paths(inner, f"{prefix}{key}.")


@pytest.mark.parametrize("model", [Aircraft, Loading], ids=["aircraft", "loading"])
def test_every_accepted_field_is_documented(model):
    # regression: seats, controls, [[equipment]], rotorcraft, the group id and the loading's
    # registration, reference and pilot were accepted but not documented
    page = PAGE.read_text(encoding="utf-8")
    rows = set(re.findall(r"^\| (`[^|]+`(?: [a-z_]+)?) \|", page, re.M))
    for path in _paths(model):
        *tables, key = path.split(".")
        if tables:
            assert any(row.endswith(f"` {key}") and tables[-1] in row for row in rows) or any(
                row == f"`[[{path}]]`" or row == f"`[{path}]`" for row in rows), path
        else:
            assert f"`{key}`" in rows or any(f"[{key}]" in row for row in rows), path
    for words in ["seats", "controls", "[[equipment]]", "rotorcraft", "`[[station_group]]` id", "`registration`",
                  "`reference`", "`pilot`"]:
        assert words in page


def test_docs_link_only_to_pages_in_the_repository():
    for page in [ROOT / "README.md", ROOT / "DEVELOPERS.md", *sorted((ROOT / "docs").glob("*.md"))]:
        text = page.read_text(encoding="utf-8")
        for target in re.findall(r"\]\(([^)#]+)(?:#[^)]*)?\)", text):
            if re.match(r"^[a-z]+:", target):
                continue
            assert (page.parent / target).exists(), f"{page.name} links to {target}, which is not in the repository"
        assert "DESIGN.md" not in text or page.name == "DEVELOPERS.md", f"{page.name} cites a page outside the repository"
