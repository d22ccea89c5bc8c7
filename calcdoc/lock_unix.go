//go:build unix

package calcdoc

import (
	"os"
	"syscall"
)

// lockFolder takes an exclusive advisory lock on a folder (flock on the
// folder itself, so no lock file is left behind), waiting while another
// vouch holds it; the kernel drops the lock when the process ends, so a
// killed writer never leaves the folder locked. It returns the unlock.
func lockFolder(dir string) (func(), error) {
	f, err := os.Open(dir)
	if err != nil {
		return nil, err
	}
	for {
		err = syscall.Flock(int(f.Fd()), syscall.LOCK_EX)
		if err != syscall.EINTR {
			break
		}
	}
	if err != nil {
		f.Close()
		return nil, err
	}
	return func() {
		syscall.Flock(int(f.Fd()), syscall.LOCK_UN)
		f.Close()
	}, nil
}
