package tui

import (
	"github.com/charmbracelet/bubbles/key"
)

// KeyMap holds every key the UI answers to. It is also the help: the help
// overlay and the short help line are generated from it.
type KeyMap struct {
	Up, Down, Left, Right             key.Binding
	PanUp, PanDown, PanLeft, PanRight key.Binding
	ZoomIn, ZoomOut, ResetView        key.Binding
	Bands, Field, Zones, Readings     key.Binding
	Arrows, Suggestions, Contours     key.Binding
	Fine                              key.Binding
	ZoneList, NextZone, PrevZone      key.Binding
	Jump                              key.Binding
	Table, Exclude, Order, Reverse    key.Binding
	PageUp, PageDown, Top, Bottom     key.Binding
	Mark, Profile                     key.Binding
	Settings, Apply, Cancel           key.Binding
	Export                            key.Binding
	Back, Help, Quit                  key.Binding

	// Help-only summaries for the short help line (never matched).
	Move, Pan, Zoom, Layers, Choose, Change, Page, NextPrev key.Binding
}

// DefaultKeyMap returns isofield's keys.
func DefaultKeyMap() KeyMap {
	b := func(help string, desc string, keys ...string) key.Binding {
		return key.NewBinding(key.WithKeys(keys...), key.WithHelp(help, desc))
	}
	return KeyMap{
		Up:          b("↑/k", "north", "up", "k"),
		Down:        b("↓/j", "south", "down", "j"),
		Left:        b("←/h", "west", "left", "h"),
		Right:       b("→/l", "east", "right", "l"),
		PanUp:       b("K", "pan north", "K", "shift+up"),
		PanDown:     b("J", "pan south", "J", "shift+down"),
		PanLeft:     b("H", "pan west", "H", "shift+left"),
		PanRight:    b("L", "pan east", "L", "shift+right"),
		ZoomIn:      b("+", "zoom in", "+", "="),
		ZoomOut:     b("-", "zoom out", "-", "_"),
		ResetView:   b("0", "whole survey", "0"),
		Bands:       b("1", "bands", "1"),
		Field:       b("2", "field |E|", "2"),
		Zones:       b("3", "zone outlines", "3"),
		Readings:    b("4", "readings: all/flagged/none", "4"),
		Arrows:      b("5", "field arrows", "5"),
		Suggestions: b("6", "infill points", "6"),
		Contours:    b("7", "band edges", "7"),
		Fine:        b("f", "fine map", "f"),
		ZoneList:    b("z", "zones list", "z"),
		NextZone:    b("n", "next zone", "n"),
		PrevZone:    b("N", "prev zone", "N"),
		Jump:        b("enter", "go to zone", "enter"),
		Table:       b("t", "readings", "t"),
		Exclude:     b("x", "exclude/include", "x"),
		Order:       b("o", "order by", "o"),
		Reverse:     b("r", "reverse", "r"),
		PageUp:      b("pgup", "page up", "pgup"),
		PageDown:    b("pgdn", "page down", "pgdown"),
		Top:         b("home/g", "first row", "home", "g"),
		Bottom:      b("end/G", "last row", "end", "G"),
		Mark:        b("m", "mark A/B", "m"),
		Profile:     b("p", "profile", "p"),
		Settings:    b("s", "settings", "s"),
		Apply:       b("enter", "type a value", "enter"),
		Cancel:      b("c", "cancel regrid", "c"),
		// Export waits for the export package's entry point.
		Export:   key.NewBinding(key.WithKeys("e"), key.WithHelp("e", "export"), key.WithDisabled()),
		Back:     b("esc", "back", "esc"),
		Move:     b("←↓↑→", "move", "up", "down", "left", "right"),
		Pan:      b("HJKL", "pan", "H", "J", "K", "L"),
		Zoom:     b("+/-", "zoom", "+", "-"),
		Page:     b("pgup/pgdn", "page up/down", "pgup", "pgdown"),
		NextPrev: b("n/N", "next/prev", "n", "N"),
		Layers:   b("1…7", "layers", "1", "2", "3", "4", "5", "6", "7"),
		Choose:   b("↑↓", "choose", "up", "down"),
		Change:   b("←→", "change", "left", "right"),
		Help:     b("?", "help", "?"),
		Quit:     b("q", "quit", "q", "ctrl+c"),
	}
}

// ShortHelp is the one-line help under the map, most useful first: the
// line shows as many as fit.
func (k KeyMap) ShortHelp() []key.Binding {
	return []key.Binding{k.Help, k.Move, k.Layers, k.Table, k.Settings, k.Quit,
		k.NextZone, k.Zoom, k.Exclude, k.Mark, k.Profile, k.ZoneList}
}

// FullHelp is the help overlay, one column per group: the cursor and
// view, the layers, the zones, the readings, and the rest. The cursor's
// and the view's four directions are summed up in one line each.
func (k KeyMap) FullHelp() [][]key.Binding {
	move := key.NewBinding(key.WithKeys("up"), key.WithHelp("←↓↑→ hjkl", "move the cursor"))
	pan := key.NewBinding(key.WithKeys("K"), key.WithHelp("HJKL ⇧+←↓↑→", "pan the view"))
	ends := key.NewBinding(key.WithKeys("home"), key.WithHelp("g/G home/end", "first/last row"))
	return [][]key.Binding{
		{move, pan, k.ZoomIn, k.ZoomOut, k.ResetView, k.Fine, k.Mark, k.Profile},
		{k.Bands, k.Field, k.Zones, k.Readings, k.Arrows, k.Suggestions, k.Contours},
		{k.ZoneList, k.NextZone, k.PrevZone, k.Jump, k.Settings, k.Cancel, k.Export},
		{k.Table, k.Order, k.Reverse, k.Exclude, k.Page, ends},
		{k.Back, k.Help, k.Quit},
	}
}

// shortHelpFor returns the short help of the focused screen.
func (k KeyMap) shortHelpFor(f focus, prompting, typing bool) []key.Binding {
	done := key.NewBinding(key.WithKeys("enter"), key.WithHelp("enter", "done"))
	switch {
	case prompting, typing:
		return []key.Binding{done, k.Back}
	}
	switch f {
	case focusZones:
		return []key.Binding{k.Help, k.Choose, k.Jump, k.NextPrev, k.Back, k.Quit}
	case focusTable:
		return []key.Binding{k.Help, k.Choose, k.Order, k.Reverse, k.Exclude, k.Back, k.Quit, k.Page, k.Top, k.Bottom}
	case focusProfile:
		return []key.Binding{k.Help, k.Profile, k.Back, k.Quit}
	case focusSettings:
		return []key.Binding{k.Help, k.Choose, k.Change, k.Apply, k.Back, k.Quit}
	}
	return k.ShortHelp()
}
