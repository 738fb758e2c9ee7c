package tui

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/textinput"
	tea "github.com/charmbracelet/bubbletea"

	"isofield/interp"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
)

// setting is one line of the settings screen.
type setting struct {
	label   string
	preset  string   // shown only for this preset ("" : always)
	choices []string // a choice cycles with ←/→; nil: typed value
	get     func(c *pipeline.Config) string
	set     func(c *pipeline.Config, s string) error
}

// applyMsg carries a changed configuration to the root, which regrids.
type applyMsg struct{ cfg pipeline.Config }

// settingsForm edits a copy of the configuration.
type settingsForm struct {
	keys          KeyMap
	styles        Styles
	cfg           pipeline.Config
	cursor        int
	editing       bool
	input         textinput.Model
	err           string
	unit          string // the survey's potential unit, for the labels
	width, height int
}

// settingsLabelWidth is the width of the settings' label column.
const settingsLabelWidth = 36

func newSettingsForm(keys KeyMap, st Styles) settingsForm {
	in := newTextInput(st, 32)
	in.Prompt = "> "
	return settingsForm{keys: keys, styles: st, input: in}
}

func (f settingsForm) SetSize(w, h int) settingsForm {
	f.width, f.height = w, h
	f.input = fitInput(f.input, w-settingsLabelWidth-3)
	return f
}

// SetConfig loads the configuration the form edits.
func (f settingsForm) SetConfig(c pipeline.Config) settingsForm {
	f.cfg = c
	f.cursor = min(f.cursor, len(f.visible())-1)
	return f
}

// SetUnit names the potential unit the labels show.
func (f settingsForm) SetUnit(u string) settingsForm {
	f.unit = u
	return f
}

// label returns s's label with the unit filled in.
func (f settingsForm) label(s setting) string {
	u := f.unit
	if u == "" {
		u = "unit"
	}
	return strings.ReplaceAll(s.label, "{U}", u)
}

// Editing reports whether a value is being typed (keys go to the input).
func (f settingsForm) Editing() bool { return f.editing }

// visible returns the settings shown for the current preset.
func (f settingsForm) visible() []setting {
	var out []setting
	name := f.cfg.Criteria.Name()
	for _, s := range allSettings() {
		if s.preset == "" || s.preset == name {
			out = append(out, s)
		}
	}
	return out
}

// Update moves, cycles choices, edits values; a committed change returns
// an applyMsg.
func (f settingsForm) Update(msg tea.Msg) (settingsForm, tea.Cmd) {
	if f.editing {
		return f.updateEditing(msg)
	}
	km, ok := msg.(tea.KeyMsg)
	if !ok {
		return f, nil
	}
	vis := f.visible()
	cur := vis[f.cursor]
	switch {
	case key.Matches(km, f.keys.Up):
		f.cursor = max(f.cursor-1, 0)
	case key.Matches(km, f.keys.Down):
		f.cursor = min(f.cursor+1, len(vis)-1)
	case key.Matches(km, f.keys.Left), key.Matches(km, f.keys.Right):
		if cur.choices != nil {
			d := 1
			if key.Matches(km, f.keys.Left) {
				d = -1
			}
			return f.commit(cur, cycle(cur.choices, cur.get(&f.cfg), d))
		}
	case key.Matches(km, f.keys.Apply):
		if cur.choices == nil {
			f.editing, f.err = true, ""
			f.input.SetValue(cur.get(&f.cfg))
			cmd := f.input.Focus()
			return f, cmd
		}
	}
	return f, nil
}

func (f settingsForm) updateEditing(msg tea.Msg) (settingsForm, tea.Cmd) {
	if km, ok := msg.(tea.KeyMsg); ok {
		switch {
		case key.Matches(km, f.keys.Back):
			f.editing = false
			f.input.Blur()
			return f, nil
		case key.Matches(km, f.keys.Apply):
			f.editing = false
			f.input.Blur()
			return f.commit(f.visible()[f.cursor], f.input.Value())
		}
	}
	var cmd tea.Cmd
	f.input, cmd = f.input.Update(msg)
	return f, cmd
}

// commit sets one value; on success the new configuration is applied.
func (f settingsForm) commit(s setting, v string) (settingsForm, tea.Cmd) {
	c := f.cfg
	c.Criteria = cloneCriteria(c.Criteria)
	if err := s.set(&c, strings.TrimSpace(v)); err != nil {
		f.err = f.label(s) + ": " + err.Error()
		return f, nil
	}
	f.err = ""
	f.cfg = c
	f.cursor = min(f.cursor, len(f.visible())-1)
	return f, func() tea.Msg { return applyMsg{cfg: c} }
}

func cloneCriteria(c criteria.Settings) criteria.Settings {
	c.Conditions = append([]string(nil), c.Conditions...)
	c.Structure = append([]criteria.Point(nil), c.Structure...)
	return c
}

// cycle returns the choice d steps from cur.
func cycle(choices []string, cur string, d int) string {
	i := 0
	for k, c := range choices {
		if c == cur {
			i = k
		}
	}
	return choices[((i+d)%len(choices)+len(choices))%len(choices)]
}

// View lists the settings with the selected one highlighted.
func (f settingsForm) View() string {
	st := f.styles
	lines := []string{st.PanelTitle.Render("Settings") + st.Label.Render("  ↑↓ choose · ←→ change a choice · enter type a value · esc back"), ""}
	for i, s := range f.visible() {
		val := s.get(&f.cfg)
		if f.editing && i == f.cursor {
			val = f.input.View()
		} else if s.choices != nil {
			val = "‹ " + val + " ›"
		}
		mark := "  "
		if i == f.cursor {
			mark = "▶ "
		}
		l := mark + pad(f.label(s), settingsLabelWidth) + " " + val
		if i == f.cursor && !f.editing {
			l = st.Selected.Render(l)
		}
		lines = append(lines, truncate(l, f.width))
	}
	if f.err != "" {
		lines = append(lines, "", st.Error.Render(truncate(f.err, f.width)))
	}
	lines = append(lines, "", st.Faint.Render(truncate("A change regrids in the background; the map stays usable, c cancels.", f.width)))
	return strings.Join(lines, "\n")
}

// number parses a finite number.
func number(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.ReplaceAll(s, ",", "."), 64)
	if err != nil || v != v || v > 1e300 || v < -1e300 {
		return 0, fmt.Errorf("%q is not a number", s)
	}
	return v, nil
}

// nonNegative parses a number ≥ 0.
func nonNegative(s string) (float64, error) {
	v, err := number(s)
	if err == nil && v < 0 {
		err = fmt.Errorf("%s must not be negative", s)
	}
	return v, err
}

// optional formats and parses an optional value ("" for none).
func optional(p *float64) string {
	if p == nil {
		return ""
	}
	return strconv.FormatFloat(*p, 'g', -1, 64)
}

func setOptional(s string) (*float64, error) {
	if s == "" || strings.EqualFold(s, "none") {
		return nil, nil
	}
	v, err := number(s)
	return &v, err
}

// kernelNames lists the kernels in the order the form cycles them.
func kernelNames() []string {
	var out []string
	for k := interp.ThinPlate; k <= interp.WendlandC4; k++ {
		out = append(out, k.String())
	}
	return out
}
