package register

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"sort"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
)

// calcSuffix names a calc file.
const calcSuffix = ".calc.md"

// findCalcs lists the calc files under dir as sorted slash paths relative
// to it. Hidden folders (.git) and the output folder are skipped.
func findCalcs(dir, out string) ([]string, error) {
	skip, _ := filepath.Abs(out)
	var calcs []string
	err := filepath.WalkDir(dir, func(p string, e fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if e.IsDir() {
			abs, _ := filepath.Abs(p)
			if p != dir && (strings.HasPrefix(e.Name(), ".") || abs == skip) {
				return filepath.SkipDir
			}
			return nil
		}
		if e.Type().IsRegular() && strings.HasSuffix(e.Name(), calcSuffix) {
			rel, err := filepath.Rel(dir, p)
			if err != nil {
				return err
			}
			calcs = append(calcs, filepath.ToSlash(rel))
		}
		return nil
	})
	sort.Strings(calcs)
	return calcs, err
}

// shard keeps the calcs of shard i (1-based) of n. A calc's shard follows
// from a hash of its path, so adding or removing a calc moves no other.
func shard(calcs []string, i, n int) []string {
	var out []string
	for _, c := range calcs {
		if shardOf(c, n) == i-1 {
			out = append(out, c)
		}
	}
	return out
}

func shardOf(path string, n int) int {
	sum := sha256.Sum256([]byte(path))
	return int(binary.BigEndian.Uint64(sum[:8]) % uint64(n))
}

// cacheDir is the cache folder inside the output folder.
func cacheDir(out string) string { return filepath.Join(out, ".vouch-register") }

// DefaultOut is the output folder used without -o: a folder of the user's
// cache named after dir, so that the register never writes into the
// repository unless asked to.
func DefaultOut(dir string) (string, error) {
	abs, err := filepath.Abs(dir)
	if err != nil {
		return "", err
	}
	base, err := os.UserCacheDir()
	if err != nil {
		return "", err
	}
	sum := sha256.Sum256([]byte(abs))
	return filepath.Join(base, "vouch", "register", filepath.Base(abs)+"-"+hex.EncodeToString(sum[:4])), nil
}

// packagePath is where the register writes a calc's package, relative to
// the output folder: the calc's folder and calcdoc.PackageName.
func packagePath(calc string) string {
	return path.Join(path.Dir(calc), calcdoc.PackageName(calc))
}
