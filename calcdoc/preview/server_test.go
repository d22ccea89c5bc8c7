package preview

import (
	"errors"
	"io"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

func get(t *testing.T, h http.Handler, target, host string) (int, string) {
	t.Helper()
	req := httptest.NewRequest("GET", target, nil)
	req.Host = host
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	body, _ := io.ReadAll(w.Result().Body)
	return w.Code, string(body)
}

// folder makes a folder of calcs outside any repository.
func folder(t *testing.T) string {
	dir := t.TempDir()
	os.MkdirAll(filepath.Join(dir, "unit1"), 0o755)
	os.WriteFile(filepath.Join(dir, "unit1", "fp.calc.md"), []byte(pumpCalc), 0o644)
	os.WriteFile(filepath.Join(dir, "broken.calc.md"), []byte(strings.Replace(pumpCalc, "p_out = 12.5 MPa", "p_out = 12.5 MPa + 3 kg", 1)), 0o644)
	os.WriteFile(filepath.Join(dir, "notes.txt"), []byte("not a calc"), 0o644)
	os.WriteFile(filepath.Join(filepath.Dir(dir), "outside.calc.md"), []byte(pumpCalc), 0o644)
	os.Symlink(filepath.Join(filepath.Dir(dir), "outside.calc.md"), filepath.Join(dir, "link.calc.md"))
	return dir
}

func TestServeRoutes(t *testing.T) {
	dir := folder(t)
	srv, err := New(Options{Path: dir, Engine: "0.1.0-test"})
	if err != nil {
		t.Fatal(err)
	}
	h := srv.Handler()
	cases := []struct {
		name, target, host string
		code               int
		want               []string
	}{
		{"list of calcs", "/", "127.0.0.1:1", 200, []string{`href="/calc/unit1/fp.calc.md"`, `href="/calc/broken.calc.md"`}},
		{"a calc", "/calc/unit1/fp.calc.md", "localhost:1", 200, []string{"3.357", "Preview of unit1/fp.calc.md", "<script>", `var calc = "unit1/fp.calc.md", version = 1;`}},
		{"errors at their lines", "/calc/broken.calc.md", "[::1]:1", 200, []string{"broken.calc.md:12:", "cannot add pressure", `id="L12" class="bad"`, "^ cannot add"}},
		{"climbing out", "/calc/..%2Foutside.calc.md", "127.0.0.1:1", 404, nil},
		{"a link out of the folder", "/calc/link.calc.md", "127.0.0.1:1", 404, nil},
		{"not a calc", "/calc/notes.txt", "127.0.0.1:1", 404, nil},
		{"missing", "/calc/none.calc.md", "127.0.0.1:1", 404, nil},
		{"another host name", "/", "calcs.example.com", 403, []string{"only to localhost"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			code, body := get(t, h, c.target, c.host)
			if code != c.code {
				t.Fatalf("status %d, want %d: %.300s", code, c.code, body)
			}
			for _, w := range c.want {
				if !strings.Contains(body, w) {
					t.Errorf("the page lacks %q", w)
				}
			}
		})
	}
}

func TestServeFileModeServesOneCalc(t *testing.T) {
	dir := folder(t)
	srv, err := New(Options{Path: filepath.Join(dir, "unit1", "fp.calc.md")})
	if err != nil {
		t.Fatal(err)
	}
	if code, body := get(t, srv.Handler(), "/", "127.0.0.1"); code != 200 || !strings.Contains(body, "3.357") {
		t.Errorf("/ gave %d", code)
	} else if strings.Contains(body, "Content-Security-Policy") {
		t.Error("the preview keeps the package's content policy, which would stop its reload script")
	}
	if code, _ := get(t, srv.Handler(), "/calc/broken.calc.md", "127.0.0.1"); code != 404 {
		t.Errorf("another calc gave %d, want 404", code)
	}
}

// TestLongPoll waits on the page's version and saves the calc: the wait
// answers with the next version.
func TestLongPoll(t *testing.T) {
	dir := folder(t)
	calc := filepath.Join(dir, "unit1", "fp.calc.md")
	srv, err := New(Options{Path: calc, Poll: 10 * time.Millisecond})
	if err != nil {
		t.Fatal(err)
	}
	ts := httptest.NewServer(srv.Handler())
	defer ts.Close()
	go srv.watch(t.Context())
	get(t, srv.Handler(), "/", "127.0.0.1")
	answer := make(chan string, 1)
	go func() {
		resp, err := http.Get(ts.URL + "/_vouch/wait?calc=fp.calc.md&v=1")
		if err != nil {
			answer <- err.Error()
			return
		}
		b, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		answer <- string(b)
	}()
	time.Sleep(50 * time.Millisecond)
	edit(t, calc, "p_out = 12.5 MPa", "p_out = 14 MPa")
	select {
	case v := <-answer:
		if v != "2" {
			t.Errorf("the wait answered %q, want 2", v)
		}
	case <-time.After(5 * time.Second):
		t.Fatal("the wait did not answer after the save")
	}
	if _, body := get(t, srv.Handler(), "/", "127.0.0.1"); !strings.Contains(body, "3.760") || !strings.Contains(body, "version = 2;") {
		t.Error("the page does not show the saved calc")
	}
	if code, body := get(t, srv.Handler(), "/_vouch/wait?calc=fp.calc.md&v=1", "127.0.0.1"); code != 200 || body != "2" {
		t.Errorf("a wait for an old version answered %d %q, want 2 at once", code, body)
	}
}

func TestCheckAddr(t *testing.T) {
	cases := []struct {
		addr   string
		remote bool
		ok     bool
	}{
		{"127.0.0.1:8417", false, true},
		{"127.0.0.1:0", false, true},
		{"localhost:8080", false, true},
		{"[::1]:8080", false, true},
		{"127.2.3.4:80", false, true},
		{"0.0.0.0:8080", false, false},
		{":8080", false, false},
		{"192.0.2.7:8080", false, false},
		{"calcs.example.com:80", false, false},
		{"0.0.0.0:8080", true, true},
		{"8080", false, false},
	}
	for _, c := range cases {
		err := CheckAddr(c.addr, c.remote)
		if (err == nil) != c.ok {
			t.Errorf("CheckAddr(%q, %v) = %v", c.addr, c.remote, err)
		}
		if err != nil && strings.Contains(c.addr, ":") && c.addr != "8080" && !errors.Is(err, ErrNotLoopback) {
			t.Errorf("CheckAddr(%q): %v does not wrap ErrNotLoopback", c.addr, err)
		}
	}
}

func TestListenPortInUse(t *testing.T) {
	ln, err := Listen("127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	defer ln.Close()
	_, err = Listen(ln.Addr().String())
	if err == nil || !strings.Contains(err.Error(), "is in use by another program") {
		t.Errorf("error %v, want a port in use", err)
	}
}

func TestNewBadPath(t *testing.T) {
	empty := t.TempDir()
	os.WriteFile(filepath.Join(empty, "notes.md"), []byte("# notes"), 0o644)
	for _, c := range []struct{ path, want string }{
		{filepath.Join(empty, "none.calc.md"), "no such file"},
		{empty, "holds no calc files"},
	} {
		if _, err := New(Options{Path: c.path}); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("New(%s) = %v, want %q", c.path, err, c.want)
		}
	}
}

// TestServeWithSettings: a calc is previewed with the vouch.yaml of the
// settings root, which may lie above the served folder; a bad settings
// file shows as a problem page.
func TestServeWithSettings(t *testing.T) {
	dir := folder(t)
	os.WriteFile(filepath.Join(dir, "vouch.yaml"), []byte("firm:\n  name: Ashgrove Plant Engineers (fictional)\n"), 0o644)
	srv, err := New(Options{Path: filepath.Join(dir, "unit1", "fp.calc.md"), SettingsRoot: dir})
	if err != nil {
		t.Fatal(err)
	}
	if _, body := get(t, srv.Handler(), "/", "127.0.0.1"); !strings.Contains(body, "Ashgrove Plant Engineers (fictional)") {
		t.Error("the preview does not show the firm of the settings root's vouch.yaml")
	}
	os.WriteFile(filepath.Join(dir, "vouch.yaml"), []byte("paper: A5\n"), 0o644)
	if _, body := get(t, srv.Handler(), "/", "127.0.0.1"); !strings.Contains(body, "paper must be") {
		t.Errorf("a bad vouch.yaml is not reported: %.300s", body)
	}
}
