// Package survey holds the readings of an electric-potential survey and
// reads them from CSV files.
//
// A Reading is one potential measured at one surveyed point against a
// reference electrode. Coordinates are metres in the survey's own system:
// local site metres, projected eastings and northings, or, for files given in
// latitude and longitude, local east/north metres about the survey's centre
// (see Survey.Geo). Potentials are in the survey's Unit, volts or millivolts.
//
// The loader never modifies an input file. Every reading remembers its
// source file, its line in that file and its original fields, so that
// cleaned exports can reproduce the input columns. Bad input is reported as
// a *ParseError naming file, line and column.
package survey
