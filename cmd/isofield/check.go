package main

import "errors"

// TEMPORARY: replaced by the check command.
func runCheck(e *env, args []string) error { return errors.New("check: not implemented yet") }
