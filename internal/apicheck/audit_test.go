package apicheck

import (
	"strings"
	"sync"
	"testing"
)

func TestAudit(t *testing.T) {
	// Invented variables: one of each kind of breach, and two that pass.
	vars := []Var{
		{Name: "ErrGood", Doc: "ErrGood reports a problem.", Pos: "a.go:1"},
		{Name: "ErrUndocumented", Doc: "", Pos: "a.go:2"},
		{Name: "ErrUnreached", Doc: "ErrUnreached reports another.", Pos: "a.go:3"},
		{Name: "table", Doc: "table holds powers of ten. It is read only.", Pos: "a.go:4"},
		{Name: "cache", Doc: "cache is filled on first use.", Pos: "a.go:5"},
		{Name: "counter", Doc: "", Pos: "a.go:6"},
	}
	reached := map[string]bool{"ErrGood": true, "ErrUndocumented": true}
	problems, n := Audit(vars, reached, map[string]bool{"table": true, "cache": true})
	if n != 3 {
		t.Errorf("%d sentinels, want 3", n)
	}
	want := []string{"a.go:2: sentinel ErrUndocumented has no doc", "a.go:3: sentinel ErrUnreached is not reached", "a.go:5: table cache does not say", "a.go:6: package-level variable counter"}
	if len(problems) != len(want) {
		t.Fatalf("problems %q, want %d", problems, len(want))
	}
	for i, w := range want {
		if !strings.HasPrefix(problems[i], w) {
			t.Errorf("problem %d = %q, want prefix %q", i, problems[i], w)
		}
	}
}

// recorder is a testing.TB that records errors instead of failing; safe
// for concurrent use, as testing.T is.
type recorder struct {
	testing.TB
	mu   sync.Mutex
	errs []string
}

func (r *recorder) Errorf(format string, a ...any) {
	r.mu.Lock()
	defer r.mu.Unlock()
	r.errs = append(r.errs, format)
}
func (r *recorder) Helper() {}

func TestRunConcurrentlyFindsDifferences(t *testing.T) {
	// A job whose answer changes between calls must be reported; a pure one
	// must not.
	var mu sync.Mutex
	calls := 0
	changing := func() (any, error) {
		mu.Lock()
		defer mu.Unlock()
		calls++
		return calls, nil
	}
	pure := func() (any, error) { return 42, nil }
	r := &recorder{TB: t}
	RunConcurrently(r, 3, []Job{pure})
	if len(r.errs) != 0 {
		t.Errorf("pure job reported: %v", r.errs)
	}
	RunConcurrently(r, 3, []Job{changing})
	if len(r.errs) == 0 {
		t.Error("a job with changing results was not reported")
	}
}
