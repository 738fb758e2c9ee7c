package main

import "errors"

// TEMPORARY: replaced by the export command.
func runExport(e *env, args []string) error { return errors.New("export: not implemented yet") }
