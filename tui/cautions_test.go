package tui

import (
	"fmt"
	"strings"
	"testing"

	"isofield/survey/criteria"
)

// TestCautionsComplete opens the help of every preset at 80×24 and
// 120×40, with the export key on, and steps through its pages: each is
// whole, and every caution of the preset (criteria.Cautions) is shown in
// full, beside the keys or on a later page.
func TestCautionsComplete(t *testing.T) {
	for _, preset := range criteria.Presets() {
		for _, size := range [][2]int{{80, 24}, {120, 40}} {
			t.Run(fmt.Sprintf("%s %dx%d", preset, size[0], size[1]), func(t *testing.T) {
				cfg := fixtureConfig()
				cfg.Criteria.Preset = preset
				m := New(cfg, Options{Title: "site-a.csv", ExportDir: t.TempDir()}, DefaultKeyMap(), testStyles(false))
				m.gen = 1
				m = update1(t, m, resultMsg{gen: 1, res: fixtureResult()})
				m = m.resize(size[0], size[1])
				if first := press(t, m, "?").View(); !strings.Contains(first, "╝") || !strings.Contains(first, "export") {
					t.Errorf("keys overlay cut off or without the export key:\n%s", first)
				}
				screens := allHelp(t, m)
				if n := strings.Count(screens, "╝"); n != len(m.helpPages()) {
					t.Errorf("%d whole pages drawn, want %d", n, len(m.helpPages()))
				}
				flat := flatten(screens)
				for _, c := range criteria.Cautions(preset) {
					if !strings.Contains(flat, flatten(c)) {
						t.Errorf("caution not shown in full: %q", c)
					}
				}
				if strings.Contains(flat, "taller terminal") {
					t.Error("cautions cut short")
				}
			})
		}
	}
}

// flatten drops the overlay's borders and joins wrapped lines.
func flatten(s string) string {
	s = strings.NewReplacer("║", " ", "•", " ").Replace(s)
	return strings.Join(strings.Fields(s), " ")
}
