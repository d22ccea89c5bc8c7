// Package engine names the running build of vouch: its version, the VCS
// revision it was built from, whether the working tree had changes, the Go
// version and the target OS and architecture. The qualification report
// records it, and a package's manifest can record the same.
package engine

import (
	"runtime"
	"runtime/debug"
)

// Identity is what identifies one engine build. Revision and Modified come
// from the build information Go stamps into a binary built inside a git
// checkout; they are empty and false when the build carries none (go test,
// go run, a build with -buildvcs=false).
type Identity struct {
	Version   string `json:"version"`
	Revision  string `json:"vcs_revision"`
	Time      string `json:"vcs_time"`
	Modified  bool   `json:"vcs_modified"`
	GoVersion string `json:"go_version"`
	OS        string `json:"os"`
	Arch      string `json:"arch"`
}

// Identify returns the identity of the running binary with the given
// version (the command's release number).
func Identify(version string) Identity {
	id := Identity{Version: version, GoVersion: runtime.Version(), OS: runtime.GOOS, Arch: runtime.GOARCH}
	info, ok := debug.ReadBuildInfo()
	if !ok {
		return id
	}
	if info.GoVersion != "" {
		id.GoVersion = info.GoVersion
	}
	for _, s := range info.Settings {
		switch s.Key {
		case "vcs.revision":
			id.Revision = s.Value
		case "vcs.time":
			id.Time = s.Value
		case "vcs.modified":
			id.Modified = s.Value == "true"
		}
	}
	return id
}

// Short returns the first 12 characters of the revision, or "unknown".
func (id Identity) Short() string {
	switch {
	case id.Revision == "":
		return "unknown"
	case len(id.Revision) > 12:
		return id.Revision[:12]
	}
	return id.Revision
}
