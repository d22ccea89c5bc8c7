package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"

	"github.com/vouchcalc/vouch/calcdoc/preview"
)

// serveContext ends the preview server: on Ctrl-C or SIGTERM (tests
// replace it).
var serveContext = func() (context.Context, context.CancelFunc) {
	return signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
}

// cmdServe serves a live preview of a calc, or of the calcs in a folder,
// until interrupted. Exit: 0, or 2 for a bad path, an address that is not
// on loopback (without --allow-remote) or a port in use.
func cmdServe(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("serve", stderr)
	addr := fs.String("addr", preview.DefaultAddr, "address to listen on, HOST:PORT (port 0 picks a free one)")
	remote := fs.Bool("allow-remote", false, "allow an address other machines can reach")
	paths, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if len(paths) != 1 {
		fmt.Fprintln(stderr, "usage: vouch serve FILE|DIR [--addr 127.0.0.1:PORT] [--allow-remote]")
		return exitUsage
	}
	if err := preview.CheckAddr(*addr, *remote); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	srv, err := preview.New(preview.Options{Path: paths[0], Engine: Version, Remote: *remote, SettingsRoot: settingsRoot(paths[0])})
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	ln, err := preview.Listen(*addr)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	fmt.Fprintf(stdout, "previewing %s at http://%s/ (Ctrl-C to stop)\n", paths[0], ln.Addr())
	ctx, stop := serveContext()
	defer stop()
	if err := srv.Serve(ctx, ln); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	return exitOK
}
