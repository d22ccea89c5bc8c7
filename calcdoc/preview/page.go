package preview

import (
	"bytes"
	"context"
	"crypto/sha256"
	"io/fs"
	"maps"
	"net/http"
	"os"
	"path"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"sync"
	"time"

	"github.com/vouchcalc/vouch/calcdoc"
	"github.com/vouchcalc/vouch/calcdoc/audit"
	"github.com/vouchcalc/vouch/calcdoc/settings"

	"github.com/vouchcalc/vouch/internal/safefile"
)

// Timings of the live reload.
const (
	waitTimeout = 25 * time.Second // a long poll answers at the latest after this
	keepWatched = 10 * time.Second // a page is watched this long after it was last asked for
	settleTime  = 5 * time.Millisecond
	settleTries = 4
)

// page is one calc as the preview shows it, re-rendered when its source or
// data files change.
type page struct {
	s       *Server
	rel     string // slash path relative to the server's folder
	mu      sync.Mutex
	version int               // counts the renders that changed the page
	body    []byte            // the package or error page, without the script
	html    []byte            // body with the banner and the reload script
	inputs  map[string][]byte // hash of each file read: the calc and its data files
	changed chan struct{}     // closed when the version moves on
	seen    time.Time         // the last request for it (under Server.mu)
	waiters int               // browsers waiting for a change (under Server.mu)
}

// page returns the page of a calc, rendering it the first time.
func (s *Server) page(rel string) *page {
	s.mu.Lock()
	p := s.pages[rel]
	if p == nil {
		p = &page{s: s, rel: rel, changed: make(chan struct{})}
		s.pages[rel] = p
	}
	p.seen = time.Now()
	s.mu.Unlock()
	p.refresh()
	return p
}

// current returns the page as served.
func (p *page) current() []byte {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.html
}

// state returns the version and the channel closed when it moves on.
func (p *page) state() (int, chan struct{}) {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.version, p.changed
}

// refresh renders the page again when a file it read has changed.
func (p *page) refresh() {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.html != nil && !p.inputsChanged() {
		return
	}
	p.settle()
	body, inputs := p.s.render(p.rel)
	p.inputs = inputs
	if p.html != nil && bytes.Equal(body, p.body) {
		return
	}
	p.version++
	p.body, p.html = body, inject(body, p.rel, p.version)
	close(p.changed)
	p.changed = make(chan struct{})
}

// inputsChanged reads the files the last render read and compares their
// hashes. Reading is cheap beside rendering and, unlike modification
// times, misses no save.
func (p *page) inputsChanged() bool {
	for file, sum := range p.inputs {
		if !bytes.Equal(hashFile(file), sum) {
			return true
		}
	}
	return false
}

// settle waits until the files read stop changing, so that a save caught
// halfway (truncated, partly written) is not shown as a broken calc.
func (p *page) settle() {
	prev := p.hashes()
	for i := 0; i < settleTries; i++ {
		time.Sleep(settleTime)
		cur := p.hashes()
		if maps.EqualFunc(prev, cur, bytes.Equal) {
			return
		}
		prev = cur
	}
}

// hashes reads the files the last render read.
func (p *page) hashes() map[string][]byte {
	out := map[string][]byte{}
	for file := range p.inputs {
		out[file] = hashFile(file)
	}
	return out
}

func hashFile(file string) []byte {
	b, err := safefile.Read(file, calcdoc.MaxFileBytes)
	if err != nil {
		return nil
	}
	sum := sha256.Sum256(b)
	return sum[:]
}

