// Package diff compares two revisions of a calc, as read and evaluated
// from git or the work tree: changed inputs and results with their
// relative change, checks that flipped, calc lines added, removed or
// rewritten, data files and the prose. It prints the comparison for a
// terminal and renders it as an HTML report.
//
// Files: git.go (Revisions: reading both sides, following a rename),
// compare.go (Compare, Diff and its parts), lines.go (Myers' line diff),
// prose.go (prose hunks), report.go (Text and HTML).
package diff
