package resistance

import (
	"fmt"
	"math"
	"testing"
)

func BenchmarkZFit(b *testing.B) {
	for _, n := range []int{3, 10, 100, 1000} {
		p := make([]Point, n)
		for i := range p {
			c := 110 + 20*float64(i)/float64(n)
			// Invented: D on a z = 10 line with a small alternating offset.
			p[i] = Point{Celsius: c, D: Estimate{Value: 2 * math.Pow(10, (121-c)/10+0.01*float64(i%3-1)), Lower: 1, Upper: 3, Level: 0.95}}
		}
		for _, weighted := range []bool{false, true} {
			b.Run(fmt.Sprintf("n=%d/weighted=%v", n, weighted), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := ZFit(p, 121, &ZSettings{Weighted: weighted}); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/point")
			})
		}
	}
}

func BenchmarkDAt(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		if _, err := DAt(4.5, 150, 10, 160); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkCheckLabel(b *testing.B) {
	for _, nd := range []int{2, 8} {
		b.Run(fmt.Sprintf("d=%d", nd), func(b *testing.B) {
			l, m := steamLabel(), steamMeasured()
			for len(m.D) < nd {
				e := m.D[0]
				e.Method = fmt.Sprintf("method %d", len(m.D))
				m.D = append(m.D, e)
			}
			p := ISOMoistHeatProfile()
			c := &Criteria{Profile: &p}
			b.ReportAllocs()
			for b.Loop() {
				if _, err := CheckLabel(l, m, c); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
