package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"

	"github.com/dzf-go/dzf/fraction"
	"github.com/dzf-go/dzf/internal/lab"
	"github.com/dzf-go/dzf/lethality"
	"github.com/dzf-go/dzf/resistance"
	"github.com/dzf-go/dzf/survivor"
)

// inputs are the data of one run.
type inputs struct {
	Sources      []source
	Label        resistance.Label
	Units        []survivor.Unit
	Survivor     []survivor.Observation
	Fraction     []fraction.Exposure
	Temperatures []resistance.Point // nil: none given
	Outcomes     lab.Outcomes
	Cycle        lethality.Record
	CycleName    string
}

// source says where one input came from.
type source struct {
	Input string `json:"input"`
	// From is "file", "demo" (the invented demo scenario) or "none".
	From string `json:"from"`
	Name string `json:"name,omitempty"`
}

// Where an input came from.
const (
	fromFile = "file"
	fromDemo = "demo"
	fromNone = "none"
)

// inputSpec is one input: its flag, its demo file and its reader.
type inputSpec struct {
	name     string
	demo     string
	optional bool
	usage    string
	read     func(in *inputs, cfg config, name string, src io.Reader, demo bool) error
}

// inputSpecs lists the inputs in the order of the report.
func inputSpecs() []inputSpec {
	return []inputSpec{
		{"label", lab.DemoLabel, false, "label (certificate) of the lot, JSON", func(in *inputs, _ config, name string, src io.Reader, _ bool) (err error) {
			in.Label, err = lab.ReadLabel(name, src)
			return err
		}},
		{"population", lab.DemoPopulation, false, "population assay, CSV: unit,suspension_ml,dilution,plated_ml,colonies", func(in *inputs, _ config, name string, src io.Reader, _ bool) (err error) {
			in.Units, err = lab.ReadPopulation(name, src)
			return err
		}},
		{"survivor", lab.DemoSurvivor, false, "survivor-curve study, CSV: minutes,count", func(in *inputs, _ config, name string, src io.Reader, _ bool) (err error) {
			in.Survivor, err = lab.ReadSurvivor(name, src)
			return err
		}},
		{"fraction", lab.DemoFraction, false, "fraction-negative study, CSV: minutes,units,negative", func(in *inputs, _ config, name string, src io.Reader, _ bool) (err error) {
			in.Fraction, err = lab.ReadFraction(name, src)
			return err
		}},
		{"temperatures", lab.DemoTemperatures, true, "D at other temperatures for z, CSV: celsius,d,lower,upper,level[,method]; or none", func(in *inputs, _ config, name string, src io.Reader, _ bool) (err error) {
			in.Temperatures, err = lab.ReadTemperatures(name, src)
			return err
		}},
		{"outcomes", lab.DemoOutcomes, true, "survival, kill and half-cycle outcomes, CSV: test,minutes,units,growth; or none", func(in *inputs, _ config, name string, src io.Reader, _ bool) (err error) {
			in.Outcomes, err = lab.ReadOutcomes(name, src)
			return err
		}},
		{"cycle", lab.DemoCycle, false, "logger export of the production cycle, CSV: time column, one column per probe", readCycle},
	}
}

// readCycle reads the logger export with the demo's settings or the
// flags'.
func readCycle(in *inputs, cfg config, name string, src io.Reader, demo bool) error {
	rs := lab.DemoCycleSettings()
	if !demo {
		rs = lethality.ReadSettings{Time: timeFormat(cfg.cycleTime), Unit: tempUnit(cfg.cycleUnit)}
	}
	rec, err := lab.ReadCycle(name, src, &rs)
	if errors.Is(err, lethality.ErrTimeUnit) {
		return fmt.Errorf("%w (give -cycle-time seconds or -cycle-time minutes)", err)
	}
	in.Cycle, in.CycleName = rec, name
	return err
}

