package main

import "errors"

// TEMPORARY: replaced by the demo command.
func runDemo(e *env, args []string) error { return errors.New("demo: not implemented yet") }
