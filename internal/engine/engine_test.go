package engine

import (
	"runtime"
	"testing"
)

func TestIdentify(t *testing.T) {
	id := Identify("9.9.9")
	if id.Version != "9.9.9" || id.OS != runtime.GOOS || id.Arch != runtime.GOARCH || id.GoVersion == "" {
		t.Errorf("Identify = %+v", id)
	}
	for rev, want := range map[string]string{"": "unknown", "087318a": "087318a", "087318a0c1b8374aaaaaaaaa": "087318a0c1b8"} {
		if got := (Identity{Revision: rev}).Short(); got != want {
			t.Errorf("Short(%q) = %q, want %q", rev, got, want)
		}
	}
}
