// Command f0 computes the F0 of every probe of a sterilizer logger export
// and names the cold spot, the probe with the smallest F0.
//
// Usage:
//
//	go run ./examples/f0                                  # the embedded demo cycle
//	go run ./examples/f0 -cycle export.csv -time seconds  # your logger export
//
// The logger export is read as package lethality reads it: '#' comment
// lines, a header naming the time column and one column per probe, then one
// row per reading; comma, semicolon or tab (detected); time as RFC 3339
// timestamps, or as numbers of seconds or minutes stated with -time (never
// guessed); °C, or °F with -unit fahrenheit. A bad file gives an error
// naming the file, the line and the probe's column.
//
// F = ∫ 10^((T − T_ref)/z) dt in minutes at T_ref, by default F0 (T_ref
// 121.1 °C, z 10 °C; from memory of the European Pharmacopoeia's chapter on
// F0 — verify), integrated exactly for temperatures linear between
// readings (-rule exact; trapezoid and rectangle on request).
//
// Exit status 0 when the table was written, 1 when a probe's record was
// refused, 2 for a bad flag or file.
//
// These numbers feed decisions about patient safety. The program computes;
// acceptance of a process is decided by the laboratory's qualified people
// under the standards and regulations that apply to them.
package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"text/tabwriter"

	"github.com/dzf-go/dzf/internal/lab"
	"github.com/dzf-go/dzf/lethality"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// options are the flags.
type options struct {
	cycle, time, unit, rule string
	ref                     lethality.Reference
}

// probeF is one probe's F and temperature range.
type probeF struct {
	Probe    string
	F        float64
	Min, Max float64
}

// result is the table the program prints.
type result struct {
	Source   string
	Rows     int
	From, To float64 // minutes
	Ref      lethality.Reference
	Rule     lethality.Rule
	Probes   []probeF
	ColdSpot int
}

