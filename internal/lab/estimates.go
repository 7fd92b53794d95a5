package lab

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"github.com/dzf-go/dzf/fraction"
	"github.com/dzf-go/dzf/resistance"
)

// Method is one D-value estimate of a study, or the reason its procedure
// refused the data.
type Method struct {
	// Name is a short name for tables ("survivor curve", "HSK", ...).
	Name string `json:"name"`
	// Estimate is nil when the procedure refused the data.
	Estimate *resistance.Estimate `json:"estimate,omitempty"`
	// RelativeHalfWidth is the larger distance of a limit from D, divided
	// by D (resistance.Estimate.RelativeHalfWidth; NaN without limits).
	RelativeHalfWidth Num `json:"relative_half_width"`
	// Refused is the refusal, empty when there is an estimate.
	Refused string `json:"refused,omitempty"`
}

// NewMethod returns the Method named name from an estimate and the error of
// the procedure that gave it.
func NewMethod(name string, e resistance.Estimate, err error) Method {
	if err != nil {
		return Method{Name: name, Refused: err.Error(), RelativeHalfWidth: Num(math.NaN())}
	}
	return Method{Name: name, Estimate: &e, RelativeHalfWidth: Num(e.RelativeHalfWidth())}
}

// Short names of the fraction-negative procedures.
const (
	NameHSK        = "HSK"
	NameLimitedHSK = "limited HSK"
	NameSMC        = "SMC"
	NameMLE        = "MLE"
)

// FractionResults are the D-value estimates of one fraction-negative study
// by every procedure of the fraction package, each result kept whole (nil
// when refused; Methods then holds the refusal).
type FractionResults struct {
	Log10N0    float64             `json:"log10_n0"`
	Exposures  []fraction.Exposure `json:"exposures"`
	HSK        *fraction.HSKResult `json:"hsk,omitempty"`
	LimitedHSK *fraction.HSKResult `json:"limited_hsk,omitempty"`
	SMC        *fraction.SMCResult `json:"smc,omitempty"`
	MLE        *fraction.MLEResult `json:"mle,omitempty"`
	// Methods lists the four estimates in the order HSK, limited HSK, SMC,
	// MLE.
	Methods []Method `json:"methods"`
}

// EstimateFraction estimates D from a fraction-negative study by the
// general and the limited Holcomb–Spearman–Kärber procedures, the
// Stumbo–Murphy–Cochran procedure and maximum likelihood with N0 fixed at
// log10N0 and profile limits at level (the fraction package documents each
// and its source). A procedure that refuses the data leaves its result nil
// and its refusal in Methods.
func EstimateFraction(log10N0 float64, ex []fraction.Exposure, level float64) FractionResults {
	r := FractionResults{Log10N0: log10N0, Exposures: ex}
	hsk, err := fraction.HSK(log10N0, ex)
	if err == nil {
		r.HSK = &hsk
	}
	r.Methods = append(r.Methods, NewMethod(NameHSK, hsk.Estimate, err))
	lim, err := fraction.LimitedHSK(log10N0, ex)
	if err == nil {
		r.LimitedHSK = &lim
	}
	r.Methods = append(r.Methods, NewMethod(NameLimitedHSK, lim.Estimate, err))
	smc, err := fraction.SMC(log10N0, ex)
	if err == nil {
		r.SMC = &smc
	}
	r.Methods = append(r.Methods, NewMethod(NameSMC, smc.Estimate, err))
	mle, err := fraction.MLE(log10N0, ex, &fraction.MLESettings{Level: level})
	if err == nil {
		r.MLE = &mle
	}
	r.Methods = append(r.Methods, NewMethod(NameMLE, mle.Estimate, err))
	return r
}

