package main

import (
	"fmt"
	"sync"

	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/internal/engine"
	"github.com/vouchcalc/vouch/qualify"
)

// thisBuild is the running engine build, as a manifest records it. Tests
// replace it with a fixed build, so golden files do not depend on the
// machine, the Go version or the checkout.
var thisBuild = func() *provenance.EngineBuild {
	id := engine.Identify(Version)
	return &provenance.EngineBuild{Version: id.Version, Revision: id.Revision, Modified: id.Modified,
		GoVersion: id.GoVersion, OS: id.OS, Arch: id.Arch}
}

// qualification is the digest of the report vouch qualify writes for this
// build, computed once per run. Tests replace it with a fixed digest: the
// report records the machine's Go version and architecture.
var qualification = sync.OnceValues(func() (string, error) {
	r, err := qualify.Run(qualify.Options{Version: Version})
	if err != nil {
		return "", fmt.Errorf("qualification: %w", err)
	}
	if !r.Passed() {
		return "", fmt.Errorf("this engine build fails %d values of its own qualification suite: run vouch qualify to see them; no package is made with it", r.Summary.Failed)
	}
	return r.Digest, nil
})

// verifyOptions are the options of verify and sign: this engine's version,
// build and qualification digest, the repository and the signers file.
func verifyOptions(repo, signers string) (audit.VerifyOptions, error) {
	qual, err := qualification()
	if err != nil {
		return audit.VerifyOptions{}, err
	}
	return audit.VerifyOptions{Engine: Version, Repo: repo, Signers: signers, Build: thisBuild(), Qualification: qual}, nil
}
