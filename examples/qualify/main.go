// Command qualify qualifies an incoming biological-indicator lot against
// its label and judges a sterilization cycle with it: the population
// against the label; D at the label's temperature by survivor curve,
// Holcomb–Spearman–Kärber (general and limited), Stumbo–Murphy–Cochran and
// maximum likelihood, with limits, warnings and whether the methods agree;
// the z-value; the label check criterion by criterion with sources; F0 per
// probe of a production cycle, its cold spot and phase times; the log
// reduction and PNSU of this indicator at the cold spot; overkill and
// half-cycle statements; and the cautions.
//
// Usage:
//
//	go run ./examples/qualify                  # the embedded demo scenario
//	go run ./examples/qualify -json            # the same as JSON
//	go run ./examples/qualify -label L.json -population P.csv -survivor S.csv \
//	    -fraction F.csv -temperatures T.csv -outcomes O.csv \
//	    -cycle C.csv -cycle-time seconds
//
// With no input flag the program reads the embedded demo: an invented lot
// of a fictional supplier tested by a fictional laboratory (the same files
// as testdata/demo in the module). Once any input file is given, every
// other input must be given too, or "none" for the optional ones
// (-temperatures, -outcomes), unless -demo-fill takes the missing ones from
// the demo; the report lists where each input came from and warns when
// demo data are mixed in.
//
// # Input files
//
// Every CSV file has '#' comment lines (at the start of a line), then a
// header row naming the columns (any order, any case), then one row per
// record; blank lines are skipped, fields may be quoted, a column the format
// does not define is refused. Numbers are decimal with a point.
//
//	-population  one row per plate
//	  unit           text   the unit's label; rows of a unit need not be adjacent
//	  suspension_ml  mL     suspension the unit was recovered into (same on every row of the unit)
//	  dilution       1      factor of the plated liquid, 10^-k in (0, 1] (1e-3 for the third tenfold tube)
//	  plated_ml      mL     volume plated or filtered
//	  colonies       count  colonies on the plate (plates outside 30–300 are set aside)
//
//	-survivor  one row per counted unit (survivor curve at the label's temperature)
//	  minutes  min    exposure time (0 for unexposed units)
//	  count    /unit  survivors per unit, not its logarithm; rows at one time are replicates
//
//	-fraction  one row per exposure (fraction negative at the label's temperature)
//	  minutes   min    exposure time
//	  units     count  units exposed
//	  negative  count  units with no growth (r of the published formulas)
//
//	-temperatures  one row per D at another temperature (for the z-value)
//	  celsius  °C    temperature
//	  d        min   D-value
//	  lower    min   lower limit of D
//	  upper    min   upper limit of D
//	  level    1     two-sided confidence level of the limits, e.g. 0.95
//	  method   text  optional: how D was determined
//
//	-outcomes  one row per test, each at most once
//	  test     text   survival, kill (resistometer, at the label's times) or half-cycle (sterilizer)
//	  minutes  min    exposure time (half cycle: its exposure time)
//	  units    count  units tested
//	  growth   count  units that grew
//
// The label (-label) is a JSON object, '#' comment lines allowed:
//
//	supplier, product, lot, organism  text
//	modality       text  "moist heat", "ethylene oxide", "dry heat" or "other"
//	population     /unit labelled spores per unit, a count (required)
//	d              min   labelled D at celsius (required)
//	celsius        °C    temperature of the labelled D and window (required)
//	z              °C    labelled z (0 or absent: not stated)
//	survival_time  min   labelled survival time (0 or absent: not stated)
//	kill_time      min   labelled kill time (0 or absent: not stated)
//
// The cycle (-cycle) is a logger export as package lethality reads it: '#'
// comment lines, a header naming the time column and one column per probe,
// one row per reading; comma, semicolon or tab (detected); time as RFC 3339
// timestamps, or as numbers of seconds or minutes stated with -cycle-time
// (never guessed); °C, or °F with -cycle-unit fahrenheit.
//
// All studies are taken to be at the label's temperature and conditions.
//
// # Settings
//
//	-level 0.95            two-sided level of every limit (the HSK limits keep the procedure's ±2√V, 95.45 %)
//	-sterilization 121     sterilization temperature of the cycle, °C, the lower end of its band
//	-band 3                width of the band above it, °C (from memory of the common steam-sterilizer standard — verify)
//	-tref 121.1 -zref 10   reference of F0, °C
//	-sal -6                target, log10 of the expected survivors per unit
//	-profile auto          minimum-performance profile: auto (by the label's modality), none, fda-steam, fda-eo, fda-dry-heat, iso-moist-heat
//	-z-from survivor       method whose D at the label's temperature joins the -temperatures points: survivor, hsk, limited-hsk, smc, mle
//	-exclude-zero-counts   leave survivor counts of 0 out of the curve (listed), instead of refusing them
//	-cycle-time, -cycle-unit, -demo-fill, -json   as above
//
// # Rules the report applies
//
// The methods agree when every method's D lies within ±20 % of the mean of
// all methods' D and the limits of every two methods that give limits
// overlap (this program's rule, no published source). The label check is
// resistance.CheckLabel with its default limits and the profile. The
// indicator's log reduction and PNSU at the cold spot use F against the
// label's temperature with the z of F0, so that F/D uses D as measured; the
// conservative figures use D's upper limit; "SAL met" means log10 PNSU ≤
// -sal. Overkill is F0 ≥ 12 × 1 min at the cold spot, and 12 logs of this
// indicator at the highest upper limit of D among the methods. The
// half-cycle credit is lethality.HalfCycle on the outcomes' half-cycle run.
//
// # Output and exit status
//
// Aligned text by default; -json writes every number of the text (and the
// full results behind them) as one JSON object, non-finite numbers as the
// strings "NaN", "+Inf" and "-Inf". Exit status 0 when the report was
// written, 1 when the data could not give one (a refusal the report cannot
// work around, such as a population assay with no countable plate), 2 for
// a bad flag or a bad file (the message names the file, the line and the
// column).
//
// # Cautions
//
// These numbers feed decisions about patient safety. The program computes;
// acceptance of an indicator lot or a process is decided by the
// laboratory's qualified people under the standards and regulations that
// apply to them. Limits marked "verify" are from memory or quoted
// secondarily and must be checked against the texts in force.
package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"strings"

	"github.com/dzf-go/dzf/resistance"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// Exit statuses.
