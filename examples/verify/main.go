// Command verify runs reference cases: computations with their input, the
// answer an independent source gives, and that source. A laboratory runs it
// on its own machine, over the project's cases and its own, to show for its
// validation file that the library gives the published or qualified answers.
//
// Usage:
//
//	go run ./examples/verify [DIR ...]
//
// With no DIR it reads testdata/reference. Every .json file of each folder
// (not its sub-folders) is read in name order; each holds a JSON array of
// cases. The case format and every method are specified in the project's
// testdata/reference/FORMAT.md.
//
// The runner prints one line per case (PASS or FAIL, the id, each expected
// field with its expected value, result and tolerance, and the source), then
// the closing line "N passed, M failed". Exit status: 0 when every case
// passed, 1 when any failed, 2 when any file is malformed (then no case is
// run) or a folder cannot be read.
package main

import (
	"fmt"
	"io"
	"os"
)

const caution = "Caution: these numbers feed decisions about patient safety. This program shows that the library\n" +
	"reproduces independent reference values on this machine; acceptance of indicators and processes is\n" +
	"decided by the laboratory's qualified people under the standards and regulations that apply to them."

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr, allMethods()))
}

// run is the whole program, returning its exit status.
func run(args []string, stdout, stderr io.Writer, methods map[string]method) int {
	dirs := args
	if len(dirs) == 0 {
		dirs = []string{"testdata/reference"}
	}
	for _, d := range dirs {
		if len(d) > 0 && d[0] == '-' {
			fmt.Fprintf(stderr, "verify: unknown option %q\nusage: verify [DIR ...]\n", d)
			return 2
		}
	}
	var all []*refCase
	for _, d := range dirs {
		cases, err := loadDir(d, methods)
		if err != nil {
			fmt.Fprintf(stderr, "verify: malformed input, no case was run:\n  %v\n", err)
			return 2
		}
		all = append(all, cases...)
	}
	fmt.Fprintln(stdout, caution)
	fmt.Fprintln(stdout)
	passed, failed := 0, 0
	for _, c := range all {
		line, ok := c.check(methods[c.Method])
		fmt.Fprintln(stdout, line)
		if ok {
			passed++
		} else {
			failed++
		}
	}
	fmt.Fprintf(stdout, "%d passed, %d failed\n", passed, failed)
	if failed > 0 {
		return 1
	}
	return 0
}
