"""An older commit's code and the samples as it reads them, for the benchmarks that time it side by side.

Not a benchmark: imported by single.py, startup.py and checklog.py (``--old``).
"""

from __future__ import annotations

import re
import subprocess
import sys
import tarfile
from io import BytesIO
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent

__all__ = ["ROOT", "extract", "samples_for_old"]


def extract(commit: str, folder: Path, name: str = "loadcheck") -> Path:
    """The package as it was at ``commit``, extracted (``git archive``) to ``folder/name``.

    Under another ``name`` than ``loadcheck`` it can be imported beside this checkout's
    package, in one process; under its own name, run it with ``folder`` first on the path.
    """
    archive = subprocess.run(
        ["git", "-C", str(ROOT), "archive", commit, "loadcheck"], capture_output=True, check=True
    ).stdout
    with tarfile.open(fileobj=BytesIO(archive)) as tar:
        tar.extractall(folder, filter="data")
    if name != "loadcheck":
        (folder / "loadcheck").rename(folder / name)
    return folder / name


def samples_for_old(folder: Path, package: Path) -> Path:
    """The sample folder as the older ``package`` reads it, in a copy at ``folder/samples_old``
    (returned): each key renamed since (``files.RENAMED_KEYS``) that the older code does not
    know (its source never names it) is written under its old name; a commit made after the
    rename gets the samples as they are."""
    sys.path.insert(0, str(ROOT))
    from loadcheck.files import RENAMED_KEYS

    source_text = "\n".join(path.read_text(encoding="utf-8") for path in package.rglob("*.py"))
    renamed = {old: new for old, new in RENAMED_KEYS.items() if not re.search(rf"\b{new}\b", source_text)}
    target = folder / "samples_old"
    for source in (ROOT / "sample_aircraft").rglob("*"):
        if not source.is_file():
            continue
        copy = target / source.relative_to(ROOT / "sample_aircraft")
        copy.parent.mkdir(parents=True, exist_ok=True)
        if source.suffix != ".toml":
            copy.write_bytes(source.read_bytes())  # the fleet days' CSV files, as they are
            continue
        text = source.read_text(encoding="utf-8")
        for old_key, new_key in renamed.items():
            text = re.sub(rf"^{new_key}\b", old_key, text, flags=re.M)
        copy.write_text(text, encoding="utf-8")
    return target
