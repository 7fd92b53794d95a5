package lethality

import (
	"errors"
	"io"
	"os"
	"runtime"
	"strconv"
	"strings"
	"testing"
)

func TestStreamFMatchesCycle(t *testing.T) {
	f, err := os.Open("../testdata/lethality/hand_cycle.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	res, err := StreamF(f, MoistHeat121(), &ReadSettings{Time: TimeSeconds}, nil)
	if err != nil {
		t.Fatal(err)
	}
	// Python 3.11 mpmath 1.2.1 values, as in checkHandCycle.
	for p, want := range []float64{10.584280089525536, 6.5033956063166874, 10.71554800214591} {
		near(t, "streamed F", res.Probes[p].F.F, want, 0, 1e-12)
	}
	if res.ColdSpotProbe != "B" || res.Rows != 11 || !strings.Contains(res.String(), "cold spot B") {
		t.Errorf("%+v", res)
	}
}

func TestStreamFMissing(t *testing.T) {
	f, err := os.Open("../testdata/lethality/missing_cells.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	res, err := StreamF(f, MoistHeat121(), &ReadSettings{Time: TimeMinutes, Missing: MissingMark}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if res.Probes[0].Missing != 1 || res.Probes[1].Missing != 1 || len(res.Warnings) != 2 ||
		res.Probes[0].MissingCells[0].Line != 8 || len(res.Probes[0].F.Warnings) != 1 {
		t.Errorf("%+v", res)
	}
	want, _ := F([]Sample{{0, 120}, {0.5, 121}, {1, 121.5}, {1.5, 121.5}, {2.5, 121}}, MoistHeat121(), nil)
	near(t, "P1 F with a bridged cell", res.Probes[0].F.F, want.F, 0, 1e-15)
	// A gap longer than permitted across the bridged cell is refused.
	f.Seek(0, io.SeekStart)
	if _, err := StreamF(f, MoistHeat121(), &ReadSettings{Time: TimeMinutes, Missing: MissingMark}, &FSettings{MaxGap: 0.75}); !errors.Is(err, ErrGap) {
		t.Errorf("gap: %v", err)
	}
}

// logReader generates an invented 4-probe logger export of n rows (one per
// second) without holding it: the header, then rows formatted on demand.
type logReader struct {
	n, i int
	buf  []byte
	head bool
}

// streamTemps holds the 80 readings of logReader, 115.0 to 122.9 °C.
var streamTemps = func() (t [80]string) {
	for k := range t {
		t[k] = strconv.FormatFloat(115+float64(k)/10, 'f', 1, 64)
	}
	return t
}()

func (g *logReader) Read(p []byte) (int, error) {
	for len(g.buf) < len(p) && (g.i < g.n || !g.head) {
		if !g.head {
			g.buf = append(g.buf, "# invented stream\nseconds,P1,P2,P3,P4\n"...)
			g.head = true
			continue
		}
		g.buf = strconv.AppendInt(g.buf, int64(g.i), 10)
		for j := range 4 {
			g.buf = append(g.buf, ',')
			g.buf = append(g.buf, streamTemps[(g.i*7+j*3)%80]...)
		}
		g.buf = append(g.buf, '\n')
		g.i++
	}
	if len(g.buf) == 0 {
		return 0, io.EOF
	}
	k := copy(p, g.buf)
	g.buf = g.buf[:copy(g.buf, g.buf[k:])]
	return k, nil
}

func TestStreamFBoundedMemory(t *testing.T) {
	if testing.Short() {
		t.Skip("10⁷ rows")
	}
	const n = 10_000_000
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	res, err := StreamF(&logReader{n: n}, MoistHeat(), &ReadSettings{Time: TimeSeconds}, nil)
	if err != nil {
		t.Fatal(err)
	}
	runtime.ReadMemStats(&after) // no GC first: what is still held or not yet collected
	if res.Rows != n {
		t.Fatalf("%d rows", res.Rows)
	}
	// The file is about 250 MB; its rows must not be kept, nor allocated
	// one by one: the bytes and objects allocated over the whole stream
	// are bounded independently of its length (a reader, its 64 KiB
	// buffer, one accumulator per probe: about 70 KB and 30 objects; one
	// byte or one object per row would be 10⁷).
	t.Logf("allocated %d bytes in %d objects", after.TotalAlloc-before.TotalAlloc, after.Mallocs-before.Mallocs)
	if total := after.TotalAlloc - before.TotalAlloc; total > 1<<20 {
		t.Errorf("%d bytes allocated over 10⁷ rows, want at most 1 MiB", total)
	}
	if objects := after.Mallocs - before.Mallocs; objects > 1000 {
		t.Errorf("%d objects allocated over 10⁷ rows, want at most 1000", objects)
	}
	if grow := int64(after.HeapInuse) - int64(before.HeapInuse); grow > 16<<20 {
		t.Errorf("heap in use grew by %d bytes over 10⁷ rows", grow)
	}
	if grow := int64(after.HeapSys) - int64(before.HeapSys); grow > 64<<20 {
		t.Errorf("heap obtained from the system grew by %d bytes", grow)
	}
	// Each probe's temperature repeats every 80 rows, so its F over the
	// 10⁷ − 1 intervals is 124 999 periods plus 79 intervals, each
	// computed by F on a few samples (checks the long compensated sum).
	for j, p := range res.Probes {
		temp := func(i int) float64 {
			v, _ := strconv.ParseFloat(streamTemps[(i*7+j*3)%80], 64)
			return v
		}
		period := make([]Sample, 81)
		for i := range period {
			period[i] = Sample{Minutes: float64(i) / 60, Celsius: temp(i)}
		}
		fp, err := F(period, MoistHeat(), nil)
		if err != nil {
			t.Fatal(err)
		}
		fr, err := F(period[:80], MoistHeat(), nil)
		if err != nil {
			t.Fatal(err)
		}
		if p.F.Samples != n {
			t.Errorf("%s: %d samples", p.Probe, p.F.Samples)
		}
		near(t, p.Probe+" F over 10⁷ rows", p.F.F, 124999*fp.F+fr.F, 0, 1e-9)
	}
}
