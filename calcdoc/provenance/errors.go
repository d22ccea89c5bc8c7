package provenance

import "errors"

// Sentinel errors. Functions wrap them with detail, so test with errors.Is.
var (
	// ErrNotInRepo reports a path that lies in no git repository.
	ErrNotInRepo = errors.New("not in a git repository")
	// ErrOutsideRepo reports a path that leaves the repository's work tree
	// (or points into its .git directory).
	ErrOutsideRepo = errors.New("path lies outside the repository")
	// ErrNoCommits reports a repository whose HEAD has no commit yet.
	ErrNoCommits = errors.New("repository has no commits")
	// ErrNotAtCommit reports a file that did not exist at a commit.
	ErrNotAtCommit = errors.New("file does not exist at the commit")
	// ErrSymlink reports a file committed as a symbolic link: git holds the
	// link, not the file it leads to, so its content cannot be verified.
	ErrSymlink = errors.New("is committed as a symbolic link; commit the file itself")
	// ErrUnknownRevision reports a revision name that resolves to no commit.
	ErrUnknownRevision = errors.New("unknown revision")

	// ErrManifest reports a manifest that cannot be written or read.
	ErrManifest = errors.New("invalid manifest")

	// ErrSignatureFormat reports an armored signature that is not SSHSIG.
	ErrSignatureFormat = errors.New("malformed ssh signature")
	// ErrNamespace reports a signature made for another namespace.
	ErrNamespace = errors.New("signature namespace does not match")
	// ErrBadSignature reports a signature that does not verify.
	ErrBadSignature = errors.New("signature does not verify")
	// ErrPassphrase reports a private key file protected by a passphrase
	// whose key is not loaded in the ssh-agent.
	ErrPassphrase = errors.New("private key is protected by a passphrase")
	// ErrNoAgent reports that no ssh-agent can be reached.
	ErrNoAgent = errors.New("no ssh-agent")
	// ErrAllowedSigners reports a malformed allowed-signers file.
	ErrAllowedSigners = errors.New("invalid allowed-signers file")
	// ErrNotAllowed reports a key that an allowed-signers file does not
	// allow for a principal, namespace and time.
	ErrNotAllowed = errors.New("key not allowed by the signers file")
	// ErrSigningTime reports a signing time that is malformed, earlier
	// than the commit signed, or later than now.
	ErrSigningTime = errors.New("signing time out of bounds")
)
