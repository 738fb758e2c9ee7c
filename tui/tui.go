// Package tui is isofield's terminal user interface, built on Bubble Tea,
// Lip Gloss and Bubbles.
package tui

// TEMPORARY contract: filled in by the terminal UI work.

import (
	"errors"

	"isofield/survey/pipeline"
)

// Options configure a UI session.
type Options struct {
	// Title names the survey in the status line.
	Title string
	// Watch reloads the input files when they grow.
	Watch bool
	// SessionPath is where hand edits and settings are saved ("" : none,
	// e.g. for the built-in demo).
	SessionPath string
	// NoColor forces monochrome (NO_COLOR is honoured regardless).
	NoColor bool
}

// Run opens the UI on the survey described by cfg and returns when the user
// quits. The terminal is restored on every exit path, panics included.
func Run(cfg pipeline.Config, opt Options) error {
	return errors.New("tui: not implemented yet")
}
