package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

// zoneList is the ranked list of flagged zones.
type zoneList struct {
	keys          KeyMap
	styles        Styles
	zones         []zoneInfo
	unit          string
	cursor        int
	stepped       bool // n or N used: the first press goes to the first (or last) zone
	width, height int
}

// jumpMsg asks the root to move the map cursor to a point.
type jumpMsg struct{ X, Y float64 }

func newZoneList(keys KeyMap, st Styles) zoneList { return zoneList{keys: keys, styles: st} }

func (z zoneList) SetSize(w, h int) zoneList {
	z.width, z.height = w, h
	return z
}

// SetZones replaces the zones, keeping the selected rank where it exists.
func (z zoneList) SetZones(zs []zoneInfo, unit string) zoneList {
	z.zones, z.unit = zs, unit
	z.cursor = min(z.cursor, max(len(zs)-1, 0))
	return z
}

// Selected returns the selected zone and whether there is one.
func (z zoneList) Selected() (zoneInfo, bool) {
	if z.cursor < 0 || z.cursor >= len(z.zones) {
		return zoneInfo{}, false
	}
	return z.zones[z.cursor], true
}

// Step moves the selection by d (wrapping) and returns a jump to it.
func (z zoneList) Step(d int) (zoneList, tea.Cmd) {
	if len(z.zones) == 0 {
		return z, nil
	}
	switch {
	case !z.stepped && d > 0:
		z.cursor = 0
	case !z.stepped:
		z.cursor = len(z.zones) - 1
	default:
		z.cursor = ((z.cursor+d)%len(z.zones) + len(z.zones)) % len(z.zones)
	}
	z.stepped = true
	return z, z.jump()
}

func (z zoneList) jump() tea.Cmd {
	s, ok := z.Selected()
	if !ok {
		return nil
	}
	return func() tea.Msg { return jumpMsg{s.PeakX, s.PeakY} }
}

// Update moves the selection and jumps on Enter.
func (z zoneList) Update(msg tea.Msg) (zoneList, tea.Cmd) {
	km, ok := msg.(tea.KeyMsg)
	if !ok {
		return z, nil
	}
	switch {
	case key.Matches(km, z.keys.Up):
		z.cursor = max(z.cursor-1, 0)
	case key.Matches(km, z.keys.Down):
		z.cursor = min(z.cursor+1, max(len(z.zones)-1, 0))
	case key.Matches(km, z.keys.Jump):
		return z, z.jump()
	}
	return z, nil
}

// View lists the zones, the selected one highlighted.
func (z zoneList) View() string {
	st := z.styles
	fw, fh := st.Panel.GetFrameSize()
	w := max(z.width-fw, 10)
	lines := []string{st.PanelTitle.Render(fmt.Sprintf("Zones (%d), worst first", len(z.zones)))}
	if len(z.zones) == 0 {
		lines = append(lines, st.Faint.Render("no flagged zones: set a field threshold in settings (s)"))
	}
	rows := max((z.height-fh-1)/3, 1) // three lines per zone
	first := max(z.cursor-rows+1, 0)
	for i := first; i < len(z.zones) && i < first+rows; i++ {
		s := z.zones[i]
		mark := "  "
		if i == z.cursor {
			mark = "▶ "
		}
		ls := []string{
			fmt.Sprintf("%s#%d peak %s", mark, s.Rank, s.shownPeak()),
			strings.TrimRight(fmt.Sprintf("   %s m²  %s", num(s.Area), s.Label), " "),
			fmt.Sprintf("   at %s, %s", fixed(s.PeakX), fixed(s.PeakY)),
		}
		for _, l := range ls {
			l = truncate(l, w)
			if i == z.cursor {
				l = st.Selected.Render(pad(l, w))
			}
			lines = append(lines, l)
		}
	}
	return st.Panel.Width(w + st.Panel.GetHorizontalPadding()).Height(max(z.height-fh, 1)).Render(strings.Join(lines, "\n"))
}

// pad fills s with spaces to w cells.
func pad(s string, w int) string {
	return s + strings.Repeat(" ", max(w-lipgloss.Width(s), 0))
}
