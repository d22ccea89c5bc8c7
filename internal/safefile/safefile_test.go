package safefile

import (
	"errors"
	"os"
	"path/filepath"
	"syscall"
	"testing"
	"testing/fstest"
	"time"
)

// TestCommandLinePathsBounded is issue 11 item 10: a device, a FIFO or a
// folder is refused before it is opened, and a file over the limit is
// refused without reading more than the limit.
func TestCommandLinePathsBounded(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "calc.calc.md")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no FIFOs here:", err)
	}
	big := filepath.Join(dir, "big.csv")
	os.WriteFile(big, make([]byte, 2000), 0o600)
	small := filepath.Join(dir, "small.csv")
	os.WriteFile(small, []byte("a,b\n"), 0o600)
	cases := []struct {
		path string
		want error
	}{
		{"/dev/zero", ErrNotRegular},
		{fifo, ErrNotRegular},
		{dir, ErrNotRegular},
		{big, ErrTooLarge},
	}
	for _, c := range cases {
		done := make(chan error, 1)
		go func() { _, err := Read(c.path, 1000); done <- err }()
		select {
		case err := <-done:
			if !errors.Is(err, c.want) {
				t.Errorf("Read(%s) = %v, want %v", c.path, err, c.want)
			}
		case <-time.After(5 * time.Second):
			t.Fatalf("Read(%s) hangs", c.path)
		}
	}
	if b, err := Read(small, 4); err != nil || string(b) != "a,b\n" {
		t.Errorf("Read(small) = %q, %v", b, err)
	}
}

// TestReadFSBounded holds ReadFS to the same rules over an fs.FS.
func TestReadFSBounded(t *testing.T) {
	fsys := fstest.MapFS{
		"a.csv":   {Data: []byte("12345")},
		"dir/x":   {Data: []byte("1")},
		"pipe":    {Mode: os.ModeNamedPipe},
		"exactly": {Data: []byte("1234")},
	}
	if _, err := ReadFS(fsys, "a.csv", 4); !errors.Is(err, ErrTooLarge) {
		t.Errorf("over the limit: %v", err)
	}
	if _, err := ReadFS(fsys, "dir", 4); !errors.Is(err, ErrNotRegular) {
		t.Errorf("folder: %v", err)
	}
	if _, err := ReadFS(fsys, "pipe", 4); !errors.Is(err, ErrNotRegular) {
		t.Errorf("pipe: %v", err)
	}
	if b, err := ReadFS(fsys, "exactly", 4); err != nil || string(b) != "1234" {
		t.Errorf("at the limit: %q, %v", b, err)
	}
}