// WriteMethods writes the estimates side by side as an aligned table (D,
// limits, level, the larger distance of a limit from D in percent of D),
// then each method's warnings and refusals, indented by indent.
func WriteMethods(w io.Writer, indent string, ms []Method) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "%smethod\tD min\tlower\tupper\tlevel\tlimits within\n", indent)
	for _, m := range ms {
		if m.Estimate == nil {
			fmt.Fprintf(tw, "%s%s\trefused\t\t\t\t\n", indent, m.Name)
			continue
		}
		e := m.Estimate
		fmt.Fprintf(tw, "%s%s\t%s\t%s\t%s\t%s\t%s\n", indent, m.Name, Format(e.Value, 3), Format(e.Lower, 3),
			Format(e.Upper, 3), Percent(e.Level, 2), Percent(float64(m.RelativeHalfWidth), 1))
	}
	tw.Flush()
	for _, m := range ms {
		switch {
		case m.Estimate == nil:
			fmt.Fprintf(w, "%s%s\n", indent, Wrap(m.Name+" refused: "+m.Refused, 100, indent+"  "))
		case len(m.Estimate.Warnings) > 0:
			fmt.Fprintf(w, "%s%s warnings:\n", indent, m.Name)
			for _, s := range m.Estimate.Warnings {
				fmt.Fprintf(w, "%s  - %s\n", indent, Wrap(s, 100, indent+"    "))
			}
		}
	}
}

// WriteFractionDetails writes the working numbers of each procedure that
// gave a result: Ū and V of the HSK procedures, the per-exposure D of SMC,
// the deviance of the likelihood fit; each line starts with indent.
func WriteFractionDetails(w io.Writer, indent string, f FractionResults) {
	if h := f.HSK; h != nil {
		fmt.Fprintf(w, "%sHSK: mean time to sterility Ū %s min, V %s min², divisor %s\n", indent, fixed3(h.MeanTime), Format(h.Variance, 4), fixed3(h.Divisor))
	}
	if h := f.LimitedHSK; h != nil {
		fmt.Fprintf(w, "%slimited HSK: Ū %s min, V %s min², interval %s min, %d units per exposure\n", indent, fixed3(h.MeanTime), Format(h.Variance, 4), fixed2(h.Interval), h.Units)
	}
	if s := f.SMC; s != nil {
		var pts []string
		for _, p := range s.Points {
			pts = append(pts, fmt.Sprintf("%s min %d/%d negative D %s", fixed1(p.Minutes), p.Negative, p.Units, fixed3(p.D)))
		}
		fmt.Fprintln(w, indent+Wrap(fmt.Sprintf("SMC: %s; SD %s min", strings.Join(pts, "; "), fixed3(s.SD)), 100, indent+"  "))
	}
	if m := f.MLE; m != nil {
		fmt.Fprintf(w, "%sMLE: N0 fixed, deviance %s on %d df, p %s; %d fractional exposures\n", indent, fixed2(m.Deviance), m.DF, fixed3(m.FitP), m.Fractional)
	}
}

func fixed1(v float64) string { return Format(v, 1) }
func fixed2(v float64) string { return Format(v, 2) }
func fixed3(v float64) string { return Format(v, 3) }

// Wrap breaks s into lines that end at column width (longer words stay
// whole; a unit such as "%" or "°C" stays with its number). Every line
// after the first starts with indent; the first is taken to follow a
// prefix as wide as indent.
func Wrap(s string, width int, indent string) string {
	var words []string
	for _, w := range strings.Fields(s) {
		if len(words) > 0 && (strings.HasPrefix(w, "%") || strings.HasPrefix(w, "°")) {
			words[len(words)-1] += " " + w
			continue
		}
		words = append(words, w)
	}
	var b strings.Builder
	n := len([]rune(indent))
	for i, word := range words {
		k := len([]rune(word))
		if i > 0 {
			if n+1+k > width {
				b.WriteString("\n" + indent)
				n = len([]rune(indent))
			} else {
				b.WriteString(" ")
				n++
			}
		}
		b.WriteString(word)
		n += k
	}
	return b.String()
}
