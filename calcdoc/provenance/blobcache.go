package provenance

import "github.com/go-git/go-git/v5/plumbing"

// BlobCacheBytes bounds the contents a Repo keeps of the blobs ReadAt has
// read, so that a file read many times (a data file a calc reads in every
// sweep, or one committed file listed under many paths) is inflated from
// the pack once. A blob larger than the bound is not kept.
const BlobCacheBytes = 64 << 20

// blobCache keeps blob contents by hash up to BlobCacheBytes, dropping the
// oldest first. The Repo's mutex guards it.
type blobCache struct {
	hashed map[plumbing.Hash]string // BlobHash of each blob's content, once computed
	data   map[plumbing.Hash][]byte
	order  []plumbing.Hash // oldest first
	size   int
	reads  int // blobs read from the object store, for tests
}

// get returns the kept content of a blob.
func (c *blobCache) get(h plumbing.Hash) ([]byte, bool) {
	b, ok := c.data[h]
	return b, ok
}

// put keeps the content of a blob just read, dropping the oldest blobs
// until the total fits.
func (c *blobCache) put(h plumbing.Hash, b []byte) {
	c.reads++
	if c.hashed == nil {
		c.hashed = map[plumbing.Hash]string{}
	}
	if len(b) > BlobCacheBytes {
		return
	}
	if c.data == nil {
		c.data = map[plumbing.Hash][]byte{}
	}
	for c.size+len(b) > BlobCacheBytes && len(c.order) > 0 {
		old := c.order[0]
		c.order = c.order[1:]
		c.size -= len(c.data[old])
		delete(c.data, old)
	}
	c.data[h] = b
	c.order = append(c.order, h)
	c.size += len(b)
}
