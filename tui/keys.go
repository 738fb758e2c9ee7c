package tui

import (
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/table"
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
	Mark, Profile                     key.Binding
	Settings, Apply, Cancel           key.Binding
	Export                            key.Binding
	Back, Help, Quit                  key.Binding
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
		Readings:    b("4", "readings", "4"),
		Arrows:      b("5", "field arrows", "5"),
		Suggestions: b("6", "infill points", "6"),
		Contours:    b("7", "band edges", "7"),
		Fine:        b("f", "fine map", "f"),
		ZoneList:    b("z", "zones list", "z"),
		NextZone:    b("n", "next zone", "n"),
		PrevZone:    b("N", "prev zone", "N"),
		Jump:        b("enter", "go to / confirm", "enter"),
		Table:       b("t", "readings table", "t"),
		Exclude:     b("x", "exclude/include", "x"),
		Order:       b("o", "order by", "o"),
		Reverse:     b("r", "reverse", "r"),
		Mark:        b("m", "mark A/B", "m"),
		Profile:     b("p", "profile", "p"),
		Settings:    b("s", "settings", "s"),
		Apply:       b("enter", "apply", "enter"),
		Cancel:      b("c", "cancel regrid", "c"),
		// Export waits for the export package's entry point.
		Export: key.NewBinding(key.WithKeys("e"), key.WithHelp("e", "export"), key.WithDisabled()),
		Back:   b("esc", "back", "esc"),
		Help:   b("?", "help", "?"),
		Quit:   b("q", "quit", "q", "ctrl+c"),
	}
}

// ShortHelp is the one-line help under the map.
func (k KeyMap) ShortHelp() []key.Binding {
	return []key.Binding{k.Help, k.Up, k.ZoomIn, k.Bands, k.ZoneList, k.Table, k.Exclude, k.Settings, k.Quit}
}

// FullHelp is the help overlay, one column per group.
func (k KeyMap) FullHelp() [][]key.Binding {
	return [][]key.Binding{
		{k.Up, k.Down, k.Left, k.Right, k.PanUp, k.PanDown, k.PanLeft, k.PanRight},
		{k.ZoomIn, k.ZoomOut, k.ResetView, k.Fine, k.Bands, k.Field, k.Zones, k.Readings},
		{k.Arrows, k.Suggestions, k.Contours, k.ZoneList, k.NextZone, k.PrevZone, k.Jump, k.Table},
		{k.Exclude, k.Order, k.Reverse, k.Mark, k.Profile, k.Settings},
		{k.Cancel, k.Export, k.Back, k.Help, k.Quit},
	}
}

// tableKeys returns the readings table's navigation keys built from k, so
// the table moves with the same keys as the cursor.
func (k KeyMap) tableKeys() table.KeyMap {
	t := table.DefaultKeyMap()
	t.LineUp, t.LineDown = k.Up, k.Down
	return t
}
