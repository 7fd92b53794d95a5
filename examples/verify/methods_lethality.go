package main

// lethalityMethods lists the runner's lethality.* methods.
func lethalityMethods() []method { return nil }
