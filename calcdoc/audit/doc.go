// Package audit records, signs and verifies calculation packages: it
// builds a calc's provenance stamp from git (the commit, whether the work
// tree is clean, the file's history) with the verdict on each signature,
// signs a package for a role with SSH, and verifies a package by
// evaluating its source again from the recorded commit.
//
// Files: record.go (Provenance, Workspace: the one stamp builder),
// check.go (signature verdicts and the cover status), assumptions.go (the
// PRELIMINARY stamp and the approver's refusal while an assumption is
// open), reproduce.go (the
// manifest inside a package, the calc evaluated again at its commit),
// verify.go (Verify and its steps), signatures.go (the role findings and
// the allowed-signers check), sign.go (Sign), report.go (Report, Finding,
// Verdict).
package audit
