// Package apicheck reads a package's own Go source for the tests that
// audit it: the package-level variables it declares (so that a test can
// hold them to a list of read-only tables and documented error sentinels)
// and their doc comments.
//
// It is internal and used by tests only.
package apicheck

import (
	"fmt"
	"go/ast"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"sort"
	"strings"
)

// Var is a package-level variable: its name, its doc comment (without the
// comment markers; "" when it has none) and its position as file:line.
type Var struct {
	Name string
	Doc  string
	Pos  string
}

// PackageVars returns every package-level variable declared in the
// non-test .go files of dir, sorted by name. A variable of a var group
// takes its own doc comment, or the group's when it has none of its own.
func PackageVars(dir string) ([]Var, error) {
	entries, err := os.ReadDir(dir)
	if err != nil {
		return nil, err
	}
	fset := token.NewFileSet()
	var out []Var
	for _, e := range entries {
		n := e.Name()
		if e.IsDir() || !strings.HasSuffix(n, ".go") || strings.HasSuffix(n, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(fset, filepath.Join(dir, n), nil, parser.ParseComments)
		if err != nil {
			return nil, fmt.Errorf("apicheck: %v", err)
		}
		for _, d := range f.Decls {
			g, ok := d.(*ast.GenDecl)
			if !ok || g.Tok != token.VAR {
				continue
			}
			for _, s := range g.Specs {
				vs := s.(*ast.ValueSpec)
				doc := vs.Doc
				if doc == nil {
					doc = g.Doc
				}
				for _, name := range vs.Names {
					if name.Name == "_" {
						continue
					}
					p := fset.Position(name.Pos())
					out = append(out, Var{Name: name.Name, Doc: strings.TrimSpace(doc.Text()), Pos: fmt.Sprintf("%s:%d", filepath.Base(p.Filename), p.Line)})
				}
			}
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out, nil
}
