package main

import "errors"

// TEMPORARY: replaced by the suggest command.
func runSuggest(e *env, args []string) error { return errors.New("suggest: not implemented yet") }
