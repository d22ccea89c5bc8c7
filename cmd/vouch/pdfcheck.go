package main

import (
	"bytes"
	"encoding/hex"
	"fmt"
	"html"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf16"
)

// htmlTitle is the text of a page's <title> as a browser reads it:
// unescaped, its runs of white space made one space, trimmed.
func htmlTitle(page []byte) string {
	m := titleRE.FindSubmatch(page)
	if m == nil {
		return ""
	}
	return strings.Join(strings.Fields(html.UnescapeString(string(m[1]))), " ")
}

var (
	titleRE    = regexp.MustCompile(`(?s)<title>(.*?)</title>`)
	pdfCountRE = regexp.MustCompile(`/Type\s*/Pages\b[^>]*?/Count\s+(\d+)|/Count\s+(\d+)[^>]*?/Type\s*/Pages\b`)
	pdfTitleRE = regexp.MustCompile(`/Title\s*(\((?:\\.|[^\\)])*\)|<[0-9A-Fa-f\s]*>)`)
)

// checkPDF checks that a PDF the browser wrote has at least one page and
// carries the package's title, so that a PDF of another page (a file the
// browser found by a wrongly read path, an error page) is never reported
// as the package's.
func checkPDF(pdf []byte, title string) error {
	if !bytes.HasPrefix(pdf, []byte("%PDF-")) {
		return fmt.Errorf("the browser's output is not a PDF")
	}
	pages := 0
	for _, m := range pdfCountRE.FindAllSubmatch(pdf, -1) {
		n, _ := strconv.Atoi(string(append(m[1], m[2]...)))
		pages = max(pages, n)
	}
	if pages == 0 {
		return fmt.Errorf("the PDF has no pages")
	}
	m := pdfTitleRE.FindSubmatch(pdf)
	if m == nil {
		return fmt.Errorf("the PDF has no title, so it cannot be told to be this package")
	}
	if got := strings.Join(strings.Fields(pdfString(m[1])), " "); got != title {
		return fmt.Errorf("the PDF's title is %q, not the package's %q: the browser printed another page", excerptText(got), excerptText(title))
	}
	return nil
}

// pdfString decodes a PDF string object: (literal) or <hex>, in PDFDoc
// encoding (read as Latin-1) or UTF-16BE with its byte-order mark.
func pdfString(s []byte) string {
	var raw []byte
	if s[0] == '<' {
		raw, _ = hex.DecodeString(strings.Join(strings.Fields(string(s[1:len(s)-1])), ""))
	} else {
		raw = unescapePDF(s[1 : len(s)-1])
	}
	if len(raw) >= 2 && raw[0] == 0xFE && raw[1] == 0xFF {
		u := make([]uint16, 0, len(raw)/2)
		for i := 2; i+1 < len(raw); i += 2 {
			u = append(u, uint16(raw[i])<<8|uint16(raw[i+1]))
		}
		return string(utf16.Decode(u))
	}
	r := make([]rune, len(raw))
	for i, b := range raw {
		r[i] = rune(b)
	}
	return string(r)
}

// unescapePDF undoes the backslash escapes of a PDF literal string.
func unescapePDF(s []byte) []byte {
	var out []byte
	for i := 0; i < len(s); i++ {
		if s[i] != '\\' || i+1 == len(s) {
			out = append(out, s[i])
			continue
		}
		i++
		switch c := s[i]; c {
		case 'n':
			out = append(out, '\n')
		case 'r':
			out = append(out, '\r')
		case 't':
			out = append(out, '\t')
		case 'b':
			out = append(out, '\b')
		case 'f':
			out = append(out, '\f')
		case '0', '1', '2', '3', '4', '5', '6', '7':
			j := i
			for j < len(s) && j < i+3 && s[j] >= '0' && s[j] <= '7' {
				j++
			}
			v, _ := strconv.ParseUint(string(s[i:j]), 8, 8)
			out = append(out, byte(v))
			i = j - 1
		default:
			out = append(out, c)
		}
	}
	return out
}

// excerptText cuts a text for a message.
func excerptText(s string) string {
	if r := []rune(s); len(r) > 80 {
		return string(r[:80]) + "…"
	}
	return s
}