// run is the whole program, returning its exit status.
func run(args []string, stdout, stderr io.Writer) int {
	opt, err := parse(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if err != nil {
		fmt.Fprintln(stderr, "f0:", err)
		return 2
	}
	rec, source, err := read(opt)
	if err != nil {
		fmt.Fprintln(stderr, "f0:", err)
		return 2
	}
	res, err := compute(rec, opt)
	if err != nil {
		fmt.Fprintf(stderr, "f0: %s: %v\n", source, err)
		return 1
	}
	res.Source = source
	write(stdout, res)
	return 0
}

func parse(args []string, stderr io.Writer) (options, error) {
	var o options
	fs := flag.NewFlagSet("f0", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.StringVar(&o.cycle, "cycle", "", "logger export (CSV); default: the embedded demo cycle")
	fs.StringVar(&o.time, "time", "auto", "time column: auto (RFC 3339 timestamps), seconds, minutes or rfc3339")
	fs.StringVar(&o.unit, "unit", "celsius", "temperature unit: celsius or fahrenheit")
	fs.StringVar(&o.rule, "rule", "exact", "integration rule: exact, trapezoid or rectangle")
	o.ref = lethality.MoistHeat()
	fs.Float64Var(&o.ref.TRef, "tref", o.ref.TRef, "reference temperature, °C")
	fs.Float64Var(&o.ref.Z, "z", o.ref.Z, "z-value, °C")
	if err := fs.Parse(args); err != nil {
		return o, err
	}
	if fs.NArg() > 0 {
		return o, fmt.Errorf("unexpected argument %q (the file is given by -cycle)", fs.Arg(0))
	}
	if err := o.ref.Validate(); err != nil {
		return o, fmt.Errorf("-tref %g -z %g: %w", o.ref.TRef, o.ref.Z, err)
	}
	if o.time != "auto" && o.time != "seconds" && o.time != "minutes" && o.time != "rfc3339" {
		return o, fmt.Errorf("-time %q: must be auto, seconds, minutes or rfc3339", o.time)
	}
	if o.unit != "celsius" && o.unit != "fahrenheit" {
		return o, fmt.Errorf("-unit %q: must be celsius or fahrenheit", o.unit)
	}
	if o.rule != "exact" && o.rule != "trapezoid" && o.rule != "rectangle" {
		return o, fmt.Errorf("-rule %q: must be exact, trapezoid or rectangle", o.rule)
	}
	return o, nil
}

// read reads the logger export of -cycle, or the demo's.
func read(o options) (lethality.Record, string, error) {
	if o.cycle == "" {
		b, err := lab.Demo(lab.DemoCycle)
		if err != nil {
			return lethality.Record{}, "", err
		}
		rs := lab.DemoCycleSettings()
		name := lab.DemoSource(lab.DemoCycle)
		rec, err := lab.ReadCycle(name, bytes.NewReader(b), &rs)
		return rec, name, err
	}
	f, err := os.Open(o.cycle)
	if err != nil {
		return lethality.Record{}, "", err
	}
	defer f.Close()
	tf := lethality.TimeFormat(o.time)
	if o.time == "auto" {
		tf = lethality.TimeAuto
	}
	rs := lethality.ReadSettings{Time: tf, Unit: lethality.TempUnit(o.unit)}
	rec, err := lab.ReadCycle(o.cycle, f, &rs)
	if errors.Is(err, lethality.ErrTimeUnit) {
		err = fmt.Errorf("%w (give -time seconds or -time minutes)", err)
	}
	return rec, o.cycle, err
}

// compute integrates every probe and finds the cold spot.
func compute(rec lethality.Record, o options) (result, error) {
	res := result{Rows: len(rec.Rows), Ref: o.ref, Rule: lethality.Rule(o.rule)}
	res.From, res.To = rec.Rows[0].Minutes, rec.Rows[len(rec.Rows)-1].Minutes
	for j, name := range rec.Probes {
		samples, _, err := rec.Series(j)
		if err != nil {
			return res, fmt.Errorf("probe %q: %w", name, err)
		}
		f, err := lethality.F(samples, o.ref, &lethality.FSettings{Rule: res.Rule})
		if err != nil {
			return res, fmt.Errorf("probe %q: %w", name, err)
		}
		p := probeF{Probe: name, F: f.F, Min: math.Inf(1), Max: math.Inf(-1)}
		for _, s := range samples {
			p.Min, p.Max = math.Min(p.Min, s.Celsius), math.Max(p.Max, s.Celsius)
		}
		if len(res.Probes) > 0 && p.F < res.Probes[res.ColdSpot].F {
			res.ColdSpot = j
		}
		res.Probes = append(res.Probes, p)
	}
	return res, nil
}

func write(w io.Writer, r result) {
	fmt.Fprintf(w, "F per probe: T_ref %s °C, z %s °C, %s rule\n", lab.Format(r.Ref.TRef, 1), lab.Format(r.Ref.Z, 1), r.Rule)
	fmt.Fprintf(w, "%s: %d rows, %s – %s min\n\n", r.Source, r.Rows, lab.Format(r.From, 2), lab.Format(r.To, 2))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "probe\tF min\tmin °C\tmax °C")
	for i, p := range r.Probes {
		mark := ""
		if i == r.ColdSpot {
			mark = "\t<- cold spot"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s%s\n", p.Probe, lab.Format(p.F, 2), lab.Format(p.Min, 2), lab.Format(p.Max, 2), mark)
	}
	tw.Flush()
	c := r.Probes[r.ColdSpot]
	fmt.Fprintf(w, "\ncold spot: %s, F %s min\n\n", c.Probe, lab.Format(c.F, 2))
	fmt.Fprintln(w, "Caution: "+lab.Wrap(lab.Caution+" F0's reference 121.1 °C and z 10 °C are from memory of the European "+
		"Pharmacopoeia's chapter on F0 — verify. An F-value is only as good as the temperature record (probe calibration "+
		"and placement, logging interval).", 100, "         "))
}
