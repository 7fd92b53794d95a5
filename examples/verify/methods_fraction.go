package main

// fractionMethods lists the runner's fraction.* methods.
func fractionMethods() []method { return nil }
