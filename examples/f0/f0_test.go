package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/require"
)

func runF0(args ...string) (int, string, string) {
	var out, errOut bytes.Buffer
	code := run(args, &out, &errOut)
	return code, out.String(), errOut.String()
}

// The demo cycle (invented: five probes lagging behind a chamber held at
// 122 °C, testdata/demo/generate.go) has its cold spot at the pack-core
// probe by construction.
func TestDemo(t *testing.T) {
	code, out, errOut := runF0()
	require.Equal(t, 0, code, errOut)
	for _, s := range []string{"F per probe: T_ref 121.1 °C, z 10.0 °C, exact rule", "demo:cycle.csv: 337 rows",
		"chamber", "tray-top", "tray-mid", "door", "pack-core", "cold spot: pack-core", "patient safety", "verify"} {
		require.Contains(t, out, s)
	}
}

// testdata/lethality/hand_cycle.csv is a hand-constructed record whose
// cold spot is probe B (its header comment); one row per minute.
func TestFileFlag(t *testing.T) {
	path := filepath.Join("..", "..", "testdata", "lethality", "hand_cycle.csv")
	code, _, errOut := runF0("-cycle", path)
	require.Equal(t, 2, code)
	require.Contains(t, errOut, "-time seconds")
	code, out, errOut := runF0("-cycle", path, "-time", "seconds")
	require.Equal(t, 0, code, errOut)
	require.Contains(t, out, "cold spot: B")
	require.Contains(t, out, path+": 11 rows, 0.00 – 10.00 min")

	// Probe B reads 101, 111, 116, 121 ×6, 116, 101 °C at 0…10 min. Hand-worked
	// from the closed form of the exact rule, h·(L₂ − L₁)/ln(L₂/L₁) per
	// interval, against 121 °C and z 10 °C: 0.039087 + 0.187813 + 0.593917
	// + 5 + 0.593917 + 0.088662 = 6.503396 min; against 121.1 °C it is
	// 6.503396·10^-0.01 = 6.35536 min.
	code, out, _ = runF0("-cycle", path, "-time", "seconds", "-tref", "121")
	require.Equal(t, 0, code)
	require.Contains(t, out, "cold spot: B, F 6.50 min")
	code, out, _ = runF0("-cycle", path, "-time", "seconds")
	require.Equal(t, 0, code)
	require.Contains(t, out, "cold spot: B, F 6.36 min")
}

func TestBadInput(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("# logger\nseconds,P1,P2\n0,100,101\n10,101,x\n"), 0o644))
	code, _, errOut := runF0("-cycle", bad, "-time", "seconds")
	require.Equal(t, 2, code)
	require.Contains(t, errOut, bad+", line 4, column \"P2\"")
	empty := filepath.Join(dir, "empty.csv")
	require.NoError(t, os.WriteFile(empty, nil, 0o644))
	code, _, errOut = runF0("-cycle", empty)
	require.Equal(t, 2, code)
	require.Contains(t, errOut, empty)
	for _, args := range [][]string{{"-z", "0"}, {"-rule", "simpson"}, {"-time", "hours"}, {"-unit", "kelvin"}, {"extra"}} {
		code, _, _ := runF0(args...)
		require.Equal(t, 2, code, "%v", args)
	}
}
