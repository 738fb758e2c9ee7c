package main

import "errors"

// TEMPORARY: replaced by the report command.
func runReport(e *env, args []string) error { return errors.New("report: not implemented yet") }
