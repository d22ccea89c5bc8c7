package calcdoc

import (
	"encoding/base64"
	"path/filepath"
	"strings"
	"testing"

	"github.com/vouchcalc/vouch/internal/testkit"
)

// TestImagesEmbedded: an image of the prose is read from the repository,
// recorded with its hash like a data file, and embedded as a data URI with
// its alt text and title escaped; the package refers to no other file.
func TestImagesEmbedded(t *testing.T) {
	dir := writeTree(t, map[string]string{
		"fig/cycle sketch.png": string(testkit.TinyPNG),
		"c.calc.md":            "# A\n\n![Cycle <i>sketch</i> & \"notes\"](<fig/cycle sketch.png> \"Unit 1 <cycle>\")\n\n```calc\na = 1 m\n```\n",
	})
	d, err := ReadFile(filepath.Join(dir, "c.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Errors) > 0 {
		t.Fatal(d.Errors.Format("c.calc.md", d.Src))
	}
	out, err := renderHTML(d)
	if err != nil {
		t.Fatal(err)
	}
	want := `<img src="data:image/png;base64,` + base64.StdEncoding.EncodeToString(testkit.TinyPNG) + `" alt="Cycle sketch &amp; &#34;notes&#34;" title="Unit 1 &lt;cycle&gt;">`
	if !strings.Contains(string(out), want) {
		t.Errorf("the package lacks\n%s", want)
	}
	if !strings.Contains(string(out), "<head>\n<meta charset=\"utf-8\">\n"+ContentPolicyTag+"\n") {
		t.Error("the package lacks its content policy at the top of its head")
	}
	if len(d.DataFiles) != 1 || d.DataFiles[0].Path != "fig/cycle sketch.png" {
		t.Errorf("data files %+v, want the image", d.DataFiles)
	}
	if strings.Contains(string(out), `src="fig`) {
		t.Error("the package refers to the image file instead of embedding it")
	}
}

// TestImageErrors: an image on the network, of an unknown type, missing or
// outside the repository is an error at its destination.
func TestImageErrors(t *testing.T) {
	cases := []struct{ md, want string }{
		{"![p](https://example.com/p.png)", "3:6: image https://example.com/p.png: a package fetches nothing from the network; put the image in the repository and give its path"},
		{"Text ![p](//example.com/p.png)", "3:11: image //example.com/p.png: a package fetches nothing from the network; put the image in the repository and give its path"},
		{"![](data:image/png;base64,AAAA)", "3:5: image data:image/png;base64,AAAA: a package fetches nothing from the network; put the image in the repository and give its path"},
		{"![p](notes.txt)", "3:6: image notes.txt: a package embeds PNG, JPEG, GIF, WebP and SVG images (.png .jpg .jpeg .gif .webp .svg)"},
		{"![p](missing.png)", "3:6: image missing.png: missing.png does not exist"},
		{"![p](../../outside.png)", "3:6: image ../../outside.png: ../../outside.png leaves the repository"},
	}
	for _, c := range cases {
		dir := writeTree(t, map[string]string{"sub/c.calc.md": "# A\n\n" + c.md + "\n\n```calc\na = 1 m\n```\n", "notes.txt": "x"})
		d, err := ReadFile(filepath.Join(dir, "sub", "c.calc.md"))
		if err != nil {
			t.Fatal(err)
		}
		if len(d.Errors) == 0 {
			t.Errorf("%s: no error", c.md)
			continue
		}
		e := d.Errors[0]
		if got := sprintf("%d:%d: %s", e.Pos.Line, e.Pos.Col, e.Msg); !strings.HasPrefix(got, c.want) {
			t.Errorf("%s:\n got %s\nwant %s", c.md, got, c.want)
		}
	}
}
