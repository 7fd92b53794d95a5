package lethality

import (
	"fmt"
	"io"
	"math"
	"strings"
	"time"
)

// Record is a whole multi-probe temperature record in memory: probe names,
// rows with one temperature per probe (NaN where a cell was marked
// missing), the list of cells marked missing, and the header comments.
// Start is the first row's timestamp for RFC 3339 time columns.
type Record struct {
	Probes   []string   `json:"probes"`
	Rows     []Row      `json:"rows"`
	Missing  []Cell     `json:"missing,omitempty"`
	Comments []string   `json:"comments,omitempty"`
	Start    *time.Time `json:"start,omitempty"`
}

// ReadRecord reads a whole logger export (see Reader for the format and
// ReadSettings for the options). It refuses a file without a data row
// (*ParseError wrapping ErrNoRows) and everything the Reader refuses.
func ReadRecord(src io.Reader, s *ReadSettings) (Record, error) {
	rd, err := NewReader(src, s)
	if err != nil {
		return Record{}, err
	}
	rec := Record{Probes: rd.Probes(), Comments: rd.Comments()}
	p := len(rec.Probes)
	var flat []float64
	for {
		row, err := rd.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return Record{}, err
		}
		flat = append(flat, row.Celsius...)
		rec.Rows = append(rec.Rows, Row{Line: row.Line, Minutes: row.Minutes})
		rec.Missing = append(rec.Missing, rd.Missing()...)
	}
	if len(rec.Rows) == 0 {
		return Record{}, &ParseError{Line: rd.line + 1, Err: fmt.Errorf("header but no row: %w", ErrNoRows)}
	}
	for i := range rec.Rows {
		rec.Rows[i].Celsius = flat[i*p : (i+1)*p : (i+1)*p]
	}
	if t, ok := rd.Start(); ok {
		rec.Start = &t
	}
	return rec, nil
}

// Series returns the samples of one probe (by index), leaving out cells
// marked missing (NaN), with the number left out.
func (r Record) Series(probe int) ([]Sample, int, error) {
	if probe < 0 || probe >= len(r.Probes) {
		return nil, 0, fmt.Errorf("probe index %d of %d probes: %w", probe, len(r.Probes), ErrNoProbe)
	}
	out := make([]Sample, 0, len(r.Rows))
	skipped := 0
	for i, row := range r.Rows {
		if len(row.Celsius) != len(r.Probes) {
			return nil, 0, fmt.Errorf("row %d (line %d): %d temperatures for %d probes: %w", i, row.Line, len(row.Celsius), len(r.Probes), ErrRowLength)
		}
		if math.IsNaN(row.Celsius[probe]) {
			skipped++
			continue
		}
		out = append(out, Sample{Minutes: row.Minutes, Celsius: row.Celsius[probe]})
	}
	return out, skipped, nil
}

// ProbeF is the lethality of one probe of a streamed record.
type ProbeF struct {
	Probe string  `json:"probe"`
	F     FResult `json:"f"`
	// Missing counts the cells of this probe marked missing; they are left
	// out and the integration bridges them (listed in MissingCells, the
	// first 100, and warned about in F.Warnings).
	Missing      int    `json:"missing"`
	MissingCells []Cell `json:"missing_cells,omitempty"`
}

// StreamResult is the lethality of every probe of a streamed record, with
// the coldest probe (smallest F).
type StreamResult struct {
	Probes []ProbeF `json:"probes"`
	// ColdSpot is the index of the probe with the smallest F, MinF that F.
	ColdSpot      int      `json:"cold_spot"`
	ColdSpotProbe string   `json:"cold_spot_probe"`
	MinF          float64  `json:"min_f"`
	Rows          int      `json:"rows"`
	Warnings      []string `json:"warnings,omitempty"`
}

// String formats the result, one line per probe.
func (s StreamResult) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%d rows; cold spot %s, F %.4g min", s.Rows, s.ColdSpotProbe, s.MinF)
	for _, p := range s.Probes {
		fmt.Fprintf(&b, "\n  %s: F %.4g min", p.Probe, p.F.F)
		if p.Missing > 0 {
			fmt.Fprintf(&b, " (%d missing readings bridged)", p.Missing)
		}
	}
	for _, w := range s.Warnings {
		b.WriteString("\n  warning: " + w)
	}
	return b.String()
}

// StreamF reads a logger export from src and integrates every probe as it
// goes, one Accumulator per probe, in memory bounded by the number of
// probes (not of rows). Cells marked missing (rs.Missing = MissingMark) are
// left out of their probe's integration, which then bridges the gap: each
// is counted and listed (the first 100 per probe) and warned about, and
// fs.MaxGap applies to the bridged interval. It refuses what the Reader
// and F refuse, naming the line and the probe.
func StreamF(src io.Reader, ref Reference, rs *ReadSettings, fs *FSettings) (StreamResult, error) {
	rd, err := NewReader(src, rs)
	if err != nil {
		return StreamResult{}, err
	}
	probes := rd.Probes()
	acc := make([]*Accumulator, len(probes))
	res := StreamResult{Probes: make([]ProbeF, len(probes))}
	for j := range probes {
		if acc[j], err = NewAccumulator(ref, fs); err != nil {
			return StreamResult{}, err
		}
		res.Probes[j].Probe = probes[j]
	}
	for {
		row, err := rd.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return StreamResult{}, err
		}
		for j, c := range row.Celsius {
			if math.IsNaN(c) {
				p := &res.Probes[j]
				p.Missing++
				if len(p.MissingCells) < maxListedGaps {
					for _, m := range rd.Missing() {
						if m.Column == j+2 {
							p.MissingCells = append(p.MissingCells, m)
						}
					}
				}
				continue
			}
			if err := acc[j].Add(Sample{Minutes: row.Minutes, Celsius: c}); err != nil {
				return StreamResult{}, fmt.Errorf("line %d, probe %q: %w", row.Line, probes[j], err)
			}
		}
	}
	res.Rows = rd.Rows()
	if res.Rows == 0 {
		return StreamResult{}, &ParseError{Line: rd.line + 1, Err: fmt.Errorf("header but no row: %w", ErrNoRows)}
	}
	res.MinF = math.Inf(1)
	for j := range probes {
		f, err := acc[j].Result()
		if err != nil {
			return StreamResult{}, fmt.Errorf("probe %q: %w", probes[j], err)
		}
		p := &res.Probes[j]
		if p.Missing > 0 {
			f.Warnings = append(f.Warnings, fmt.Sprintf("%d missing reading(s) left out and bridged (first at line %d)", p.Missing, p.MissingCells[0].Line))
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q: %d missing reading(s) bridged", probes[j], p.Missing))
		}
		for _, w := range f.Warnings[:len(f.Warnings)-min(1, p.Missing)] {
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q: %s", probes[j], w)) // gap warnings
		}
		p.F = f
		if f.F < res.MinF {
			res.MinF, res.ColdSpot, res.ColdSpotProbe = f.F, j, probes[j]
		}
	}
	return res, nil
}