// loadInputs reads every input from its file, the demo or none.
func loadInputs(cfg config) (inputs, error) {
	given := false
	for _, p := range cfg.files {
		given = given || p != ""
	}
	var in inputs
	var missing []string
	for _, spec := range inputSpecs() {
		path := cfg.files[spec.name]
		switch {
		case path == fromNone && spec.optional:
			in.Sources = append(in.Sources, source{Input: spec.name, From: fromNone})
		case path == fromNone:
			return in, fmt.Errorf("-%s none: this input is required: %w", spec.name, errUsage)
		case path != "":
			f, err := os.Open(path)
			if err != nil {
				return in, fmt.Errorf("-%s: %w", spec.name, err)
			}
			err = spec.read(&in, cfg, path, f, false)
			f.Close()
			if err != nil {
				return in, err
			}
			in.Sources = append(in.Sources, source{Input: spec.name, From: fromFile, Name: path})
		case !given || cfg.demoFill:
			b, err := lab.Demo(spec.demo)
			if err != nil {
				return in, err
			}
			if err := spec.read(&in, cfg, lab.DemoSource(spec.demo), bytes.NewReader(b), true); err != nil {
				return in, err
			}
			in.Sources = append(in.Sources, source{Input: spec.name, From: fromDemo, Name: lab.DemoSource(spec.demo)})
		default:
			missing = append(missing, "-"+spec.name)
		}
	}
	if len(missing) > 0 {
		return in, fmt.Errorf("missing inputs %s: give the files (\"none\" for -temperatures and -outcomes), or -demo-fill to take the invented demo's: %w",
			strings.Join(missing, ", "), errUsage)
	}
	return in, nil
}

// demoInputs lists the inputs taken from the demo.
func (in inputs) demoInputs() []string {
	var d []string
	for _, s := range in.Sources {
		if s.From == fromDemo {
			d = append(d, s.Input)
		}
	}
	return d
}

// timeFormat maps -cycle-time to the reader's format ("" when unknown).
func timeFormat(s string) lethality.TimeFormat {
	switch s {
	case "auto":
		return lethality.TimeAuto
	case "seconds":
		return lethality.TimeSeconds
	case "minutes":
		return lethality.TimeMinutes
	case "rfc3339":
		return lethality.TimeRFC3339
	}
	return ""
}

// validTimeFormat reports whether s is a value of -cycle-time.
func validTimeFormat(s string) bool {
	return s == "auto" || timeFormat(s) != ""
}

// tempUnit maps -cycle-unit to the reader's unit ("" when unknown).
func tempUnit(s string) lethality.TempUnit {
	switch s {
	case "celsius":
		return lethality.Celsius
	case "fahrenheit":
		return lethality.Fahrenheit
	}
	return ""
}

// profileFor returns the minimum-performance profile of -profile for the
// label (nil for none), and whether the name is known.
func profileFor(name string, l resistance.Label) (*resistance.Profile, bool) {
	if name == "auto" {
		switch l.Modality {
		case resistance.MoistHeat:
			name = "fda-steam"
		case resistance.EthyleneOxide:
			name = "fda-eo"
		case resistance.DryHeat:
			name = "fda-dry-heat"
		default:
			name = "none"
		}
	}
	var p resistance.Profile
	switch name {
	case "none":
		return nil, true
	case "fda-steam":
		p = resistance.FDASteamProfile()
	case "fda-eo":
		p = resistance.FDAEthyleneOxideProfile()
	case "fda-dry-heat":
		p = resistance.FDADryHeatProfile()
	case "iso-moist-heat":
		p = resistance.ISOMoistHeatProfile()
	default:
		return nil, false
	}
	return &p, true
}

// zFromName maps -z-from to the short method name of the report ("" when
// unknown).
func zFromName(s string) string {
	switch s {
	case "survivor":
		return nameSurvivor
	case "hsk":
		return lab.NameHSK
	case "limited-hsk":
		return lab.NameLimitedHSK
	case "smc":
		return lab.NameSMC
	case "mle":
		return lab.NameMLE
	}
	return ""
}
