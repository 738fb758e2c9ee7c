#!/bin/sh
# tui_smoke.sh drives the real isofield binary in tmux through a review:
# open a survey, move the cursor, toggle layers, jump to a zone, exclude a
# reading, change the contour interval, quit. It checks each screen with
# capture-pane, that the session file holds the edit, that the input file
# is unchanged and that the terminal left the alternate screen. Then it
# opens the built-in demo at 80×24 under NO_COLOR: it prints how long the
# first map took, moves the cursor while the full grid is computed, checks
# that no colour reaches the screen and pages through the help.
#
# Usage: testdata/tui_smoke.sh (from the module root). Needs tmux; exits 0
# with a note when tmux is missing. The survey is invented: two point
# currents in a half-space, V = ρI/(2π√(r²+d²)) (Telford et al., Applied
# Geophysics, ch. 8), on a fictional yard.
set -eu

if ! command -v tmux >/dev/null 2>&1; then
	echo "tui_smoke: tmux not installed, skipped"
	exit 0
fi

root=$(cd "$(dirname "$0")/.." && pwd)
work=$(mktemp -d)
sock="isofield-smoke-$$"
session=smoke
cleanup() {
	tmux -L "$sock" kill-server >/dev/null 2>&1 || true
	rm -rf "$work"
}
trap cleanup EXIT INT TERM

fail() {
	echo "tui_smoke: FAIL: $*" >&2
	echo "---- last screen ----" >&2
	tmux -L "$sock" capture-pane -p -t "$session" >&2 || true
	exit 1
}

(cd "$root" && go build -o "$work/isofield" ./cmd/isofield) || fail "build"

# Readings every 2 m on a 40 m × 20 m yard, in millivolts.
awk 'BEGIN {
	print "id,x_m,y_m,potential_mV"
	pi = atan2(0, -1)
	for (j = 0; j <= 10; j++) for (i = 0; i <= 20; i++) {
		x = 2 * i; y = 2 * j; v = 0
		v += 100 * 0.5 / (2 * pi * sqrt((x-12)^2 + (y-10)^2 + 1.5^2))
		v -= 100 * 0.5 / (2 * pi * sqrt((x-28)^2 + (y-10)^2 + 1.5^2))
		printf "P%02d-%02d,%d,%d,%.1f\n", j, i, x, y, 1000 * v
	}
}' >"$work/yard.csv"
before=$(sha256sum "$work/yard.csv" | cut -d' ' -f1)

screen() { tmux -L "$sock" capture-pane -p -t "$session"; }
send() { tmux -L "$sock" send-keys -t "$session" "$@"; }

# wait_for PATTERN [SECONDS]: poll the screen until grep -E finds PATTERN.
wait_for() {
	n=$((${2:-60} * 5))
	while [ "$n" -gt 0 ]; do
		if screen | grep -Eq -- "$1"; then return 0; fi
		sleep 0.2
		n=$((n - 1))
	done
	fail "screen never showed /$1/"
}

# wait_idle: the status line stops saying a run is working.
wait_idle() {
	n=$((${1:-60} * 5))
	while [ "$n" -gt 0 ]; do
		if screen | head -1 | grep -q "readings" && ! screen | head -1 | grep -q "working"; then return 0; fi
		sleep 0.2
		n=$((n - 1))
	done
	fail "the run never finished"
}

tmux -L "$sock" new-session -d -s "$session" -x 100 -y 30 \
	"cd '$work' && env -u CI TERM=xterm-256color ./isofield view --threshold 300 yard.csv; echo ISOFIELD_DONE rc=\$?; sleep 60"

# Open: the map, the readout and the legend appear, in colour. (CI=... in
# the environment makes the terminal library assume no colour, so the
# program runs without it, as it would on a technician's laptop.)
wait_idle 90
esc=$(printf '\033')
tmux -L "$sock" capture-pane -e -p -t "$session" | grep -q "$esc\[[0-9;]*[34]8;" || fail "no colour without NO_COLOR"
screen | grep -q "At cursor" || fail "no readout"
screen | grep -q "Legend" || fail "no legend"
screen | grep -q "N↑" || fail "no north arrow and scale"

# Move: the readout's position changes.
pos0=$(screen | grep "x,y" | head -1)
send l l l k
sleep 0.5
pos1=$(screen | grep "x,y" | head -1)
[ "$pos0" != "$pos1" ] || fail "cursor did not move ($pos0)"

# Layers: field arrows on, then the field magnitude legend.
send 5
wait_for "[→↗↑↖←↙↓↘]" 5
send 2
wait_for "field \|E\|, mV/m" 5
send 2

# Zones: the next zone puts the cursor in zone 1.
send n
wait_for "zone +#1" 5

# Exclude: the first row of the readings table, with a reason.
send t
wait_for "Readings +[0-9]+" 5
send x
wait_for "exclude P00-00" 5
send -l "smoke test"
send Enter
# The regrid with the exclusion starts a moment after the key reaches the
# program, so wait for its outcome rather than for an idle status line
# (which the screen may still show from before the key).
wait_for "^isofield .* 1 excluded" 90
wait_idle 90
screen | head -1 | grep -q "1 excluded" || fail "status does not count the exclusion"
grep -q "smoke test" "$work/yard.csv.isofield.json" || fail "session file lacks the edit"
send Escape

# Interval: settings, third line, 50 mV.
send s
wait_for "Settings" 5
send Down Down Enter C-u
send -l "1000"
send Enter
sleep 0.5
send Escape
wait_for "(^|[^0-9])1000 … 2000" 90
wait_idle 90

# Quit: the program ends cleanly and the terminal leaves the alternate
# screen.
send q
wait_for "ISOFIELD_DONE rc=0" 10
alt=$(tmux -L "$sock" display -p -t "$session" '#{alternate_on}')
[ "$alt" = "0" ] || fail "terminal still on the alternate screen"
after=$(sha256sum "$work/yard.csv" | cut -d' ' -f1)
[ "$before" = "$after" ] || fail "the input file changed"
tmux -L "$sock" kill-session -t "$session"

# The demo at 80×24 with NO_COLOR: the first map appears quickly (the
# figure is printed; more than 5 s fails), keys answer while the full grid
# is computed, and no colour escape reaches the screen.
start=$(date +%s%N)
tmux -L "$sock" new-session -d -s "$session" -x 80 -y 24 \
	"cd '$work' && env -u CI NO_COLOR=1 TERM=xterm-256color ./isofield; echo ISOFIELD_DONE rc=\$?; sleep 60"
wait_for "At cursor" 10
ms=$((($(date +%s%N) - start) / 1000000))
echo "tui_smoke: demo's first map after $ms ms (80x24, process start included)"
[ "$ms" -le 5000 ] || fail "the demo's first map took $ms ms"
pos0=$(screen | grep "x,y" | head -1)
send l
sleep 0.3
[ "$pos0" != "$(screen | grep "x,y" | head -1)" ] || fail "the cursor did not move while gridding"
wait_idle 30
if tmux -L "$sock" capture-pane -e -p -t "$session" | grep -q "$esc\[[0-9;]*[34]8;"; then
	fail "colour on the screen despite NO_COLOR"
fi
send "?"
wait_for "Keys" 5
send "?"
wait_for "Cautions" 5
send q
wait_for "ISOFIELD_DONE rc=0" 10
echo "tui_smoke: ok"
