package tui

import (
	"strings"

	tea "github.com/charmbracelet/bubbletea"
)

// lineInput is a one-line text field: the reason prompt and the settings'
// typed values. (Bubbles' textinput would pull a clipboard module this
// build does not carry; this needs only the keys below.)
type lineInput struct {
	styles      Styles
	Prompt      string
	Placeholder string
	limit       int
	value       []rune
	pos         int
	focused     bool
}

func newLineInput(st Styles, limit int) lineInput { return lineInput{styles: st, limit: limit} }

// Value returns the text typed.
func (in lineInput) Value() string { return string(in.value) }

// SetValue replaces the text and puts the cursor at its end.
func (in lineInput) SetValue(s string) lineInput {
	in.value = []rune(s)
	if in.limit > 0 && len(in.value) > in.limit {
		in.value = in.value[:in.limit]
	}
	in.pos = len(in.value)
	return in
}

// Focus and Blur start and stop taking keys.
func (in lineInput) Focus() lineInput { in.focused = true; return in }
func (in lineInput) Blur() lineInput  { in.focused = false; return in }

// Update edits the text: printable keys insert, backspace and delete
// remove, ←/→, home/end and ctrl+a/ctrl+e move, ctrl+u clears.
func (in lineInput) Update(msg tea.Msg) (lineInput, tea.Cmd) {
	km, ok := msg.(tea.KeyMsg)
	if !ok || !in.focused {
		return in, nil
	}
	switch km.Type {
	case tea.KeyRunes, tea.KeySpace:
		r := km.Runes
		if km.Type == tea.KeySpace {
			r = []rune{' '}
		}
		if in.limit > 0 && len(in.value)+len(r) > in.limit {
			return in, nil
		}
		in.value = append(in.value[:in.pos], append(append([]rune(nil), r...), in.value[in.pos:]...)...)
		in.pos += len(r)
	case tea.KeyBackspace:
		if in.pos > 0 {
			in.value = append(in.value[:in.pos-1], in.value[in.pos:]...)
			in.pos--
		}
	case tea.KeyDelete:
		if in.pos < len(in.value) {
			in.value = append(in.value[:in.pos], in.value[in.pos+1:]...)
		}
	case tea.KeyLeft:
		in.pos = max(in.pos-1, 0)
	case tea.KeyRight:
		in.pos = min(in.pos+1, len(in.value))
	case tea.KeyHome, tea.KeyCtrlA:
		in.pos = 0
	case tea.KeyEnd, tea.KeyCtrlE:
		in.pos = len(in.value)
	case tea.KeyCtrlU:
		in.value, in.pos = nil, 0
	}
	return in, nil
}

// View draws the prompt, the text and a block cursor.
func (in lineInput) View() string {
	if len(in.value) == 0 && !in.focused {
		return in.Prompt + in.styles.Faint.Render(in.Placeholder)
	}
	var sb strings.Builder
	sb.WriteString(in.Prompt)
	sb.WriteString(string(in.value[:in.pos]))
	cur := " "
	if in.pos < len(in.value) {
		cur = string(in.value[in.pos])
	}
	if in.focused {
		cur = in.styles.Selected.Render(cur)
		if !in.styles.Colour {
			cur = "_"
			if in.pos < len(in.value) {
				cur = "_" + string(in.value[in.pos])
			}
		}
	}
	sb.WriteString(cur)
	if in.pos < len(in.value) {
		sb.WriteString(string(in.value[in.pos+1:]))
	}
	if len(in.value) == 0 && in.Placeholder != "" {
		sb.WriteString(in.styles.Faint.Render(in.Placeholder))
	}
	return sb.String()
}

// progressBar draws frac (0..1) as a bar width cells wide with its
// percentage.
func progressBar(st Styles, width int, frac float64) string {
	frac = min(max(frac, 0), 1)
	w := max(width-5, 4)
	full := int(frac*float64(w) + 0.5)
	bar := st.PanelTitle.Render(strings.Repeat("█", full)) + st.Faint.Render(strings.Repeat("░", w-full))
	return bar + " " + padLeft(int(frac*100+0.5), 3) + "%"
}

func padLeft(n, w int) string {
	s := strings.Repeat(" ", w) + itoa(n)
	return s[len(s)-w:]
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var b []byte
	for ; n > 0; n /= 10 {
		b = append([]byte{byte('0' + n%10)}, b...)
	}
	return string(b)
}
