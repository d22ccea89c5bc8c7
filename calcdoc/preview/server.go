// Package preview serves a live preview of calc packages while they are
// written: each page is the package rendered from the work tree, with a
// small script that reloads it when the calc or its data files change, or
// a page that shows the calc's errors at their lines. It reads the
// repository and writes nothing, and it listens on loopback unless told
// otherwise.
package preview

import (
	"context"
	"errors"
	"fmt"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"time"
)

// DefaultAddr is the address served when none is given.
const DefaultAddr = "127.0.0.1:8417"

// calcSuffix names a calc file.
const calcSuffix = ".calc.md"

// ErrNotLoopback reports an address that other machines could reach.
var ErrNotLoopback = errors.New("address is not on loopback")

// Options say what to preview.
type Options struct {
	Path   string        // a calc file, or a folder whose calcs are listed
	Engine string        // the engine version the packages name
	Poll   time.Duration // how often watched files are read; 0 means 25 ms
	// Remote allows requests whose Host is not a loopback name, for a
	// server deliberately opened to other machines.
	Remote bool
	// SettingsRoot is the folder whose vouch.yaml the calcs are read with
	// (the repository's root); "" means the calcs' folder. The file is
	// read for every page, so an edit to it refreshes the page.
	SettingsRoot string
}

// Server is a preview server. Its handler is safe for concurrent use.
type Server struct {
	opt   Options
	root  string // absolute folder of the calcs
	file  string // in file mode, the calc's slash path relative to root
	mu    sync.Mutex
	pages map[string]*page
}

// New checks the path and returns a server for it. A folder must hold at
// least one calc file.
func New(opt Options) (*Server, error) {
	if opt.Poll <= 0 {
		opt.Poll = 25 * time.Millisecond
	}
	abs, err := filepath.Abs(opt.Path)
	if err != nil {
		return nil, err
	}
	st, err := os.Stat(abs)
	if err != nil {
		return nil, err
	}
	s := &Server{opt: opt, root: abs, pages: map[string]*page{}}
	if !st.IsDir() {
		s.root, s.file = filepath.Dir(abs), filepath.Base(abs)
		return s, nil
	}
	calcs, err := s.calcs()
	if err != nil {
		return nil, err
	}
	if len(calcs) == 0 {
		return nil, fmt.Errorf("%s holds no calc files (*%s)", opt.Path, calcSuffix)
	}
	return s, nil
}

// CheckAddr refuses an address that is not on loopback unless remote is
// set: the preview shows the repository's calcs to whoever can reach it.
func CheckAddr(addr string, remote bool) error {
	host, _, err := net.SplitHostPort(addr)
	if err != nil {
		return fmt.Errorf("address %q: %v; give HOST:PORT such as %s", addr, err, DefaultAddr)
	}
	if remote || isLoopbackHost(host) {
		return nil
	}
	if host == "" {
		host = "every interface"
	}
	return fmt.Errorf("%w: %s listens on %s, which other machines can reach; use 127.0.0.1:PORT, or give --allow-remote to serve the calcs to the network", ErrNotLoopback, addr, host)
}

// isLoopbackHost reports a host name or address that stays on this
// machine.
func isLoopbackHost(host string) bool {
	if strings.EqualFold(host, "localhost") {
		return true
	}
	ip := net.ParseIP(strings.Trim(host, "[]"))
	return ip != nil && ip.IsLoopback()
}

// Listen opens the address, saying plainly when the port is taken.
func Listen(addr string) (net.Listener, error) {
	ln, err := net.Listen("tcp", addr)
	if errors.Is(err, syscall.EADDRINUSE) {
		return nil, fmt.Errorf("%s is in use by another program: pick another port with --addr 127.0.0.1:PORT (port 0 picks a free one)", addr)
	}
	return ln, err
}

// Serve serves on the listener until ctx ends, and watches the open
// calcs meanwhile.
func (s *Server) Serve(ctx context.Context, ln net.Listener) error {
	srv := &http.Server{Handler: s.Handler(), ReadHeaderTimeout: 10 * time.Second}
	go s.watch(ctx)
	go func() {
		<-ctx.Done()
		shut, cancel := context.WithTimeout(context.Background(), time.Second)
		defer cancel()
		srv.Shutdown(shut)
	}()
	err := srv.Serve(ln)
	if errors.Is(err, http.ErrServerClosed) {
		return nil
	}
	return err
}

// Handler returns the server's routes: / (the calc, or the list of calcs),
// /calc/PATH (one calc of the folder) and /_vouch/wait (the long poll the
// page's script makes).
func (s *Server) Handler() http.Handler {
	mux := http.NewServeMux()
	mux.HandleFunc("GET /{$}", s.serveRoot)
	mux.HandleFunc("GET /calc/{path...}", s.serveCalc)
	mux.HandleFunc("GET /_vouch/wait", s.serveWait)
	return s.guard(mux)
}

// guard refuses requests for another host name than loopback ones (a web
// page elsewhere cannot reach the preview by rebinding a name to
// 127.0.0.1), and marks every answer as not to be cached.
func (s *Server) guard(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		host, _, err := net.SplitHostPort(r.Host)
		if err != nil {
			host = r.Host
		}
		if !s.opt.Remote && !isLoopbackHost(host) {
			http.Error(w, "the preview answers only to localhost", http.StatusForbidden)
			return
		}
		w.Header().Set("Cache-Control", "no-store")
		next.ServeHTTP(w, r)
	})
}

func (s *Server) serveRoot(w http.ResponseWriter, r *http.Request) {
	if s.file != "" {
		s.servePage(w, s.file)
		return
	}
	calcs, err := s.calcs()
	if err != nil {
		http.Error(w, err.Error(), http.StatusInternalServerError)
		return
	}
	writeHTML(w, listPage(filepath.Base(s.root), calcs))
}

func (s *Server) serveCalc(w http.ResponseWriter, r *http.Request) {
	rel, ok := s.calcPath(r.PathValue("path"))
	if !ok {
		http.NotFound(w, r)
		return
	}
	s.servePage(w, rel)
}

func (s *Server) servePage(w http.ResponseWriter, rel string) {
	p := s.page(rel)
	writeHTML(w, p.current())
}

func writeHTML(w http.ResponseWriter, b []byte) {
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.Write(b)
}
