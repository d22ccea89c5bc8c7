// Package provenance records where a calculation came from and who vouched
// for it.
//
// It has three parts, each in its own files:
//
//   - Git (repo.go, history.go, resolve.go): find the repository that holds a
//     calc file, the commit it was evaluated at, whether the file and the tree
//     were clean, the file's revision history and its content at any earlier
//     commit. This is the only package of vouch that imports go-git.
//   - The manifest (manifest.go, canonical.go): the provenance record of a
//     calculation package, written as canonical JSON so that its digest is
//     the same on every machine.
//   - Signatures (sshsig.go, keys.go, allowed.go): OpenSSH's SSHSIG format,
//     made with the signer's existing SSH key and checkable with the stock
//     ssh-keygen -Y verify, plus OpenSSH's allowed-signers file format.
//
// The package imports no other vouch package: calcdoc imports it, never the
// other way round.
package provenance
