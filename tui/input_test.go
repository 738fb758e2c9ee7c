package tui

import (
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

// TestTextInput types into the reason field as a user would: the value,
// the character limit, and the cursor drawn without colour.
func TestTextInput(t *testing.T) {
	tests := []struct {
		name  string
		limit int
		keys  []tea.KeyMsg
		value string
		view  string // the mono view, prompt "> ", trailing spaces cut
	}{
		{"typing", 40, runes("wet ground"), "wet ground", "> wet ground_"},
		{"backspace", 40, append(runes("wett"), tea.KeyMsg{Type: tea.KeyBackspace}), "wet", "> wet_"},
		{"cursor left then insert", 40, append(runes("wt"), tea.KeyMsg{Type: tea.KeyLeft}, runes("e")[0]), "wet", "> we_t"},
		{"ctrl+u clears before the cursor", 40, append(runes("old"), tea.KeyMsg{Type: tea.KeyCtrlU}), "", "> _"},
		{"limit of 8", 8, runes("0123456789"), "01234567", "> 01234567_"},
		{"pasted text cut at the limit", 7, []tea.KeyMsg{{Type: tea.KeyRunes, Runes: []rune("rebar chair"), Paste: true}}, "rebar c", "> rebar c_"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			in := newTextInput(testStyles(false), tt.limit)
			in.Prompt = "> "
			in.Focus()
			for _, k := range tt.keys {
				in, _ = in.Update(k)
			}
			if got := in.Value(); got != tt.value {
				t.Errorf("value %q, want %q", got, tt.value)
			}
			if got := strings.TrimRight(in.View(), " "); got != tt.view {
				t.Errorf("view %q, want %q", got, tt.view)
			}
		})
	}
}

func runes(s string) []tea.KeyMsg {
	var out []tea.KeyMsg
	for _, r := range s {
		if r == ' ' {
			out = append(out, tea.KeyMsg{Type: tea.KeySpace, Runes: []rune{' '}})
			continue
		}
		out = append(out, tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
	}
	return out
}

// TestProgressView draws the bar at 0, a third and all, by width.
func TestProgressView(t *testing.T) {
	bar := newProgress(testStyles(false))
	for _, tt := range []struct {
		frac  float64
		width int
		want  string
	}{
		{0, 15, "░░░░░░░░░░   0%"},
		{1.0 / 3, 15, "███░░░░░░░  33%"},
		{1, 15, "██████████ 100%"},
		{2, 15, "██████████ 100%"},
	} {
		got := progressView(bar, tt.width, tt.frac)
		if got != tt.want || lipgloss.Width(got) != tt.width {
			t.Errorf("progressView(%g, width %d) = %q, want %q", tt.frac, tt.width, got, tt.want)
		}
	}
}