const (
	exitOK      = 0
	exitRefused = 1
	exitUsage   = 2
)

// errUsage marks a bad flag or a bad combination of flags.
var errUsage = errors.New("usage")

// run is the whole program, returning its exit status.
func run(args []string, stdout, stderr io.Writer) int {
	cfg, err := parseFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return exitOK
	}
	if err != nil {
		fmt.Fprintln(stderr, "qualify:", err)
		return exitUsage
	}
	in, err := loadInputs(cfg)
	if err != nil {
		fmt.Fprintln(stderr, "qualify:", err)
		return exitUsage
	}
	rep, err := buildReport(cfg, in)
	if err != nil {
		fmt.Fprintln(stderr, "qualify: no report:", err)
		return exitRefused
	}
	if cfg.json {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(rep); err != nil {
			fmt.Fprintln(stderr, "qualify:", err)
			return exitRefused
		}
		return exitOK
	}
	writeText(stdout, rep)
	return exitOK
}

// config holds the flags.
type config struct {
	files    map[string]string // input name → path as given ("" when not given)
	demoFill bool
	json     bool

	level         float64
	sterilization float64
	band          float64
	tRef, zRef    float64
	log10SAL      float64
	profile       string
	zFrom         string
	excludeZero   bool
	cycleTime     string
	cycleUnit     string
}

