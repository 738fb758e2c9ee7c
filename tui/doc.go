// Package tui is isofield's terminal user interface, built on Bubble Tea,
// Lip Gloss and Bubbles: a map of the gridded survey with a cursor readout
// and legend, the ranked zones, the readings table with exclusions by hand,
// a profile chart and the settings, all fed by pipeline.Run in the
// background.
//
// Shape. Model is the root, with a state (loading, error, ready) and one
// focused screen (map, zones, table, profile, settings) plus the help
// overlay. Each screen is a child with a constructor, SetSize, Update
// returning its own type, and View: mapPane (drawn by package mapview),
// sidePane (readout and legend), zoneList, readingsTable, profileView and
// settingsForm. The root handles the global keys, sizes every child and
// routes other keys to the focused one. All keys live in one KeyMap, which
// is also the help: the short help line shows the focused screen's keys,
// as many as fit the width; ? pages through the keys, the marks on the map
// and the preset's cautions, packed into as few pages as the height
// allows. All styles live in one Styles, passed in. Text entry and the
// progress bar are Bubbles' textinput and progress.
//
// Size. Surveys reach 10⁶ readings: the scene (map data, reading index,
// the readings' counts and column widths) is derived in the background
// command; the readings table sorts an index slice on values and hands
// the Bubbles table only the rows on screen; when readings would crowd
// the map, it opens with only suspect and excluded readings marked.
//
// Data. A pipeline.Result becomes a scene once, when it arrives: map data
// with per-node bands, zones, reading and suggestion marks, criterion and
// cautions. Values under the cursor come from the fitted model (exact
// between nodes), or from the nearest node when there is none.
//
// Units. The screen shows potentials, fields and step voltages each in
// one unit chosen from the scene's range by displayUnit: millivolts grow
// to volts and kilovolts (per metre for fields) while the largest value
// would reach 10 000, as a survey scaled to a fault current does; the
// values as read get a unit of their own range. Only the text changes:
// stored values, files, the session, the command line and the settings'
// inputs keep the survey's unit.
//
// Background work. Every run of the pipeline (first load, a settings
// change, a hand edit, a grown file in watch mode) is a tea.Cmd built from
// a copy of the configuration, never the model. It carries a generation
// number; results and progress of a replaced or cancelled run are dropped.
// Progress comes through a channel read by a command that re-arms itself.
// Hand edits and settings are saved through Options.Save in a command.
//
// Failure. Errors arrive as messages and are shown; a failed regrid keeps
// the previous map. A panic in Update or in a background command is caught,
// the UI quits through Bubble Tea's normal exit (restoring the terminal) and
// Run returns an error wrapping ErrPanic with a one-line cause.
package tui
