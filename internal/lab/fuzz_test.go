package lab

import (
	"bytes"
	"errors"
	"testing"

	"github.com/dzf-go/dzf/lethality"
)

// FuzzReaders feeds arbitrary bytes to every reader: none may panic, and
// every refusal must be an *Error naming the file.
func FuzzReaders(f *testing.F) {
	for _, n := range DemoNames() {
		b, err := Demo(n)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b)
	}
	f.Add([]byte("minutes,units,negative\n9,20,\"0\n"))
	f.Add([]byte("{\"population\": 1e400}"))
	f.Fuzz(func(t *testing.T, data []byte) {
		rs := lethality.ReadSettings{Time: lethality.TimeSeconds}
		readers := []func() error{
			func() error { _, err := ReadPopulation("f", bytes.NewReader(data)); return err },
			func() error { _, err := ReadSurvivor("f", bytes.NewReader(data)); return err },
			func() error { _, err := ReadFraction("f", bytes.NewReader(data)); return err },
			func() error { _, err := ReadTemperatures("f", bytes.NewReader(data)); return err },
			func() error { _, err := ReadOutcomes("f", bytes.NewReader(data)); return err },
			func() error { _, err := ReadLabel("f", bytes.NewReader(data)); return err },
			func() error { _, err := ReadCycle("f", bytes.NewReader(data), &rs); return err },
		}
		for i, read := range readers {
			err := read()
			var e *Error
			if err != nil && (!errors.As(err, &e) || e.File != "f") {
				t.Fatalf("reader %d: error %v is not an *Error naming the file", i, err)
			}
		}
	})
}
