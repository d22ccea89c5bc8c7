package preview

import (
	"bytes"
	"encoding/json"
	"fmt"
	"html/template"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
)

// banner marks a preview page, so that nobody takes it for a package; it
// is not printed.
const banner = `<div id="vouch-preview" style="position:sticky;top:0;z-index:9;margin:0 0 1rem;padding:.35rem .8rem;font:12px system-ui,sans-serif;background:#fff8d6;border-bottom:1px solid #d8c36a;color:#5a4a00">` +
	`Preview of %s, rendered from the work tree: it refreshes when you save. This is not a package; render it with vouch render.</div>` +
	`<style>@media print{#vouch-preview{display:none}}</style>`

// reloadScript waits for the page to change, then fetches it and swaps it
// in place, keeping the scroll position; a full reload is the fallback.
// It exists only in the preview: packages carry no script.
const reloadScript = `<script>
(function () {
  var calc = %s, version = %d;
  // anchor finds the first element with an id in view, to keep it there.
  function anchor() {
    var all = document.querySelectorAll("[id]");
    for (var i = 0; i < all.length; i++) {
      var top = all[i].getBoundingClientRect().top;
      if (top >= 0) { return {id: all[i].id, top: top}; }
    }
    return null;
  }
  function swap(html) {
    var doc = new DOMParser().parseFromString(html, "text/html");
    var meta = doc.querySelector('meta[name="vouch-preview-version"]');
    if (!meta || !doc.body) { location.reload(); return; }
    var at = anchor(), y = window.scrollY;
    document.title = doc.title;
    document.documentElement.replaceChild(document.adoptNode(doc.head), document.head);
    document.documentElement.replaceChild(document.adoptNode(doc.body), document.body);
    var el = at && document.getElementById(at.id);
    if (el) { window.scrollBy(0, el.getBoundingClientRect().top - at.top); } else { window.scrollTo(0, y); }
    version = Number(meta.content);
    wait();
  }
  function wait() {
    fetch("/_vouch/wait?calc=" + encodeURIComponent(calc) + "&v=" + version, {cache: "no-store"})
      .then(function (r) { if (!r.ok) { throw new Error(r.status); } return r.text(); })
      .then(function (t) {
        if (t.trim() === String(version)) { wait(); return; }
        return fetch(location.href, {cache: "no-store"}).then(function (r) { return r.text(); }).then(swap);
      })
      .catch(function () { setTimeout(wait, 1000); });
  }
  wait();
})();
</script>
`

// previewHead names the page's version, for the script that swaps a new
// page in, and lets the browser lay out on screen only the parts in view:
// a long package then redraws in milliseconds instead of tenths of a
// second. Print is unaffected.
const previewHead = `<meta name="vouch-preview-version" content="%d">` +
	`<style>@media screen { .calc-line, table.grid tr, figure, section.major > p { content-visibility: auto; contain-intrinsic-size: auto 2.5rem; } }</style>`

// inject adds the version to the head, the banner after <body> and the
// reload script before </body>.
func inject(page []byte, rel string, version int) []byte {
	name, _ := json.Marshal(rel) // escapes <, > and &, so it cannot close the script
	script := fmt.Sprintf(reloadScript, name, version)
	top := fmt.Sprintf(banner, template.HTMLEscapeString(rel))
	out := bytes.Replace(page, []byte(calcdoc.ContentPolicyTag+"\n"), nil, 1) // the preview runs a script
	out = bytes.Replace(out, []byte("<body>"), []byte("<body>\n"+top), 1)
	meta := fmt.Sprintf(previewHead, version)
	if i := bytes.Index(out, []byte("</head>")); i >= 0 {
		out = append(out[:i:i], append([]byte(meta), out[i:]...)...)
	}
	if i := bytes.LastIndex(out, []byte("</body>")); i >= 0 {
		return append(out[:i:i], append([]byte(script), out[i:]...)...)
	}
	return append(out, script...)
}

