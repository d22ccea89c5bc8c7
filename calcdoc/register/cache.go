package register

import (
	"github.com/vouchcalc/vouch/calcdoc"

	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"sort"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// cacheFile is the cache of a whole run, in the cache folder; a shard
// writes shard-I-of-N.json beside it, which the next whole run merges.
const cacheFile = "cache.json"

// cacheData is the content of a cache file.
type cacheData struct {
	Format  string   `json:"format"`
	Entries []*Entry `json:"entries"`
}

// cache holds the entries of every cache file in the output folder, by
// calc path; merged shards may give a calc more than one.
type cache struct {
	byPath map[string][]*Entry
	files  map[string][]byte // each cache file read, by path
}

// loadCache reads every cache file of the output folder. A file that
// cannot be read or has another format is ignored: its calcs render again.
func loadCache(out string) *cache {
	c := &cache{byPath: map[string][]*Entry{}, files: map[string][]byte{}}
	files, _ := filepath.Glob(filepath.Join(cacheDir(out), "*.json"))
	sort.Strings(files)
	for _, f := range files {
		b, err := safefile.Read(f, calcdoc.MaxDataBytes)
		if err != nil {
			continue
		}
		c.files[f] = b
		var data cacheData
		if json.Unmarshal(b, &data) != nil || data.Format != cacheFormat {
			continue
		}
		for _, e := range data.Entries {
			if e != nil {
				c.byPath[e.Path] = append(c.byPath[e.Path], e)
			}
		}
	}
	return c
}

// lookup returns the cached entries of a calc.
func (c *cache) lookup(calc string) []*Entry { return c.byPath[calc] }

// shardCacheFile names the cache file of a run.
func shardCacheFile(shard, shards int) string {
	if shards == 0 {
		return cacheFile
	}
	return fmt.Sprintf("shard-%d-of-%d.json", shard, shards)
}

// write writes the run's entries to its cache file, unless the file
// already holds exactly them.
func (c *cache) write(out, name string, entries []*Entry) error {
	b, err := json.MarshalIndent(cacheData{Format: cacheFormat, Entries: entries}, "", " ")
	if err != nil {
		return err
	}
	b = append(b, '\n')
	dest := filepath.Join(cacheDir(out), name)
	if bytes.Equal(c.files[dest], b) {
		return nil
	}
	return calcdoc.WriteFileAtomic(dest, b)
}

// prune is for a whole run: it removes the packages of calcs no longer
// under the folder (only packages the register wrote) and the shard cache
// files, whose entries the run's cache file now holds.
func (c *cache) prune(out string, calcs []string) {
	keep := map[string]bool{}
	for _, calc := range calcs {
		keep[calc] = true
	}
	for path, entries := range c.byPath {
		if keep[path] {
			continue
		}
		for _, e := range entries {
			if e.Package != "" {
				pkg := filepath.Join(out, filepath.FromSlash(e.Package))
				os.Remove(pkg)
				os.Remove(pkg[:len(pkg)-len(".html")] + ".manifest.json") // written by earlier versions
			}
		}
	}
	for f := range c.files {
		if filepath.Base(f) != cacheFile {
			os.Remove(f)
		}
	}
}
