package tui

import (
	"fmt"
	"strings"
	"testing"
	"time"

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

// press applies keys in order. The messages of a command a key returns
// are applied when they come at once and are a jump or a settings change
// (a pipeline run or a timer never answers at once, and is dropped).
func press(t testing.TB, m Model, keys ...string) Model {
	t.Helper()
	for _, k := range keys {
		next, cmd := m.Update(keyMsg(k))
		m = next.(Model)
		for _, msg := range quickMessages(cmd) {
			switch msg.(type) {
			case jumpMsg, applyMsg:
				m = update1(t, m, msg)
			}
		}
	}
	return m
}

// quickMessages runs cmd and the commands of its batches, returning the
// messages that arrive within a few milliseconds.
func quickMessages(cmd tea.Cmd) []tea.Msg {
	if cmd == nil {
		return nil
	}
	done := make(chan tea.Msg, 1)
	go func() { done <- cmd() }()
	select {
	case msg := <-done:
		if b, ok := msg.(tea.BatchMsg); ok {
			var out []tea.Msg
			for _, c := range b {
				out = append(out, quickMessages(c)...)
			}
			return out
		}
		return []tea.Msg{msg}
	case <-time.After(20 * time.Millisecond):
		return nil
	}
}

func TestViewGolden(t *testing.T) {
	screens := []struct {
		name string
		prep func(testing.TB, Model) Model // before the keys (nil: none)
		keys []string
	}{
		{"map", nil, nil},
		{"layers", nil, []string{"2", "5", "7"}},
		{"fine", nil, []string{"f"}},
		{"zones", nil, []string{"z", "down", "enter"}},
		{"table", nil, []string{"t", "o", "o", "o", "o", "o", "r"}},
		// Past both sources and over the excluded reading P2-8 at (32, 8),
		// which goes on the row of readings left out.
		{"profile", withMarks([2]float64{8, 11}, [2]float64{36, 7.5}), []string{"p"}},
		{"profile_unmarked", nil, []string{"p"}},
		{"settings", nil, []string{"s", "down"}},
		{"settings_typing", nil, []string{"s", "down", "down", "enter", "backspace", "5"}},
		{"help", nil, []string{"?"}},
		{"cautions", nil, []string{"?", "?"}},
		{"prompt", nil, []string{"t", "x", "w", "e", "t"}},
		{"running", running("grid", 0.62), nil},
		{"loading", loading(0.35), nil},
	}
	for _, size := range [][2]int{{80, 24}, {120, 40}} {
		for _, colour := range []bool{false, true} {
			for _, sc := range screens {
				name := fmt.Sprintf("%s_%dx%d_%s", sc.name, size[0], size[1], map[bool]string{false: "mono", true: "colour"}[colour])
				t.Run(name, func(t *testing.T) {
					m := readyModel(t, size[0], size[1], colour)
					if sc.prep != nil {
						m = sc.prep(t, m)
					}
					m = press(t, m, sc.keys...)
					out := m.View()
					checkFits(t, out, size[0], size[1])
					if m.showHelp && !strings.Contains(out, "╝") {
						t.Error("the overlay's bottom edge is cut off")
					}
					golden(t, name+".golden", out)
				})
			}
		}
	}
}

// withMarks sets marks A and B as the m key would.
func withMarks(a, b [2]float64) func(testing.TB, Model) Model {
	return func(t testing.TB, m Model) Model {
		m.mapPane = m.mapPane.MoveTo(a[0], a[1])
		m = press(t, m, "m")
		m.mapPane = m.mapPane.MoveTo(b[0], b[1])
		return press(t, m, "m")
	}
}

// running shows a regrid in progress at stage and frac.
func running(stage string, frac float64) func(testing.TB, Model) Model {
	return func(_ testing.TB, m Model) Model {
		m.running, m.stage, m.frac = true, stage, frac
		return m
	}
}

// loading shows the first run in progress.
func loading(frac float64) func(testing.TB, Model) Model {
	return func(_ testing.TB, m Model) Model {
		m.state, m.scene, m.running, m.stage, m.frac = stateLoading, nil, true, "first look", frac
		return m
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

// waitFor runs cmd and its batches' commands side by side and returns the
// first message of type T to arrive within timeout.
func waitFor[T tea.Msg](cmd tea.Cmd, timeout time.Duration) (T, bool) {
	found := make(chan T, 1)
	var run func(c tea.Cmd)
	run = func(c tea.Cmd) {
		if c == nil {
			return
		}
		go func() {
			switch msg := c().(type) {
			case tea.BatchMsg:
				for _, c := range msg {
					run(c)
				}
			case T:
				select {
				case found <- msg:
				default:
				}
			}
		}()
	}
	run(cmd)
	select {
	case msg := <-found:
		return msg, true
	case <-time.After(timeout):
		var zero T
		return zero, false
	}
}
