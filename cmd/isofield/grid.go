package main

import "errors"

// TEMPORARY: replaced by the grid command.
func runGrid(e *env, args []string) error { return errors.New("grid: not implemented yet") }
