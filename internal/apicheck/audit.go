package apicheck

import (
	"fmt"
	"strings"
)

// Audit holds a package's variables to the rule of this module: every
// package-level variable is either an error sentinel (its name starts with
// Err) whose doc comment starts with its name and that reached says a test
// reached through the public API, or one of readOnly, a table whose doc
// comment says it is "read only". It returns one message per breach, and
// the number of sentinels it found, for comparison with the test's own list.
func Audit(vars []Var, reached, readOnly map[string]bool) (problems []string, sentinels int) {
	for _, v := range vars {
		switch {
		case readOnly[v.Name]:
			if !strings.Contains(v.Doc, "read only") {
				problems = append(problems, fmt.Sprintf("%s: table %s does not say in its doc comment that it is read only", v.Pos, v.Name))
			}
			continue
		case !strings.HasPrefix(v.Name, "Err"):
			problems = append(problems, fmt.Sprintf("%s: package-level variable %s is neither an error sentinel nor a read-only table (no package state)", v.Pos, v.Name))
			continue
		case !strings.HasPrefix(v.Doc, v.Name):
			problems = append(problems, fmt.Sprintf("%s: sentinel %s has no doc comment starting with its name", v.Pos, v.Name))
		case !reached[v.Name]:
			problems = append(problems, fmt.Sprintf("%s: sentinel %s is not reached by the sentinel test", v.Pos, v.Name))
		}
		sentinels++
	}
	return problems, sentinels
}
