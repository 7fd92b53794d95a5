package apicheck

import (
	"os"
	"path/filepath"
	"testing"
)

// TestPackageVars reads an invented package: grouped and single
// variables with their own or their group's doc comment; test files and
// the blank identifier are left out.
func TestPackageVars(t *testing.T) {
	dir := t.TempDir()
	src := `package p

// Group doc.
var (
	// ErrA is documented.
	ErrA = 1
	errB = 2
)

var table = [2]int{1, 2}

var _ = table
`
	if err := os.WriteFile(filepath.Join(dir, "p.go"), []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "p_test.go"), []byte("package p\n\nvar hidden = 3\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	vars, err := PackageVars(dir)
	if err != nil {
		t.Fatal(err)
	}
	want := []Var{{"ErrA", "ErrA is documented.", "p.go:6"}, {"errB", "Group doc.", "p.go:7"}, {"table", "", "p.go:10"}}
	if len(vars) != len(want) {
		t.Fatalf("got %+v, want %+v", vars, want)
	}
	for i := range want {
		if vars[i] != want[i] {
			t.Errorf("var %d: %+v, want %+v", i, vars[i], want[i])
		}
	}
	if _, err := PackageVars(filepath.Join(dir, "missing")); err == nil {
		t.Error("missing folder: no error")
	}
}
