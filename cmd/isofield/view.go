package main

import "errors"

// TEMPORARY: replaced by the view command.
func runView(e *env, args []string) error { return errors.New("view: not implemented yet") }
