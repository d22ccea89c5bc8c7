package main

import (
	"os"
	"runtime"
	"testing"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
)

// fixedBuild is the engine build every test of this package records, so
// that golden files are the same on every machine.
var fixedBuild = provenance.EngineBuild{Version: Version, Revision: "0123456789abcdef0123456789abcdef01234567",
	GoVersion: "go1.0-test", OS: "testos", Arch: "testarch"}

// fixedQualification is the qualification digest the tests record.
const fixedQualification = "7e57000000000000000000000000000000000000000000000000000000000000"

var realBuild, realQualification = thisBuild, qualification

func TestMain(m *testing.M) {
	thisBuild = func() *provenance.EngineBuild { b := fixedBuild; return &b }
	qualification = func() (string, error) { return fixedQualification, nil }
	os.Exit(m.Run())
}

// TestRealBuildIdentity: outside the tests the manifest records the
// running build's Go version and target, and a qualification digest that
// the qualify suite of this build produces.
func TestRealBuildIdentity(t *testing.T) {
	b := realBuild()
	if b.Version != Version || b.GoVersion == "" || b.OS != runtime.GOOS || b.Arch != runtime.GOARCH {
		t.Errorf("build %+v", b)
	}
	if testing.Short() {
		return
	}
	d, err := realQualification()
	if err != nil || len(d) != 64 {
		t.Errorf("qualification %q, %v", d, err)
	}
}
