#!/usr/bin/env bash
# Regenerate the pictures in docs/images from the real output of loadcheck.
# Needs loadcheck on the path (or PYTHONPATH set to the repository), and for the load sheet
# Chromium and poppler-utils (pdftoppm).
set -euo pipefail
cd "$(dirname "$0")/../.."
lc=(python3 -m loadcheck)
"${lc[@]}" check sample_aircraft/twin6/leaves_path.toml --chart docs/images/twin-leaves-path.png >/dev/null || [ $? -eq 1 ]
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
"${lc[@]}" check sample_aircraft/twin6/leaves_path.toml --sheet "$work/sheet.html" >/dev/null || [ $? -eq 1 ]
sed 's/@page { size: auto;/@page { size: letter;/' "$work/sheet.html" > "$work/sheet-letter.html"
browser=$(command -v chromium || command -v chromium-browser || command -v google-chrome)
"$browser" --headless --no-sandbox --disable-gpu --no-pdf-header-footer --print-to-pdf="$work/sheet.pdf" \
    "file://$work/sheet-letter.html" 2>/dev/null
pdftoppm -png -r 90 -singlefile "$work/sheet.pdf" docs/images/load-sheet-letter
# the desk's screenshots (docs/web.md), from the browser tests on the sample fleet (Playwright and Chromium)
DESK_SCREENSHOTS=docs/images python3 -m pytest -q -p no:cacheprovider --long tests/test_web_browser.py  # --long: the slow journeys too
