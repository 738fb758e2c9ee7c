// Package criteria holds each trade's criteria presets and the published
// numbers behind them, each with its source and how well it was checked.
//
// Settings (stored in the session file as JSON) select a preset, generic,
// concrete, grounding, cp or sp, and its parameters. Link adjusts the
// checks' settings before they run (the concrete and cp presets want the
// CSE scale; package qa converts and scales, so nothing is done twice).
// Prepare turns the checked potentials into the values to grid (the sp
// preset removes a robust regional plane). Resolve turns settings into a
// Criterion for one survey: thresholds in the survey's unit and electrode
// scale, potential classes, tolerable step and touch voltages, the sources
// of every number, the warnings that void or qualify them, and the cautions
// to show with every result.
//
// Units: potentials in the survey's unit U (V or mV), fields in U per
// metre, lengths in metres, resistivities in Ω·m, times in seconds,
// tolerable voltages in volts (Tolerable) and in U (Criterion).
//
// Numbers marked "from memory" in the project's field facts (the IEEE Std
// 80 formulas among them) are labelled so wherever they are shown.
package criteria
