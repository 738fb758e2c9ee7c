package tui

import (
	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/table"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"isofield/tui/mapview"
)

// Styles are every style the UI draws with. Build them with DefaultStyles
// for one lipgloss renderer and pass them down; nothing reads a global.
type Styles struct {
	Renderer *lipgloss.Renderer
	Colour   bool

	// Accent and Dim are the two colours the progress bar is drawn in.
	Accent, Dim lipgloss.AdaptiveColor

	Status, StatusBusy   lipgloss.Style
	Panel, PanelTitle    lipgloss.Style
	Label, Value, Faint  lipgloss.Style
	Warn, Caution, Error lipgloss.Style
	Selected             lipgloss.Style
	Overlay              lipgloss.Style
	Help                 help.Styles
	Table                table.Styles

	// Palettes of the map (colour-blind-safe schemes; see mapview).
	Signed, OneSigned, Field mapview.Palette
}

// DefaultStyles returns isofield's styles for r. With a monochrome profile
// (NO_COLOR, a dumb terminal, or tests) every style keeps its layout and
// loses its colour.
func DefaultStyles(r *lipgloss.Renderer) Styles {
	ink := lipgloss.AdaptiveColor{Light: "#1b1b1b", Dark: "#e8e8e8"}
	dim := lipgloss.AdaptiveColor{Light: "#6a6a6a", Dark: "#9a9a9a"}
	accent := lipgloss.AdaptiveColor{Light: "#542788", Dark: "#b2abd2"} // PuOr purple arm
	warm := lipgloss.AdaptiveColor{Light: "#b35806", Dark: "#fdb863"}   // PuOr orange arm
	s := Styles{Renderer: r, Colour: r.ColorProfile() != termenv.Ascii, Accent: accent, Dim: dim}
	s.Status = r.NewStyle().Bold(true).Foreground(ink).Background(lipgloss.AdaptiveColor{Light: "#d8daeb", Dark: "#2d004b"})
	s.StatusBusy = s.Status.Foreground(warm)
	s.Panel = r.NewStyle().Border(lipgloss.NormalBorder()).BorderForeground(dim).Padding(0, 1)
	s.PanelTitle = r.NewStyle().Bold(true).Foreground(accent)
	s.Label = r.NewStyle().Foreground(dim)
	s.Value = r.NewStyle().Foreground(ink)
	s.Faint = r.NewStyle().Foreground(dim).Faint(true)
	s.Warn = r.NewStyle().Bold(true).Foreground(warm)
	s.Caution = r.NewStyle().Foreground(warm)
	s.Error = r.NewStyle().Bold(true).Foreground(warm)
	s.Selected = r.NewStyle().Reverse(true)
	s.Overlay = r.NewStyle().Border(lipgloss.DoubleBorder()).BorderForeground(accent).Padding(0, 1)
	s.Help = help.Styles{
		Ellipsis:       r.NewStyle().Foreground(dim),
		ShortKey:       r.NewStyle().Bold(true).Foreground(accent),
		ShortDesc:      r.NewStyle().Foreground(dim),
		ShortSeparator: r.NewStyle().Foreground(dim),
		FullKey:        r.NewStyle().Bold(true).Foreground(accent),
		FullDesc:       r.NewStyle().Foreground(ink),
		FullSeparator:  r.NewStyle().Foreground(dim),
	}
	s.Table = table.Styles{
		Header:   r.NewStyle().Bold(true).Foreground(accent).PaddingLeft(1),
		Cell:     r.NewStyle().PaddingLeft(1),
		Selected: r.NewStyle().Reverse(true),
	}
	s.Signed, s.OneSigned, s.Field = mapview.DivergingPuOr(), mapview.SequentialViridis(), mapview.SequentialYlOrRd()
	return s
}

// mapRenderer returns a map renderer matching s.
func (s Styles) mapRenderer() *mapview.Renderer {
	p := termenv.Ascii
	if s.Renderer != nil {
		p = s.Renderer.ColorProfile()
	}
	return mapview.NewRenderer(p, s.Signed, s.OneSigned, s.Field)
}
