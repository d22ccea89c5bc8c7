package calcdoc

import (
	"bytes"
	"strings"

	gast "github.com/yuin/goldmark/ast"
)

// This file keeps content from being silently not recognised: a byte-order
// mark is read past, a bare carriage return is refused, and a line that
// looks like a calc, sweep or diagram fence but is not read as one (a
// language in capitals, four spaces of indentation, inside raw HTML) is an
// error at its line.

// bom is the UTF-8 byte-order mark some editors write at a file's start.
const bom = "\xef\xbb\xbf"

// bomLen is 3 when src starts with a byte-order mark, else 0.
func bomLen(src []byte) int {
	if bytes.HasPrefix(src, []byte(bom)) {
		return len(bom)
	}
	return 0
}

// bareCR returns the offset of the first carriage return not followed by a
// line feed, or -1. Such a file's lines would run together: vouch reads LF
// and CRLF line ends only.
func bareCR(src []byte) int {
	for i := bytes.IndexByte(src, '\r'); i >= 0; {
		if i+1 == len(src) || src[i+1] != '\n' {
			return i
		}
		j := bytes.IndexByte(src[i+1:], '\r')
		if j < 0 {
			return -1
		}
		i += 1 + j
	}
	return -1
}

// checkLateFront reports front matter that does not start on the first
// line: a --- line after blank lines, followed by key: value lines, would
// otherwise be read as a rule and a heading and the keys silently lost.
func (d *Doc) checkLateFront() {
	rest := d.Src[bomLen(d.Src):]
	for off := bomLen(d.Src); len(rest) > 0; {
		line, after, _ := bytes.Cut(rest, []byte("\n"))
		t := strings.TrimRight(string(line), " \t\r")
		switch {
		case t == "":
			off += len(line) + 1
			rest = after
			continue
		case t == "---" && off > bomLen(d.Src):
			d.errorf(off, "front matter must start on the first line of the file: remove the blank lines above this ---")
		}
		return
	}
}

// fenceWords are the languages of the fences vouch reads.
var fenceWords = map[string]bool{"calc": true, "sweep": true, "diagram": true, "states": true}

// lookalike returns the language a line opens a fence with, when that
// language is a fence vouch reads written in another way ({calc}, Calc, or
// calc itself); "" when the line opens no such fence.
func lookalike(line []byte) string {
	t := strings.TrimLeft(string(line), " \t>")
	t = strings.TrimLeft(strings.TrimPrefix(strings.TrimPrefix(strings.TrimPrefix(t, "- "), "* "), "+ "), " \t")
	if !strings.HasPrefix(t, "```") && !strings.HasPrefix(t, "~~~") {
		return ""
	}
	info := strings.TrimLeft(t, "`~")
	if t[0] == '`' && strings.Contains(info, "`") {
		return "" // a code span, not a fence
	}
	word, _, _ := strings.Cut(strings.TrimSpace(info), " ")
	word, _, _ = strings.Cut(word, "\t")
	if fenceWords[strings.ToLower(strings.Trim(word, "{}.,;:"))] {
		return word
	}
	return ""
}

// checkLookalikes reports every line that opens what looks like a calc,
// sweep or diagram fence but was not read as one. Lines inside another
// fenced block (an example of calc syntax) are content and left alone.
func (d *Doc) checkLookalikes() {
	read := map[int]bool{}
	for _, list := range [][]*gast.FencedCodeBlock{d.fences.calcs, d.fences.sweeps, d.fences.diagrams, d.fences.states} {
		for _, f := range list {
			read[d.lines.pos(d.Src, f.Info.Segment.Start).Line] = true
		}
	}
	var content []gast.Node
	for _, f := range d.fences.others {
		content = append(content, f)
	}
	for _, c := range d.fences.comments { // a calc block commented out on purpose
		content = append(content, c)
	}
	for _, f := range content {
		if n := f.Lines().Len(); n > 0 {
			first := d.lines.pos(d.Src, f.Lines().At(0).Start).Line
			last := d.lines.pos(d.Src, f.Lines().At(n-1).Start).Line
			for l := first; l <= last; l++ {
				read[l] = true
			}
		}
	}
	for n := 1; n <= d.lines.count(); n++ {
		start := d.lines.starts[n-1]
		end := len(d.body)
		if n < d.lines.count() {
			end = d.lines.starts[n] - 1
		}
		word := lookalike(d.body[start:end])
		if word == "" || read[n] {
			continue
		}
		d.errorf(start, "this line looks like a %s fence but is not read as one: write ```%s in lower case at the start of a line (at most three spaces in), outside raw HTML; to show calc syntax as an example, put it inside a longer fence", strings.ToLower(strings.Trim(word, "{}.,;:")), strings.ToLower(strings.Trim(word, "{}.,;:")))
	}
}
