"""Reading and writing files (loadcheck/files.py): the atomic write's own rules.

What every command that writes keeps whole through a crash, a full disk, a symlink or a FIFO
is the cross-cutting suite tests/test_writes.py; here ``write_atomic`` alone (common practice:
the replace-by-rename write, a new file created with the process umask, an existing file's
permissions kept).
"""

from __future__ import annotations

import pytest

import loadcheck.files as files_module
from loadcheck.errors import FileFormatError


def test_write_atomic_refuses_a_folder(tmp_path):
    with pytest.raises(FileFormatError, match="is a folder"):
        files_module.write_atomic(tmp_path, "x")


@pytest.mark.parametrize("umask, mode", [(0o022, 0o644), (0o077, 0o600), (0o002, 0o664)])
def test_new_files_follow_the_umask(tmp_path, umask, mode):
    import os

    old = os.umask(umask)
    try:
        files_module.write_atomic(tmp_path / "new.html", "x")
    finally:
        os.umask(old)
    assert (tmp_path / "new.html").stat().st_mode & 0o777 == mode


def test_an_existing_file_keeps_its_permissions(tmp_path):
    import os

    path = tmp_path / "kept.csv"
    path.write_text("old")
    os.chmod(path, 0o640)
    files_module.write_atomic(path, "new")
    assert path.stat().st_mode & 0o777 == 0o640 and path.read_text() == "new"
