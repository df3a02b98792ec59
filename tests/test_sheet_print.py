"""The load sheet printed through a headless browser fits one page of US letter and of A4
(issue 15, item 3), with everything on it.

The page's own stylesheet says ``@page { size: auto }`` (the printer's paper); each test
sets the paper size the way a print dialog would, prints to PDF with Chromium, and reads the
PDF back with poppler's pdfinfo and pdftotext. Skipped where no browser or poppler is
installed (.ci/run installs both).
"""

from __future__ import annotations

import re
import shutil
import subprocess

import pytest

from loadcheck import check_loading, load_check_inputs
from loadcheck.caution import PILOT_CAUTION
from loadcheck.cli import app
from loadcheck.display import fmt

from .helpers import sample

BROWSER = next((shutil.which(n) for n in ("chromium", "chromium-browser", "google-chrome") if shutil.which(n)), None)
POPPLER = shutil.which("pdfinfo") and shutil.which("pdftotext")
pytestmark = pytest.mark.skipif(
    not (BROWSER and POPPLER), reason="needs Chromium and poppler-utils (pdfinfo, pdftotext)"
)

# paper: (CSS size, pdfinfo's size in points); ISO 216 A4 is 210 x 297 mm, US letter 8.5 x 11 in
PAPERS = {"letter": ("letter", (612.0, 792.0)), "A4": ("A4", (595.3, 841.9))}
OTHERS = [
    "twin6/leaves_path.toml",
    "trainer4/over_weight.toml",
    "heli2/solo_heavy_right.toml",
    "tandem2/aft_heavy.toml",
]
# one sheet prints in the default run; the other sheets (a headless browser each) with --long
SHEETS = ["trainer4/within.toml", *(pytest.param(n, marks=pytest.mark.slow) for n in OTHERS)]


def _print(html_path, pdf_path):
    subprocess.run(
        [
            BROWSER,
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--no-pdf-header-footer",
            f"--print-to-pdf={pdf_path}",
            html_path.as_uri(),
        ],
        check=True,
        capture_output=True,
        timeout=120,
    )


def _printed(html, tmp_path, paper):
    """The sheet printed on a paper of PAPERS: (pdfinfo's report, the PDF's text with its spaces folded)."""
    page = tmp_path / f"sheet-{paper}.html"
    page.write_text(html.replace("@page { size: auto;", f"@page {{ size: {PAPERS[paper][0]};"))
    pdf = tmp_path / f"sheet-{paper}.pdf"
    _print(page, pdf)
    info = subprocess.run(["pdfinfo", str(pdf)], capture_output=True, text=True, check=True).stdout
    text = " ".join(
        subprocess.run(
            ["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True
        ).stdout.split()
    )
    return info, text


@pytest.mark.parametrize("name", SHEETS)
def test_sheet_prints_on_one_page_of_letter_and_of_a4(runner, tmp_path, name):
    sheet = tmp_path / "sheet.html"
    result = runner.invoke(app, ["check", str(sample(name)), "--sheet", str(sheet)])
    assert result.exit_code in (0, 1), result.output
    html = sheet.read_text()
    assert "@page { size: auto;" in html
    inputs = load_check_inputs(sample(name))
    check = check_loading(inputs.aircraft, inputs.loading)
    for paper, (css, (width, height)) in PAPERS.items():
        page = tmp_path / f"sheet-{paper}.html"
        page.write_text(html.replace("@page { size: auto;", f"@page {{ size: {css};"))
        pdf = tmp_path / f"sheet-{paper}.pdf"
        _print(page, pdf)
        info = subprocess.run(["pdfinfo", str(pdf)], capture_output=True, text=True, check=True).stdout
        assert re.search(r"^Pages:\s+1$", info, re.M), f"{name} on {paper}:\n{info}"
        size = re.search(r"Page size:\s+([\d.]+) x ([\d.]+) pts", info)
        assert (
            size
            and float(size.group(1)) == pytest.approx(width, abs=1)
            and float(size.group(2)) == pytest.approx(height, abs=1)
        )
        text = " ".join(
            subprocess.run(
                ["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True
            ).stdout.split()
        )
        for words in [
            "Total at ramp",
            "Fuel plan",
            "Occupants",
            "Conditions",
            "Findings",
            "Envelope",
            "Pilot in command",
            "Signature",
            "Date",
            check.aircraft.fingerprint,
            " ".join(PILOT_CAUTION.split()[:8]),
            "WITHIN LIMITS" if check.ok else "OUT OF LIMITS",
        ]:
            assert words in text, f"{words!r} missing on the {paper} page of {name}"
        ramp = check.condition("ramp")
        assert fmt(ramp.weight, check.units.mass, with_unit=False) in text


def test_sheet_with_the_longest_names_still_prints_on_one_page(runner, tmp_path):
    """Names at every seat, each as long as a loading allows (loadcheck.loading.MAX_NAME_LENGTH), on the
    desk's invented trip test aircraft: the sheet stays on one page of letter and of A4 with each name on it."""
    from loadcheck.loading import MAX_NAME_LENGTH

    from .web_helpers import TRIP_AIRCRAFT

    (tmp_path / "aircraft.toml").write_text(TRIP_AIRCRAFT)
    names = {
        "front": ("Alexandra Wilhelmina " * 4)[:MAX_NAME_LENGTH],
        "rear": ("Bartholomew Okonkwo-Smith " * 3)[:MAX_NAME_LENGTH],
    }
    loading = tmp_path / "named.toml"
    loading.write_text(
        'format = 1\naircraft = "aircraft.toml"\n[load]\nfront = 340\nrear = 150\nbags = 40\n[fuel]\n'
        'main = "local"\n[burn]\ntaxi = 1\ntrip = 10\n[names]\n' + "".join(f'{k} = "{v}"\n' for k, v in names.items())
    )
    sheet = tmp_path / "sheet.html"
    assert runner.invoke(app, ["check", str(loading), "--sheet", str(sheet)]).exit_code == 0
    html = sheet.read_text()
    for paper in PAPERS:
        info, text = _printed(html, tmp_path, paper)
        assert re.search(r"^Pages:\s+1$", info, re.M), f"named sheet on {paper}:\n{info}"
        for name in names.values():
            assert name.strip().split()[-1] in text and name.split()[0] in text, (paper, name)
