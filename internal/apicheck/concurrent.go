package apicheck

import (
	"encoding/json"
	"fmt"
	"sync"
	"testing"
)

// Job is one call of a package's API for RunConcurrently: its result and
// error.
type Job func() (any, error)

// RunConcurrently runs every job once in sequence, then from eight
// goroutines calls each of them again repeatedly, each goroutine rounds
// times, and reports through t every call whose result (as JSON) or error
// differs from the sequential one. Run under go test -race it also shows
// data races between concurrent calls on shared inputs.
func RunConcurrently(t testing.TB, rounds int, jobs []Job) {
	t.Helper()
	encode := func(v any, err error) string {
		b, jerr := json.Marshal(v)
		if jerr != nil {
			t.Errorf("json.Marshal: %v", jerr)
		}
		return fmt.Sprintf("%s %v", b, err)
	}
	want := make([]string, len(jobs))
	for i, job := range jobs {
		want[i] = encode(job())
	}
	var wg sync.WaitGroup
	for g := range 8 {
		wg.Go(func() {
			for k := range rounds {
				i := (g + k) % len(jobs)
				if got := encode(jobs[i]()); got != want[i] {
					t.Errorf("goroutine %d, job %d: %s, sequential %s", g, i, got, want[i])
				}
			}
		})
	}
	wg.Wait()
}
