package main

import (
	"flag"

	"isofield/survey/qa"
)

// TEMPORARY: filled in by the qa work. addQAFlags registers the checking
// and cleaning flags shared by every command that reads surveys.
func addQAFlags(fs *flag.FlagSet, s *qa.Settings) {}
