package apicheck

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
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

func TestCheckSentinelsReports(t *testing.T) {
	// An invented package with two sentinels; the table gets one wrong
	// message and leaves the second sentinel unreached.
	dir := t.TempDir()
	src := "package p\n\nimport \"errors\"\n\n// ErrA reports a.\nvar ErrA = errors.New(\"a\")\n\n// ErrB reports b.\nvar ErrB = errors.New(\"b\")\n"
	if err := os.WriteFile(filepath.Join(dir, "p.go"), []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	errA, errB := errors.New("a"), errors.New("b")
	r := &recorder{TB: t}
	CheckSentinels(r, dir, []error{errA, errB}, nil, []Refusal{
		{"ErrA", errA, func() error { return fmt.Errorf("value 7: %w", errA) }, "value 8"},
	})
	want := []string{"%s: message %q does not name %q", "%s"} // the second: ErrB not reached
	if len(r.errs) != 2 || r.errs[0] != want[0] || r.errs[1] != want[1] {
		t.Errorf("reported %q, want %q and an unreached ErrB", r.errs, want)
	}
	r.errs = nil
	CheckSentinels(r, dir, []error{errA, errB}, nil, []Refusal{
		{"ErrA", errA, func() error { return fmt.Errorf("value 7: %w", errA) }, "value 7"},
		{"ErrB", errB, func() error { return fmt.Errorf("value 9: %w", errB) }, "value 9"},
	})
	if len(r.errs) != 0 {
		t.Errorf("a correct table reported %q", r.errs)
	}
}