// parseFlags reads the command line.
func parseFlags(args []string, stderr io.Writer) (config, error) {
	cfg := config{files: map[string]string{}}
	fs := flag.NewFlagSet("qualify", flag.ContinueOnError)
	fs.SetOutput(stderr)
	paths := map[string]*string{}
	for _, in := range inputSpecs() {
		paths[in.name] = fs.String(in.name, "", in.usage)
	}
	fs.BoolVar(&cfg.demoFill, "demo-fill", false, "take inputs not given from the invented demo (marked in the report)")
	fs.BoolVar(&cfg.json, "json", false, "write the report as JSON")
	fs.Float64Var(&cfg.level, "level", 0.95, "two-sided confidence level of the limits (the HSK limits keep their own 95.45 %)")
	fs.Float64Var(&cfg.sterilization, "sterilization", 121, "sterilization temperature of the cycle, °C (the lower end of its band)")
	fs.Float64Var(&cfg.band, "band", 3, "width of the sterilization band above the sterilization temperature, °C (from memory — verify)")
	fs.Float64Var(&cfg.tRef, "tref", 121.1, "reference temperature of F0, °C")
	fs.Float64Var(&cfg.zRef, "zref", 10, "z-value of F0, °C")
	fs.Float64Var(&cfg.log10SAL, "sal", -6, "target: log10 of the expected survivors per unit (the SAL), e.g. -6")
	fs.StringVar(&cfg.profile, "profile", "auto", "minimum-performance profile: auto (by the label's modality), none, fda-steam, fda-eo, fda-dry-heat, iso-moist-heat")
	fs.BoolVar(&cfg.excludeZero, "exclude-zero-counts", false, "leave survivor counts of 0 out of the curve, listed with their reason (default: refuse them)")
	fs.StringVar(&cfg.zFrom, "z-from", "survivor", "method whose D at the label's temperature joins the -temperatures points: survivor, hsk, limited-hsk, smc, mle")
	fs.StringVar(&cfg.cycleTime, "cycle-time", "auto", "time column of -cycle: auto (RFC 3339 timestamps), seconds, minutes, rfc3339")
	fs.StringVar(&cfg.cycleUnit, "cycle-unit", "celsius", "temperature unit of -cycle: celsius or fahrenheit")
	if err := fs.Parse(args); err != nil {
		return cfg, err
	}
	if fs.NArg() > 0 {
		return cfg, fmt.Errorf("unexpected argument %q (inputs are given by flags, see -help): %w", fs.Arg(0), errUsage)
	}
	for name, p := range paths {
		cfg.files[name] = strings.TrimSpace(*p)
	}
	return cfg, cfg.check()
}

// check refuses settings out of range.
func (c config) check() error {
	bad := func(name string, v any, want string) error {
		return fmt.Errorf("-%s %v: must be %s: %w", name, v, want, errUsage)
	}
	switch {
	case !(c.level > 0 && c.level < 1):
		return bad("level", c.level, "in (0, 1)")
	case !(c.band > 0) || c.band > 1e6:
		return bad("band", c.band, "positive")
	case !(c.zRef > 0) || c.zRef > 1e6:
		return bad("zref", c.zRef, "positive")
	case !(c.log10SAL < 0) || c.log10SAL < -300:
		return bad("sal", c.log10SAL, "negative (log10 of the target), e.g. -6")
	case !finite(c.sterilization):
		return bad("sterilization", c.sterilization, "a finite temperature")
	case !finite(c.tRef):
		return bad("tref", c.tRef, "a finite temperature")
	}
	if _, ok := profileFor(c.profile, resistance.Label{}); !ok {
		return bad("profile", c.profile, "auto, none, fda-steam, fda-eo, fda-dry-heat or iso-moist-heat")
	}
	if zFromName(c.zFrom) == "" {
		return bad("z-from", c.zFrom, "survivor, hsk, limited-hsk, smc or mle")
	}
	if !validTimeFormat(c.cycleTime) {
		return bad("cycle-time", c.cycleTime, "auto, seconds, minutes or rfc3339")
	}
	if tempUnit(c.cycleUnit) == "" {
		return bad("cycle-unit", c.cycleUnit, "celsius or fahrenheit")
	}
	return nil
}

// finite reports whether v is neither NaN nor ±Inf.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
