package tui

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey/export"
	"isofield/survey/pipeline"
	"isofield/tui/mapview"
)

// exportedMsg reports the outcome of an export.
type exportedMsg struct {
	dir   string
	files int
	err   error
}

// exportView returns a command writing every export of res and cfg into a
// new time-stamped directory under opt.ExportDir, with the map view's state
// among the settings. It captures values only.
func exportView(opt Options, res *pipeline.Result, cfg pipeline.Config, view string, now time.Time) tea.Cmd {
	dir := filepath.Join(opt.ExportDir, "isofield-export-"+now.Format("20060102-150405"))
	eo := export.Options{
		Version: opt.Version, Title: opt.Title, Made: now, DPI: opt.ExportDPI,
		Settings: []export.Setting{{Name: "terminal map view", Value: view}},
	}
	cfg = cloneConfig(cfg)
	return safe(func() tea.Msg {
		if err := os.MkdirAll(dir, 0o755); err != nil {
			return exportedMsg{dir: dir, err: err}
		}
		paths, err := export.All(context.Background(), dir, res, cfg, eo)
		return exportedMsg{dir: dir, files: len(paths), err: err}
	})
}

// cloneConfig copies the slices a background command must not share.
func cloneConfig(c pipeline.Config) pipeline.Config {
	c.Files = append([]string(nil), c.Files...)
	c.Edits = append(c.Edits[:0:0], c.Edits...)
	c.Criteria = cloneCriteria(c.Criteria)
	return c
}

// describeView says in words what the map shows, for the export settings.
func describeView(p mapPane) string {
	v := p.view
	var on []string
	for _, l := range []struct {
		l    mapview.Layers
		name string
	}{
		{mapview.LayerBands, "bands"}, {mapview.LayerField, "field magnitude"},
		{mapview.LayerZones, "zones"}, {mapview.LayerReadings, "readings"},
		{mapview.LayerFlaggedReadings, "suspect and excluded readings"},
		{mapview.LayerArrows, "arrows"}, {mapview.LayerSuggestions, "infill points"},
		{mapview.LayerContours, "band edges"},
	} {
		if v.Layers&l.l != 0 {
			on = append(on, l.name)
		}
	}
	return fmt.Sprintf("centre %s, %s; %s m per column; cursor %s, %s; layers: %s",
		fixed(v.CX), fixed(v.CY), num(v.MPC), fixed(v.CursorX), fixed(v.CursorY), strings.Join(on, ", "))
}

func (m Model) onExported(msg exportedMsg) Model {
	if msg.err != nil {
		m.message = "export failed: " + msg.err.Error()
	} else {
		m.message = fmt.Sprintf("exported %d files to %s", msg.files, msg.dir)
	}
	return m
}
