package provenance

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"strings"

	"github.com/go-git/go-git/v5"
)

// Clean reports whether the work tree matches HEAD: no tracked file is
// modified, staged, deleted or in conflict. Untracked files are not counted,
// so a rendered package written into the repository does not make the next
// render unclean (git describe --dirty counts the same way).
//
// It runs git status --porcelain when a git executable is on PATH: go-git's
// own Status hashes the whole tree and takes several times longer on a large
// repository. When git is missing or fails, it falls back to go-git.
func (r *Repo) Clean() (bool, error) {
	if clean, err := r.cleanCLI(); err == nil {
		return clean, nil
	}
	return r.cleanGoGit()
}

// StartClean begins Clean in the background and returns the function that
// waits for its answer, so that a caller can walk the history while git
// status reads the work tree (on 5,000 files, the larger part of what a
// render asks of git). The answer is Clean's; the wait function may be
// called once.
func (r *Repo) StartClean() (wait func() (bool, error)) {
	type answer struct {
		clean bool
		err   error
	}
	ch := make(chan answer, 1)
	go func() {
		clean, err := r.Clean()
		ch <- answer{clean, err}
	}()
	return func() (bool, error) {
		a := <-ch
		return a.clean, a.err
	}
}

// cleanCLI asks the git executable. --no-optional-locks keeps it from
// refreshing the index, so it never contends for index.lock.
func (r *Repo) cleanCLI() (bool, error) {
	exe, err := exec.LookPath("git")
	if err != nil {
		return false, err
	}
	cmd := exec.Command(exe, "--no-optional-locks", "-C", r.root,
		"status", "--porcelain", "--untracked-files=no")
	cmd.Env = gitEnv()
	var out, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &stderr
	if err := cmd.Run(); err != nil {
		return false, fmt.Errorf("git status in %s: %w: %s", r.root, err, strings.TrimSpace(stderr.String()))
	}
	return out.Len() == 0, nil
}

// gitEnv is the environment for the git executable, without the variables
// that would point it at another repository than the one opened.
func gitEnv() []string {
	drop := map[string]bool{
		"GIT_DIR": true, "GIT_WORK_TREE": true, "GIT_INDEX_FILE": true,
		"GIT_COMMON_DIR": true, "GIT_OBJECT_DIRECTORY": true,
		"GIT_ALTERNATE_OBJECT_DIRECTORIES": true, "GIT_NAMESPACE": true,
		"GIT_CEILING_DIRECTORIES": true,
	}
	var env []string
	for _, kv := range os.Environ() {
		name, _, _ := strings.Cut(kv, "=")
		if !drop[name] {
			env = append(env, kv)
		}
	}
	return append(env, "GIT_OPTIONAL_LOCKS=0", "LC_ALL=C")
}

// cleanGoGit is the fallback through go-git's Status, counting tracked files
// only. Status must succeed: go-git reports a nil status as clean.
func (r *Repo) cleanGoGit() (bool, error) {
	defer r.lock()()
	wt, err := r.git.Worktree()
	if err != nil {
		return false, fmt.Errorf("work tree of %s: %w", r.root, err)
	}
	st, err := wt.Status()
	if err != nil {
		return false, fmt.Errorf("status of %s: %w", r.root, err)
	}
	for _, fs := range st {
		if fs.Staging == git.Untracked && fs.Worktree == git.Untracked {
			continue
		}
		if fs.Staging != git.Unmodified || fs.Worktree != git.Unmodified {
			return false, nil
		}
	}
	return true, nil
}
