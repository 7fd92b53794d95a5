package lethality

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// smoothRecord returns n samples, one per second, of an invented cycle: a
// cosine-shaped rise from 100 °C to 122 °C and back (steps below 0.01 °C).
func smoothRecord(n int) []Sample {
	s := make([]Sample, n)
	for i := range s {
		u := float64(i) / float64(n-1)
		s[i] = Sample{Minutes: float64(i) / 60, Celsius: 111 - 11*math.Cos(2*math.Pi*u)}
	}
	return s
}

// loggerRecord returns n samples, one per second, of an invented logger
// trace: 121.3 °C with readings rounded to 0.1 °C and ±0.2 °C noise
// (seeded), so that most steps are 0.1–0.4 °C (the difference branch of
// the exact rule).
func loggerRecord(n int) []Sample {
	rng := rand.New(rand.NewPCG(9, 9))
	s := make([]Sample, n)
	for i := range s {
		s[i] = Sample{Minutes: float64(i) / 60, Celsius: math.Round((121.3+0.2*rng.NormFloat64())*10) / 10}
	}
	return s
}

var sinkF float64

func BenchmarkF(b *testing.B) {
	for _, rec := range []struct {
		name string
		make func(int) []Sample
	}{{"smooth", smoothRecord}, {"logger", loggerRecord}} {
		for _, n := range []int{1000, 1000000} {
			samples := rec.make(n)
			for _, rule := range []Rule{Rectangle, Trapezoid, Exact} {
				b.Run(fmt.Sprintf("record=%s/n=%d/rule=%s", rec.name, n, rule), func(b *testing.B) {
					b.ReportAllocs()
					set := &FSettings{Rule: rule}
					for b.Loop() {
						r, err := F(samples, MoistHeat(), set)
						if err != nil {
							b.Fatal(err)
						}
						sinkF = r.F
					}
					b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/sample")
				})
			}
		}
	}
}

func BenchmarkAccumulator(b *testing.B) {
	samples := loggerRecord(1000000)
	b.ReportAllocs()
	for b.Loop() {
		acc, _ := NewAccumulator(MoistHeat(), nil)
		for _, x := range samples {
			if err := acc.Add(x); err != nil {
				b.Fatal(err)
			}
		}
		sinkF = acc.Current()
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/1e6, "ns/sample")
}

// fourProbeFile returns an invented 4-probe export of n rows (seconds,
// readings with one decimal).
func fourProbeFile(n int) []byte {
	var buf bytes.Buffer
	buf.WriteString("# invented benchmark data\nseconds,P1,P2,P3,P4\n")
	var line []byte
	for i := range n {
		line = strconv.AppendInt(line[:0], int64(i), 10)
		for j := range 4 {
			line = append(line, ',')
			line = strconv.AppendFloat(line, 110+float64((i*7+j*13)%130)/10, 'f', 1, 64)
		}
		line = append(line, '\n')
		buf.Write(line)
	}
	return buf.Bytes()
}

func BenchmarkRead(b *testing.B) {
	const n = 1000000
	data := fourProbeFile(n)
	set := &ReadSettings{Time: TimeSeconds}
	b.Run("reader/probes=4", func(b *testing.B) {
		b.ReportAllocs()
		b.SetBytes(int64(len(data)))
		for b.Loop() {
			rd, err := NewReader(bytes.NewReader(data), set)
			if err != nil {
				b.Fatal(err)
			}
			for {
				row, err := rd.Next()
				if err == io.EOF {
					break
				}
				if err != nil {
					b.Fatal(err)
				}
				sinkF = row.Celsius[3]
			}
		}
		b.ReportMetric(float64(n)*float64(b.N)/b.Elapsed().Seconds(), "rows/s")
	})
	// For comparison: encoding/csv with strconv.ParseFloat, the same work
	// without the checks.
	b.Run("encoding-csv-baseline/probes=4", func(b *testing.B) {
		b.ReportAllocs()
		b.SetBytes(int64(len(data)))
		for b.Loop() {
			cr := csv.NewReader(bytes.NewReader(data))
			cr.Comment = '#'
			cr.ReuseRecord = true
			if _, err := cr.Read(); err != nil {
				b.Fatal(err)
			}
			for {
				rec, err := cr.Read()
				if err == io.EOF {
					break
				}
				if err != nil {
					b.Fatal(err)
				}
				for _, f := range rec {
					v, err := strconv.ParseFloat(f, 64)
					if err != nil {
						b.Fatal(err)
					}
					sinkF = v
				}
			}
		}
		b.ReportMetric(float64(n)*float64(b.N)/b.Elapsed().Seconds(), "rows/s")
	})
	b.Run("streamF/probes=4", func(b *testing.B) {
		b.ReportAllocs()
		b.SetBytes(int64(len(data)))
		for b.Loop() {
			res, err := StreamF(bytes.NewReader(data), MoistHeat(), set, nil)
			if err != nil {
				b.Fatal(err)
			}
			sinkF = res.MinF
		}
		b.ReportMetric(float64(n)*float64(b.N)/b.Elapsed().Seconds(), "rows/s")
	})
	b.Run("readRecord/probes=4", func(b *testing.B) {
		b.ReportAllocs()
		b.SetBytes(int64(len(data)))
		for b.Loop() {
			rec, err := ReadRecord(bytes.NewReader(data), set)
			if err != nil {
				b.Fatal(err)
			}
			sinkF = rec.Rows[0].Minutes
		}
		b.ReportMetric(float64(n)*float64(b.N)/b.Elapsed().Seconds(), "rows/s")
	})
}
