#!/bin/sh
# report_check.sh: open isofield's survey report in headless Chromium and
# check that it renders offline with every image loaded and no script
# error; keep a screenshot and a printed PDF as artefacts.
#
# Usage: testdata/report_check.sh [ARTEFACT_DIR]
# Run from anywhere. Artefacts (report.png, report.pdf, report.html) go to
# ARTEFACT_DIR, default $TMPDIR/isofield-report-check. Exits 0 (skipped)
# when no Chromium is installed, 1 when a check fails.
#
# Input: survey/export/testdata/pad.csv, an invented survey: the
# surface potential in mV of two point current sources in a homogeneous
# half-space, V = rho*I/(2*pi*R) (image method; Telford, Geldart & Sheriff,
# Applied Geophysics, 1990, ch. 8), rho*I = +200 and -150 V*m at (12, 9)
# depth 2 m and (28, 21) depth 3 m, on a 2.5 m lattice.
set -eu

here=$(cd "$(dirname "$0")" && pwd)
chrome=
for c in chromium chromium-browser google-chrome; do
	if command -v "$c" >/dev/null 2>&1; then chrome=$c; break; fi
done
if [ -z "$chrome" ]; then
	echo "report_check: no Chromium installed; skipped"
	exit 0
fi

art=${1:-${TMPDIR:-/tmp}/isofield-report-check}
mkdir -p "$art"
work=$(mktemp -d)
profile=$(mktemp -d)
trap 'rm -rf "$work" "$profile"' EXIT

cd "$here/.."
go build -o "$work/isofield" ./cmd/isofield
cp survey/export/testdata/pad.csv "$work/pad.csv"
"$work/isofield" report --threshold 600 --suggest 5 -o "$work/report.html" "$work/pad.csv"

# A page that loads the report in a frame and writes what it finds into
# its own title: images that did not decode, and the report's scripts.
cat >"$work/check.html" <<'HTML'
<!DOCTYPE html><html><head><title>pending</title></head><body>
<iframe id="r" src="report.html" style="width:1200px;height:900px"></iframe>
<script>
document.getElementById("r").onload = function () {
  var d = this.contentDocument, bad = 0, imgs = d.images;
  for (var i = 0; i < imgs.length; i++) {
    if (!imgs[i].complete || imgs[i].naturalWidth === 0) bad++;
  }
  document.title = "images=" + imgs.length + " missing=" + bad +
    " scripts=" + d.scripts.length + " sections=" + d.querySelectorAll("section").length;
};
</script></body></html>
HTML

flags="--headless --no-sandbox --disable-gpu --disable-quic --no-first-run
 --disable-background-networking --disable-component-update --disable-sync
 --user-data-dir=$profile"

# shellcheck disable=SC2086
"$chrome" $flags --allow-file-access-from-files --virtual-time-budget=15000 \
	--enable-logging=stderr --v=0 --dump-dom "file://$work/check.html" \
	>"$work/dom.html" 2>"$work/chrome.log" || true
title=$(sed -n 's:.*<title>\(.*\)</title>.*:\1:p' "$work/dom.html" | head -n 1)
echo "report_check: $title"

fail=0
case "$title" in
	images=0*|pending|"") echo "report_check: FAIL: the report did not load"; fail=1 ;;
	*" missing=0 scripts=0 "*) ;;
	*) echo "report_check: FAIL: missing images or unexpected scripts"; fail=1 ;;
esac
if grep -E "Uncaught|Failed to load resource|ERR_FILE_NOT_FOUND" "$work/chrome.log"; then
	echo "report_check: FAIL: Chromium reported script or loading errors"
	fail=1
fi

# shellcheck disable=SC2086
"$chrome" $flags --window-size=1200,2400 --screenshot="$art/report.png" \
	"file://$work/report.html" >/dev/null 2>&1 || { echo "report_check: FAIL: no screenshot"; fail=1; }
# shellcheck disable=SC2086
"$chrome" $flags --no-pdf-header-footer --print-to-pdf="$art/report.pdf" \
	"file://$work/report.html" >/dev/null 2>&1 || { echo "report_check: FAIL: no PDF"; fail=1; }
# The page tree's root holds the largest /Count (page objects themselves
# may sit in compressed object streams).
pages=$(grep -a -o '/Count [0-9]*' "$art/report.pdf" 2>/dev/null | awk '$2 > m { m = $2 } END { print m + 0 }')
echo "report_check: printed $pages A4 pages"
[ "$pages" -ge 2 ] || { echo "report_check: FAIL: the printed report has no pages"; fail=1; }
cp "$work/report.html" "$art/report.html"
echo "report_check: artefacts in $art"
exit $fail