// render evaluates and renders a calc from the work tree: its package, or
// a page that shows its errors at their lines. It returns the page and the
// hashes of the files it read.
func (s *Server) render(rel string) ([]byte, map[string][]byte) {
	file := filepath.Join(s.root, filepath.FromSlash(rel))
	inputs := map[string][]byte{file: hashFile(file)}
	src, err := safefile.Read(file, calcdoc.MaxFileBytes)
	if err != nil {
		return problemPage(rel, err.Error()), inputs
	}
	root := s.opt.SettingsRoot
	if root == "" {
		root = s.root
	}
	settingsFile := filepath.Join(root, settings.FileName)
	inputs[settingsFile] = hashFile(settingsFile)
	opt, ssrc, err := calcdoc.SettingsIn(os.DirFS(root), root)
	if err != nil {
		return problemPage(rel, calcdoc.SettingsErrorText(err, ssrc)), inputs
	}
	d := calcdoc.ReadWith(file, src, opt)
	d.Evaluate()
	for _, f := range d.DataFiles {
		p := d.DataPath(f)
		inputs[p] = hashFile(p)
	}
	if len(d.Errors) > 0 {
		return errorPage(rel, d), inputs
	}
	st, err := audit.Provenance(d, s.opt.Engine)
	if err != nil {
		return problemPage(rel, err.Error()), inputs
	}
	pkg, err := d.Render(calcdoc.RenderOptions{Engine: s.opt.Engine, Stamp: st})
	if err != nil {
		return problemPage(rel, err.Error()), inputs
	}
	return pkg.HTML, inputs
}

// watch refreshes, every poll interval, the pages a browser has open or
// asked for lately.
func (s *Server) watch(ctx context.Context) {
	tick := time.NewTicker(s.opt.Poll)
	defer tick.Stop()
	for {
		select {
		case <-ctx.Done():
			return
		case <-tick.C:
			for _, p := range s.watched() {
				p.refresh()
			}
		}
	}
}

// watched lists the pages with a waiting browser or a recent request.
func (s *Server) watched() []*page {
	s.mu.Lock()
	defer s.mu.Unlock()
	var out []*page
	for _, p := range s.pages {
		if p.waiters > 0 || time.Since(p.seen) < keepWatched {
			out = append(out, p)
		}
	}
	return out
}

// serveWait answers the page's long poll: the page's version as soon as
// it differs from the version the browser shows, or the same version after
// waitTimeout.
func (s *Server) serveWait(w http.ResponseWriter, r *http.Request) {
	rel, ok := s.calcPath(r.URL.Query().Get("calc"))
	if !ok {
		http.NotFound(w, r)
		return
	}
	shown, _ := strconv.Atoi(r.URL.Query().Get("v"))
	p := s.page(rel)
	v, changed := p.state()
	if v == shown {
		p.wait(r, changed)
		v, _ = p.state()
	}
	w.Header().Set("Content-Type", "text/plain; charset=utf-8")
	w.Write([]byte(strconv.Itoa(v)))
}

// wait blocks until the page changes, the request ends or waitTimeout.
func (p *page) wait(r *http.Request, changed chan struct{}) {
	s := p.s
	s.mu.Lock()
	p.waiters++
	s.mu.Unlock()
	defer func() {
		s.mu.Lock()
		p.waiters--
		p.seen = time.Now()
		s.mu.Unlock()
	}()
	timer := time.NewTimer(waitTimeout)
	defer timer.Stop()
	select {
	case <-changed:
	case <-timer.C:
	case <-r.Context().Done():
	}
}

// calcPath checks a requested calc path: a calc file inside the folder
// (symbolic links resolved), and in file mode the one calc served.
func (s *Server) calcPath(raw string) (string, bool) {
	rel := strings.TrimPrefix(path.Clean("/"+raw), "/")
	if !strings.HasSuffix(rel, calcSuffix) || s.file != "" && rel != s.file {
		return "", false
	}
	real, err := filepath.EvalSymlinks(filepath.Join(s.root, filepath.FromSlash(rel)))
	if err != nil {
		return "", false
	}
	root, err := filepath.EvalSymlinks(s.root)
	if err != nil {
		return "", false
	}
	inside, err := filepath.Rel(root, real)
	if err != nil || inside == ".." || strings.HasPrefix(inside, ".."+string(filepath.Separator)) {
		return "", false
	}
	st, err := os.Stat(real)
	return rel, err == nil && st.Mode().IsRegular()
}

// calcs lists the calc files under the folder as sorted slash paths;
// hidden folders are skipped.
func (s *Server) calcs() ([]string, error) {
	var out []string
	err := filepath.WalkDir(s.root, func(p string, e fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if e.IsDir() && p != s.root && strings.HasPrefix(e.Name(), ".") {
			return filepath.SkipDir
		}
		if !e.IsDir() && strings.HasSuffix(e.Name(), calcSuffix) {
			rel, _ := filepath.Rel(s.root, p)
			out = append(out, filepath.ToSlash(rel))
		}
		return nil
	})
	sort.Strings(out)
	return out, err
}
