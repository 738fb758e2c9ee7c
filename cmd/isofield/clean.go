package main

import "errors"

// TEMPORARY: replaced by the clean command.
func runClean(e *env, args []string) error { return errors.New("clean: not implemented yet") }
