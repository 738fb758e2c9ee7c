package tui

import (
	"fmt"
	"strings"
	"testing"

	"github.com/charmbracelet/lipgloss"
)

// TestHelpLineFits draws the short help of every screen and state at
// widths from 80 to 200 columns, in colour and without: it never exceeds
// the width, always starts with the key to the full help, and shows as
// many keys as fit (one more would not).
func TestHelpLineFits(t *testing.T) {
	states := []struct {
		name string
		keys []string
		prep func(Model) Model
	}{
		{"map", nil, nil},
		{"map running", nil, func(m Model) Model { m.running = true; return m }},
		{"zones", []string{"z"}, nil},
		{"table", []string{"t"}, nil},
		{"profile", []string{"p"}, nil},
		{"settings", []string{"s"}, nil},
		{"typing", []string{"s", "down", "enter"}, nil},
		{"prompt", []string{"t", "x"}, nil},
	}
	for _, colour := range []bool{false, true} {
		base := readyModel(t, 80, 24, colour)
		for _, st := range states {
			m := press(t, base, st.keys...)
			if st.prep != nil {
				m = st.prep(m)
			}
			for _, w := range []int{80, 81, 82, 83, 84, 85, 86, 87, 88, 89, 90, 95, 100, 110, 120, 140, 160, 200} {
				m := m
				m.width = w // all the help line reads of the size
				line := m.helpLine()
				name := fmt.Sprintf("%s colour=%v width=%d", st.name, colour, w)
				if lw := lipgloss.Width(line); lw > w {
					t.Errorf("%s: help line %d cells wide: %q", name, lw, line)
				}
				if !m.prompting && !m.settings.Editing() && !strings.HasPrefix(line, m.styles.Help.ShortKey.Render("?")) {
					t.Errorf("%s: help line %q does not start with ?", name, line)
				}
				if strings.HasSuffix(line, "…") {
					bs := m.helpKeys()
					shown := strings.Count(line, m.help.ShortSeparator) + 1
					h := m.help
					h.Width = 0
					if shown < len(bs) && lipgloss.Width(h.ShortHelpView(bs[:shown+1])) <= w-2 {
						t.Errorf("%s: %d keys shown, %d would fit", name, shown, shown+1)
					}
				}
			}
		}
	}
}

// TestSmallTerminals draws every screen on terminals smaller than the
// 80×24 the layout is made for: nothing may fail while drawing, and no
// line may be wider than the terminal.
func TestSmallTerminals(t *testing.T) {
	for _, keys := range [][]string{nil, {"z"}, {"t"}, {"p"}, {"s"}, {"?"}, {"?", "?"}, {"t", "x"}} {
		base := press(t, readyModel(t, 80, 24, true), keys...)
		for _, size := range [][2]int{{20, 8}, {40, 12}, {60, 16}, {79, 23}} {
			m := base.resize(size[0], size[1])
			out := m.View()
			if strings.Contains(out, "internal error") {
				t.Fatalf("keys %v at %dx%d: %s", keys, size[0], size[1], out)
			}
			for i, l := range strings.Split(out, "\n") {
				if lw := lipgloss.Width(l); lw > size[0] {
					t.Errorf("keys %v at %dx%d: line %d is %d cells wide", keys, size[0], size[1], i, lw)
					break
				}
			}
		}
	}
}
