#!/usr/bin/env bash
# Renders a CableFault HTML report in headless Chromium: prints it to PDF and takes a PNG screenshot.
#   tests/report-browser-check.sh REPORT.html OUT_FOLDER [WIDTHxHEIGHT]
# Writes OUT_FOLDER/report.pdf and OUT_FOLDER/report.png. Exit 0 on success, 3 when no chromium is found,
# anything else when chromium failed. Set CABLEFAULT_CHROMIUM to use another executable.
# The tests (tests/CableFault.Tests/Report/BrowserRenderTests.cs) call this script and check both files.
set -euo pipefail
html="${1:?usage: report-browser-check.sh REPORT.html OUT_FOLDER [WIDTHxHEIGHT]}"
out="${2:?usage: report-browser-check.sh REPORT.html OUT_FOLDER [WIDTHxHEIGHT]}"
size="${3:-1200x1800}"
browser="${CABLEFAULT_CHROMIUM:-$(command -v chromium || command -v chromium-browser || true)}"
if [[ -z "$browser" || ! -x "$browser" ]]; then
  echo "chromium not found (Debian: apt-get install -y chromium)" >&2
  exit 3
fi
mkdir -p "$out"
url="file://$(cd "$(dirname "$html")" && pwd)/$(basename "$html")"
profile="$(mktemp -d)"
trap 'rm -rf "$profile"' EXIT
flags=(--headless --no-sandbox --disable-gpu --no-first-run --disable-background-networking
       --disable-component-update --disable-sync --user-data-dir="$profile")
# A hang guard, not a performance check: a report renders in a second or two.
timeout 300 "$browser" "${flags[@]}" --no-pdf-header-footer --print-to-pdf="$out/report.pdf" "$url" >"$out/chromium-pdf.log" 2>&1
timeout 300 "$browser" "${flags[@]}" --hide-scrollbars --window-size="${size/x/,}" --screenshot="$out/report.png" "$url" >"$out/chromium-png.log" 2>&1
test -s "$out/report.pdf" && test -s "$out/report.png"