// errorsTemplate shows a calc's errors at their lines of the source.
var errorsTemplate = template.Must(template.New("errors").Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>{{.File}}: {{len .Errors}} {{if eq (len .Errors) 1}}error{{else}}errors{{end}}</title>
<style>
body { margin: 0 auto; max-width: 60rem; padding: 1rem 1.25rem 4rem; font: 14px/1.45 system-ui, sans-serif; color: #1a1a1a; }
h1 { font-size: 1.3rem; color: #a3121f; }
ol.errors a { color: #a3121f; }
pre.src { font: 13px/1.5 ui-monospace, Menlo, Consolas, monospace; border: 1px solid #c9c9c9; padding: .5rem 0; overflow-x: auto; }
pre.src div { padding: 0 .6rem; white-space: pre; }
pre.src .n { display: inline-block; width: 3.5em; color: #8a8a8a; text-align: right; margin-right: 1em; user-select: none; }
pre.src .bad { background: #fbe9eb; }
pre.src .msg { color: #a3121f; font-weight: 600; background: #fbe9eb; }
</style>
</head>
<body>
<h1>{{.File}} has {{len .Errors}} {{if eq (len .Errors) 1}}error{{else}}errors{{end}}: no package</h1>
<p>Fix {{if eq (len .Errors) 1}}it{{else}}them{{end}} and save; this page refreshes by itself.</p>
<ol class="errors">{{range .Errors}}<li><a href="#L{{.Line}}">{{.Text}}</a></li>{{end}}</ol>
{{if .Lines}}<pre class="src">{{range .Lines}}<div id="L{{.N}}"{{if .Errors}} class="bad"{{end}}><span class="n">{{.N}}</span>{{.Text}}</div>{{range .Errors}}<div class="msg"><span class="n"></span>{{.Caret}}^ {{.Msg}}</div>{{end}}{{end}}</pre>{{end}}
</body>
</html>
`))

type errorView struct {
	File   string
	Errors []errorItem
	Lines  []lineView
}

type errorItem struct {
	Line       int
	Text       string // file:line:col: message
	Caret, Msg string
}

type lineView struct {
	N      int
	Text   string
	Errors []errorItem
}

// errorPage shows a calc's errors: the list, and each under its line of
// the source with a caret at its column.
func errorPage(rel string, d *calcdoc.Doc) []byte {
	v := errorView{File: rel}
	at := map[int][]errorItem{}
	for _, e := range d.Errors {
		it := errorItem{Line: e.Pos.Line, Text: fmt.Sprintf("%s:%d:%d: %s", rel, e.Pos.Line, e.Pos.Col, e.Msg),
			Caret: strings.Repeat(" ", max(e.Pos.Col-1, 0)), Msg: e.Msg}
		v.Errors = append(v.Errors, it)
		at[e.Pos.Line] = append(at[e.Pos.Line], it)
	}
	for i, line := range strings.Split(string(d.Src), "\n") {
		v.Lines = append(v.Lines, lineView{N: i + 1, Text: strings.TrimRight(line, "\r"), Errors: at[i+1]})
	}
	return execute(errorsTemplate, v)
}

// problemPage shows a problem that is not at a line: an unreadable file,
// a package that cannot be rendered.
func problemPage(rel, msg string) []byte {
	return execute(errorsTemplate, errorView{File: rel, Errors: []errorItem{{Text: rel + ": " + msg}}})
}

var listTemplate = template.Must(template.New("list").Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>Calcs in {{.Folder}}</title>
<style>
body { margin: 0 auto; max-width: 50rem; padding: 1rem 1.25rem; font: 15px/1.5 system-ui, sans-serif; }
li { font-family: ui-monospace, Menlo, Consolas, monospace; font-size: 14px; }
</style>
</head>
<body>
<h1>Calcs in {{.Folder}}</h1>
<p>Each opens as a live preview that refreshes when the calc is saved.</p>
<ul>{{range .Calcs}}<li><a href="/calc/{{.}}">{{.}}</a></li>{{end}}</ul>
</body>
</html>
`))

// listPage lists the calcs of the folder.
func listPage(folder string, calcs []string) []byte {
	return execute(listTemplate, struct {
		Folder string
		Calcs  []string
	}{folder, calcs})
}

func execute(t *template.Template, v any) []byte {
	var b bytes.Buffer
	if err := t.Execute(&b, v); err != nil {
		return []byte(template.HTMLEscapeString(err.Error()))
	}
	return b.Bytes()
}
