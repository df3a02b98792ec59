"""Tests of loadcheck/render/listing.py: long listings as plain aligned text (common practice:
columns padded to their widest cell, nothing cut or wrapped)."""

from __future__ import annotations

import pytest


def test_a_plain_listing_refuses_columns_of_unequal_length():
    import io

    from loadcheck.render.listing import plain_columns

    out = io.StringIO()
    plain_columns(out, "t", ("A", "B"), [["1", "22"], ["x", ""]], right=(0,))
    assert out.getvalue().splitlines() == ["t", " A  B", "--  -", " 1  x", "22"]
    with pytest.raises(ValueError, match="as long"):
        plain_columns(io.StringIO(), "t", ("A", "B"), [["1", "2"], ["x"]])
