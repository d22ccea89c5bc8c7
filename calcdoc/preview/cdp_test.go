package preview

// A minimal client for the browser's remote-debugging protocol over a
// WebSocket, written with the standard library, for driving headless
// Chromium in the live-reload test.

import (
	"bufio"
	"crypto/rand"
	"encoding/base64"
	"encoding/binary"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"net"
	"net/http"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// browserNames are the headless browsers tried, in order.
var browserNames = []string{"chromium", "chromium-browser", "google-chrome"}

// needBrowser returns the headless browser, skipping outside CI when none
// is installed (CI installs one and must not skip).
func needBrowser(t testing.TB) string {
	t.Helper()
	for _, n := range browserNames {
		if p, err := exec.LookPath(n); err == nil {
			return p
		}
	}
	if os.Getenv("CI") != "" {
		t.Fatal("CI must have headless Chromium for the live-preview test")
	}
	t.Skip("headless Chromium is not installed")
	return ""
}

// browser is a headless Chromium with one page open, driven over the
// remote-debugging protocol.
type browser struct {
	cmd     *exec.Cmd
	profile string
	conn    net.Conn
	rd      *bufio.Reader
	id      int
}

// openBrowser starts the browser on pageURL and connects to the page.
func openBrowser(t testing.TB, exe, pageURL string) *browser {
	t.Helper()
	profile, err := os.MkdirTemp("", "vouch-browser-")
	if err != nil {
		t.Fatal(err)
	}
	args := []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir=" + profile, "--remote-debugging-port=0", pageURL}
	cmd := exec.Command(exe, args...)
	cmd.SysProcAttr = &syscall.SysProcAttr{Setpgid: true} // its helpers too, so close can end them all
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	b := &browser{cmd: cmd, profile: profile}
	t.Cleanup(b.close)
	port := debugPort(t, profile)
	ws := pageSocket(t, port, pageURL)
	if err := b.dial(ws); err != nil {
		t.Fatal(err)
	}
	return b
}

// debugPort reads the port the browser wrote to DevToolsActivePort.
func debugPort(t testing.TB, profile string) string {
	deadline := time.Now().Add(20 * time.Second)
	for time.Now().Before(deadline) {
		b, err := os.ReadFile(filepath.Join(profile, "DevToolsActivePort"))
		if port, _, ok := strings.Cut(string(b), "\n"); err == nil && ok {
			return port
		}
		time.Sleep(50 * time.Millisecond)
	}
	t.Fatal("the browser did not open its debugging port")
	return ""
}

// pageSocket finds the WebSocket address of the page showing pageURL.
func pageSocket(t testing.TB, port, pageURL string) string {
	deadline := time.Now().Add(20 * time.Second)
	for time.Now().Before(deadline) {
		resp, err := http.Get("http://127.0.0.1:" + port + "/json/list")
		if err == nil {
			var targets []struct{ Type, URL, WebSocketDebuggerURL string }
			json.NewDecoder(resp.Body).Decode(&targets)
			resp.Body.Close()
			for _, tg := range targets {
				if tg.Type == "page" && strings.HasPrefix(tg.URL, pageURL) {
					return tg.WebSocketDebuggerURL
				}
			}
		}
		time.Sleep(50 * time.Millisecond)
	}
	t.Fatal("the browser has no page for " + pageURL)
	return ""
}

// close ends the browser and its helper processes and removes its profile.
// A helper may still be writing to the profile for a moment after it is
// killed, so the removal retries; a profile that cannot be removed stays in
// the system's temporary folder rather than failing the test.
func (b *browser) close() {
	if b.conn != nil {
		b.conn.Close()
	}
	syscall.Kill(-b.cmd.Process.Pid, syscall.SIGKILL)
	b.cmd.Wait()
	for i := 0; i < 40 && os.RemoveAll(b.profile) != nil; i++ {
		time.Sleep(50 * time.Millisecond)
	}
}

// dial opens the WebSocket (RFC 6455 handshake).
func (b *browser) dial(ws string) error {
	u, err := url.Parse(ws)
	if err != nil {
		return err
	}
	if b.conn, err = net.Dial("tcp", u.Host); err != nil {
		return err
	}
	key := make([]byte, 16)
	rand.Read(key)
	fmt.Fprintf(b.conn, "GET %s HTTP/1.1\r\nHost: %s\r\nUpgrade: websocket\r\nConnection: Upgrade\r\n"+
		"Sec-WebSocket-Key: %s\r\nSec-WebSocket-Version: 13\r\n\r\n", u.RequestURI(), u.Host, base64.StdEncoding.EncodeToString(key))
	b.rd = bufio.NewReader(b.conn)
	resp, err := http.ReadResponse(b.rd, nil)
	if err != nil {
		return err
	}
	if resp.StatusCode != http.StatusSwitchingProtocols {
		return fmt.Errorf("websocket handshake: %s", resp.Status)
	}
	return nil
}

// send writes one masked text frame, as a client must.
func (b *browser) send(payload []byte) error {
	hdr := []byte{0x81}
	switch n := len(payload); {
	case n < 126:
		hdr = append(hdr, 0x80|byte(n))
	case n < 1<<16:
		hdr = append(hdr, 0x80|126, byte(n>>8), byte(n))
	default:
		hdr = binary.BigEndian.AppendUint64(append(hdr, 0x80|127), uint64(n))
	}
	mask := make([]byte, 4)
	rand.Read(mask)
	body := make([]byte, len(payload))
	for i, c := range payload {
		body[i] = c ^ mask[i%4]
	}
	_, err := b.conn.Write(append(append(hdr, mask...), body...))
	return err
}

// receive reads one whole message, joining continuation frames and
// answering pings.
func (b *browser) receive() ([]byte, error) {
	var msg []byte
	for {
		var h [2]byte
		if _, err := io.ReadFull(b.rd, h[:]); err != nil {
			return nil, err
		}
		n, err := b.length(h[1] & 0x7f)
		if err != nil {
			return nil, err
		}
		data := make([]byte, n)
		if _, err := io.ReadFull(b.rd, data); err != nil {
			return nil, err
		}
		switch h[0] & 0x0f {
		case 0x8:
			return nil, errors.New("the browser closed the connection")
		case 0x9:
			continue // a ping; the browser does not insist on the pong
		}
		msg = append(msg, data...)
		if h[0]&0x80 != 0 {
			return msg, nil
		}
	}
}

func (b *browser) length(n byte) (uint64, error) {
	switch n {
	case 126:
		var x [2]byte
		_, err := io.ReadFull(b.rd, x[:])
		return uint64(binary.BigEndian.Uint16(x[:])), err
	case 127:
		var x [8]byte
		_, err := io.ReadFull(b.rd, x[:])
		return binary.BigEndian.Uint64(x[:]), err
	}
	return uint64(n), nil
}

// call sends a command and waits for its answer, skipping events.
func (b *browser) call(method string, params any) (json.RawMessage, error) {
	b.id++
	req, _ := json.Marshal(map[string]any{"id": b.id, "method": method, "params": params})
	if err := b.send(req); err != nil {
		return nil, err
	}
	b.conn.SetReadDeadline(time.Now().Add(10 * time.Second))
	for {
		raw, err := b.receive()
		if err != nil {
			return nil, err
		}
		var resp struct {
			ID     int
			Result json.RawMessage
			Error  *struct{ Message string }
		}
		if json.Unmarshal(raw, &resp) != nil || resp.ID != b.id {
			continue
		}
		if resp.Error != nil {
			return nil, errors.New(resp.Error.Message)
		}
		return resp.Result, nil
	}
}

// text returns the page's text content; "" while the page is loading.
func (b *browser) text() (string, error) {
	res, err := b.call("Runtime.evaluate", map[string]any{
		"expression": "document.body ? document.body.textContent : ''", "returnByValue": true})
	if err != nil {
		return "", err
	}
	var out struct{ Result struct{ Value any } }
	json.Unmarshal(res, &out)
	s, _ := out.Result.Value.(string)
	return s, nil
}

// waitFor polls the page's text until it holds want and lacks gone, and
// returns how long that took.
func (b *browser) waitFor(t testing.TB, want, gone string, limit time.Duration) time.Duration {
	t.Helper()
	start := time.Now()
	var last string
	for time.Since(start) < limit {
		s, err := b.text()
		if err == nil && strings.Contains(s, want) && (gone == "" || !strings.Contains(s, gone)) {
			return time.Since(start)
		}
		last = s
		time.Sleep(5 * time.Millisecond)
	}
	t.Fatalf("after %v the page does not show %q (or still shows %q); it shows:\n%.600s", limit, want, gone, last)
	return 0
}
