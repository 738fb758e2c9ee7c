package main

import "errors"

// TEMPORARY: replaced by the zones command.
func runZones(e *env, args []string) error { return errors.New("zones: not implemented yet") }
