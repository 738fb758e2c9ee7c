package tui

import (
	"fmt"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

func keyMsg(s string) tea.KeyMsg {
	switch s {
	case "enter":
		return tea.KeyMsg{Type: tea.KeyEnter}
	case "esc":
		return tea.KeyMsg{Type: tea.KeyEsc}
	case "up":
		return tea.KeyMsg{Type: tea.KeyUp}
	case "down":
		return tea.KeyMsg{Type: tea.KeyDown}
	case "left":
		return tea.KeyMsg{Type: tea.KeyLeft}
	case "right":
		return tea.KeyMsg{Type: tea.KeyRight}
	case "ctrl+c":
		return tea.KeyMsg{Type: tea.KeyCtrlC}
	case "backspace":
		return tea.KeyMsg{Type: tea.KeyBackspace}
	}
	return tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(s)}
}

// press applies keys in order. A command a key returns is run when it
// answers at once with a jump or a settings change (never a pipeline run),
// and its message is applied too.
func press(t testing.TB, m Model, keys ...string) Model {
	t.Helper()
	for _, k := range keys {
		next, cmd := m.Update(keyMsg(k))
		m = next.(Model)
		if cmd == nil {
			continue
		}
		switch msg := cmd().(type) {
		case jumpMsg, applyMsg:
			m = update1(t, m, msg)
		}
	}
	return m
}

func TestViewGolden(t *testing.T) {
	screens := []struct {
		name string
		keys []string
	}{
		{"map", nil},
		{"layers", []string{"2", "5", "7"}},
		{"fine", []string{"f"}},
		{"zones", []string{"z", "down", "enter"}},
		{"table", []string{"t", "o", "o", "o", "o", "o", "r"}},
		{"profile", []string{"h", "h", "h", "h", "h", "h", "h", "h", "m", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "l", "m", "p"}},
		{"settings", []string{"s", "down"}},
		{"help", []string{"?"}},
		{"cautions", []string{"?", "?"}},
		{"prompt", []string{"t", "x", "w", "e", "t"}},
	}
	for _, size := range [][2]int{{80, 24}, {120, 40}} {
		for _, colour := range []bool{false, true} {
			for _, sc := range screens {
				name := fmt.Sprintf("%s_%dx%d_%s", sc.name, size[0], size[1], map[bool]string{false: "mono", true: "colour"}[colour])
				t.Run(name, func(t *testing.T) {
					m := readyModel(t, size[0], size[1], colour)
					m = press(t, m, sc.keys...)
					out := m.View()
					checkFits(t, out, size[0], size[1])
					golden(t, name+".golden", out)
				})
			}
		}
	}
}

// checkFits fails when the screen is not exactly h lines of at most w
// cells.
func checkFits(t *testing.T, out string, w, h int) {
	t.Helper()
	lines := strings.Split(out, "\n")
	if len(lines) != h {
		t.Errorf("screen has %d lines, want %d", len(lines), h)
	}
	for i, l := range lines {
		if lw := lipgloss.Width(l); lw > w {
			t.Errorf("line %d is %d cells wide, want ≤ %d: %q", i, lw, w, l)
		}
	}
}

// BenchmarkView draws whole frames (map, readout, legend, status, help)
// with the cursor moving, in colour, by terminal size.
func BenchmarkView(b *testing.B) {
	for _, size := range [][2]int{{80, 24}, {120, 40}, {200, 60}} {
		b.Run(fmt.Sprintf("size=%dx%d", size[0], size[1]), func(b *testing.B) {
			m := readyModel(b, size[0], size[1], true)
			b.ReportAllocs()
			for i := 0; b.Loop(); i++ {
				k := "l"
				if i%40 >= 20 {
					k = "h"
				}
				m = press(b, m, k)
				_ = m.View()
			}
		})
	}
}
