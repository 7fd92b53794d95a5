// Command fractionstudy estimates the D-value of a fraction-negative
// (growth/no-growth) study by every procedure of package fraction, side by
// side: the general and the limited Holcomb–Spearman–Kärber procedures,
// Stumbo–Murphy–Cochran and maximum likelihood (N0 fixed, profile limits).
//
// Usage:
//
//	go run ./examples/fractionstudy                                 # the embedded demo study
//	go run ./examples/fractionstudy -fraction study.csv -n0 2.1e6   # your study, N0 per unit
//	go run ./examples/fractionstudy -fraction study.csv -population plates.csv
//
// The study file is CSV: '#' comment lines, a header row, then one row per
// exposure with the columns
//
//	minutes   min    exposure time
//	units     count  units exposed
//	negative  count  units with no growth (r of the published formulas)
//
// The population N0 (spores per unit) is -n0, or the mean of a population
// assay given by -population (CSV, one row per plate: unit,
// suspension_ml, dilution, plated_ml, colonies; see examples/qualify). With
// no flag the demo's study and population assay are used, an invented lot
// of a fictional supplier. A bad file gives an error naming the file, the
// line and the column.
//
// Exit status 0 when the table was written (a procedure that refuses the
// data is listed with its refusal), 1 when the population assay gives no
// population, 2 for a bad flag or file.
//
// These numbers feed decisions about patient safety. The program computes;
// acceptance of an indicator lot is decided by the laboratory's qualified
// people under the standards and regulations that apply to them. The HSK
// variance and its factor 2 are from memory of ISO 11138-1 Annex D —
// verify.
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
	"github.com/dzf-go/dzf/survivor"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// options are the flags.
type options struct {
	fraction, population string
	n0, level            float64
}

// run is the whole program, returning its exit status.
func run(args []string, stdout, stderr io.Writer) int {
	opt, err := parse(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if err != nil {
		fmt.Fprintln(stderr, "fractionstudy:", err)
		return 2
	}
	ex, exName, err := readInput(opt.fraction, lab.DemoFraction, lab.ReadFraction)
	if err != nil {
		fmt.Fprintln(stderr, "fractionstudy:", err)
		return 2
	}
	log10N0, n0From, code, err := population(opt)
	if err != nil {
		fmt.Fprintln(stderr, "fractionstudy:", err)
		return code
	}
	res := lab.EstimateFraction(log10N0, ex, opt.level)
	write(stdout, exName, n0From, res)
	return 0
}

func parse(args []string, stderr io.Writer) (options, error) {
	var o options
	fs := flag.NewFlagSet("fractionstudy", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.StringVar(&o.fraction, "fraction", "", "fraction-negative study, CSV: minutes,units,negative; default: the demo's")
	fs.StringVar(&o.population, "population", "", "population assay, CSV: unit,suspension_ml,dilution,plated_ml,colonies")
	fs.Float64Var(&o.n0, "n0", 0, "population, spores per unit (instead of -population)")
	fs.Float64Var(&o.level, "level", 0.95, "confidence level of the likelihood limits (HSK keeps its 95.45 %)")
	if err := fs.Parse(args); err != nil {
		return o, err
	}
	switch {
	case fs.NArg() > 0:
		return o, fmt.Errorf("unexpected argument %q (files are given by flags)", fs.Arg(0))
	case !(o.level > 0 && o.level < 1):
		return o, fmt.Errorf("-level %g: must be in (0, 1)", o.level)
	case o.n0 < 0 || math.IsInf(o.n0, 0) || math.IsNaN(o.n0) || (o.n0 > 0 && o.n0 <= 1):
		return o, fmt.Errorf("-n0 %g: must be a number of spores per unit above 1", o.n0)
	case o.n0 > 0 && o.population != "":
		return o, errors.New("give -n0 or -population, not both")
	case o.fraction != "" && o.n0 == 0 && o.population == "":
		return o, errors.New("with -fraction give the population too: -n0 or -population (the demo's would not be your lot's)")
	}
	return o, nil
}

// readInput reads the file at path with read, or the demo file when path
// is empty, returning the data and the source's name.
func readInput[T any](path, demo string, read func(string, io.Reader) (T, error)) (T, string, error) {
	if path == "" {
		b, err := lab.Demo(demo)
		if err != nil {
			var zero T
			return zero, "", err
		}
		v, err := read(lab.DemoSource(demo), bytes.NewReader(b))
		return v, lab.DemoSource(demo), err
	}
	f, err := os.Open(path)
	if err != nil {
		var zero T
		return zero, "", err
	}
	defer f.Close()
	v, err := read(path, f)
	return v, path, err
}

// population returns log10 N0 and where it came from, with the exit status
// of a failure.
func population(o options) (float64, string, int, error) {
	if o.n0 > 0 {
		return math.Log10(o.n0), fmt.Sprintf("-n0 %g per unit", o.n0), 0, nil
	}
	units, name, err := readInput(o.population, lab.DemoPopulation, lab.ReadPopulation)
	if err != nil {
		return 0, "", 2, err
	}
	pop, err := survivor.CountPopulation(units, nil)
	if err != nil {
		return 0, "", 1, fmt.Errorf("%s: %w", name, err)
	}
	return pop.Log10Mean, fmt.Sprintf("mean of %d units of %s, %s per unit", pop.N, name, lab.Format(pop.Mean, 0)), 0, nil
}

func write(w io.Writer, exName, n0From string, r lab.FractionResults) {
	fmt.Fprintf(w, "Fraction-negative study %s\n", exName)
	fmt.Fprintf(w, "log10 N0 %s (%s)\n\n", lab.Format(r.Log10N0, 3), n0From)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  minutes\tunits\tnegative\tfraction negative")
	for _, e := range r.Exposures {
		fmt.Fprintf(tw, "  %s\t%d\t%d\t%s\n", lab.Format(e.Minutes, 2), e.Units, e.Negative, lab.Format(float64(e.Negative)/float64(e.Units), 2))
	}
	tw.Flush()
	fmt.Fprintln(w)
	lab.WriteMethods(w, "  ", r.Methods)
	lab.WriteFractionDetails(w, "  ", r)
	fmt.Fprintln(w)
	fmt.Fprintln(w, "Sources: HSK and limited HSK, ISO 11138-1 Annex D (variance and factor 2 from memory — verify); SMC, Stumbo,")
	fmt.Fprintln(w, "Murphy and Cochran 1950 as described by Lewis 1956; MLE, binomial GLM with complementary log-log link")
	fmt.Fprintln(w, "(McCullagh and Nelder 1989). r counts the negative units in every formula.")
	fmt.Fprintln(w, "Caution: "+lab.Wrap(lab.Caution, 100, "         "))
}
