package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/vouchcalc/vouch/calcdoc/settings"
	"github.com/vouchcalc/vouch/calcdoc/starter"
)

// gitUser asks git for user.name and user.email in dir; either is "" when
// git or the setting is missing. Tests replace it.
var gitUser = func(dir string) starter.Person {
	get := func(key string) string {
		cmd := exec.Command("git", "config", "--get", key)
		cmd.Dir = dir
		out, err := cmd.Output()
		if err != nil {
			return ""
		}
		return strings.TrimSpace(string(out))
	}
	return starter.Person{Name: get("user.name"), Email: get("user.email")}
}

func cmdNew(args []string, stdout, stderr io.Writer) int {
	fs := newFlags("new", stderr)
	name := fs.String("template", "blank", "the template to start from (see --list)")
	list := fs.Bool("list", false, "list the templates")
	files, err := parseArgs(fs, args)
	if err != nil {
		return exitUsage
	}
	if *list && len(files) == 0 {
		return listTemplates(".", stdout, stderr)
	}
	if *list || len(files) != 1 {
		fmt.Fprintln(stderr, "usage: vouch new [--template NAME] FILE.calc.md, or vouch new --list")
		return exitUsage
	}
	dest := files[0]
	if err := starter.CheckName(dest); err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	if _, err := os.Lstat(dest); err == nil {
		fmt.Fprintf(stderr, "vouch: %s already exists; vouch new never replaces a file: choose another name\n", dest)
		return exitUsage
	}
	s, tmpls, code := loadTemplates(filepath.Dir(dest), stderr)
	if code != exitOK {
		return code
	}
	t, err := starter.Find(tmpls, *name)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	text, err := starter.Fill(t, s, gitUser(existingDir(dest)))
	if err == nil {
		err = starter.Write(dest, text)
	}
	if errors.Is(err, starter.ErrExists) {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitUsage
	}
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return exitErrors
	}
	fmt.Fprintf(stdout, "wrote %s from the template %s, %s\n", dest, t.Name, t.Origin())
	return exitOK
}

// loadTemplates reads the settings of the repository that holds dir (dir
// itself outside a repository) and lists the templates.
func loadTemplates(dir string, stderr io.Writer) (*settings.Settings, []starter.Template, int) {
	s, root, code := repoSettings(dir, stderr)
	if code != exitOK {
		return nil, nil, code
	}
	tmpls, err := starter.List(os.DirFS(root), s)
	if err != nil {
		fmt.Fprintf(stderr, "vouch: %v\n", err)
		return nil, nil, exitErrors
	}
	return s, tmpls, exitOK
}

func listTemplates(dir string, stdout, stderr io.Writer) int {
	_, tmpls, code := loadTemplates(dir, stderr)
	if code != exitOK {
		return code
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "template\ttitle\tfrom")
	for _, t := range tmpls {
		fmt.Fprintf(tw, "%s\t%s\t%s\n", t.Name, t.Title(), t.Origin())
	}
	tw.Flush()
	return exitOK
}

// existingDir is the nearest existing folder of dest, where git is asked.
func existingDir(dest string) string {
	dir := filepath.Dir(dest)
	for {
		if st, err := os.Stat(dir); err == nil && st.IsDir() {
			return dir
		}
		up := filepath.Dir(dir)
		if up == dir {
			return "."
		}
		dir = up
	}
}
