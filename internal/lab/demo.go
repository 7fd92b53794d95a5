package lab

import (
	"embed"
	"fmt"
	"io/fs"
	"slices"

	"github.com/dzf-go/dzf/lethality"
)

// demoFiles is the embedded copy of the module's testdata/demo scenario
// (a test keeps the two byte-identical). It is read-only.
//
//go:embed demo/*.csv demo/*.json
var demoFiles embed.FS

// Names of the demo scenario's files.
const (
	DemoLabel        = "label.json"
	DemoPopulation   = "population.csv"
	DemoSurvivor     = "survivor.csv"
	DemoFraction     = "fraction.csv"
	DemoTemperatures = "temperatures.csv"
	DemoOutcomes     = "outcomes.csv"
	DemoCycle        = "cycle.csv"
)

// Demo returns the bytes of one file of the embedded demo scenario, an
// invented lot of a fictional supplier tested by a fictional laboratory.
// It refuses a name that is not a demo file (ErrDemo).
func Demo(name string) ([]byte, error) {
	b, err := demoFiles.ReadFile("demo/" + name)
	if err != nil {
		return nil, fmt.Errorf("%q: %w", name, ErrDemo)
	}
	return b, nil
}

// DemoNames returns the names of the demo scenario's files, sorted.
func DemoNames() []string {
	entries, err := fs.ReadDir(demoFiles, "demo")
	if err != nil {
		return nil
	}
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	slices.Sort(names)
	return names
}

// DemoSource is the name under which a demo file appears in errors and
// reports.
func DemoSource(name string) string { return "demo:" + name }

// DemoCycleSettings are the reader settings of the demo's logger export
// (RFC 3339 times, °C, comma-separated).
func DemoCycleSettings() lethality.ReadSettings {
	return lethality.ReadSettings{Delimiter: ',', Time: lethality.TimeRFC3339, Unit: lethality.Celsius}
}
