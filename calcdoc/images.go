package calcdoc

import (
	"bytes"
	"encoding/base64"
	"html"
	"net/url"
	"path"
	"strings"

	"github.com/vouchcalc/vouch/internal/excerpt"

	gast "github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/util"
)

// MaxImageBytes is the largest image a package embeds.
const MaxImageBytes = 8 << 20

// MaxDataBytes is the largest data file (csv, yaml) a calc reads.
const MaxDataBytes = 32 << 20

// imageTypes are the image files a package embeds, by extension.
var imageTypes = map[string]string{
	".png": "image/png", ".jpg": "image/jpeg", ".jpeg": "image/jpeg",
	".gif": "image/gif", ".webp": "image/webp", ".svg": "image/svg+xml",
}

// image is an image of the prose: ![alt](path). A package fetches nothing,
// so the file is read from the repository like a data file (its hash goes
// into the manifest) and embedded as a data URI.
type image struct {
	node *gast.Image
	off  int    // the destination's offset in the file, for errors
	uri  string // the data URI, once read
}

// readImage records an image of the prose.
func (d *Doc) readImage(img *gast.Image) {
	d.images = append(d.images, &image{node: img, off: d.imageOff(img)})
}

// imageOff finds the offset of an image's destination: after the "](" that
// follows its alt text, or the start of its paragraph when it has none.
func (d *Doc) imageOff(img *gast.Image) int {
	from := -1
	for c := img.FirstChild(); c != nil; c = c.NextSibling() {
		if t, ok := c.(*gast.Text); ok {
			from = t.Segment.Stop
		}
	}
	if from < 0 {
		if p := img.Parent(); p != nil && p.Lines().Len() > 0 {
			from = p.Lines().At(0).Start
		} else {
			return 0
		}
	}
	dest := img.Destination
	if i := bytes.Index(d.body[from:], []byte("](")); i >= 0 {
		at := from + i + 2
		if j := bytes.Index(d.body[at:], dest); j >= 0 && j < 8 {
			return at + j
		}
		return at
	}
	return from
}

// loadImages reads every image of the prose through the data reader and
// makes its data URI. An image on the network is an error: the package
// would fetch it each time it is opened, and it could change.
func (d *Doc) loadImages() {
	for _, im := range d.images {
		dest := string(im.node.Destination)
		u, err := url.Parse(dest)
		if err != nil || u.Scheme != "" || u.Host != "" || strings.HasPrefix(dest, "//") {
			d.errorf(im.off, "image %s: a package fetches nothing from the network; put the image in the repository and give its path", excerpt.Cut(dest))
			continue
		}
		name, err := url.PathUnescape(u.Path)
		if err != nil || name == "" {
			d.errorf(im.off, "image %s: give the path of an image file in the repository", excerpt.Quote(dest))
			continue
		}
		mime, ok := imageTypes[strings.ToLower(path.Ext(name))]
		if !ok {
			d.errorf(im.off, "image %s: a package embeds PNG, JPEG, GIF, WebP and SVG images (.png .jpg .jpeg .gif .webp .svg)", excerpt.Cut(dest))
			continue
		}
		raw, err := d.readData(name, MaxImageBytes)
		if err != nil {
			d.errorf(im.off, "image %s: %v", excerpt.Cut(dest), err)
			continue
		}
		im.uri = "data:" + mime + ";base64," + base64.StdEncoding.EncodeToString(raw)
	}
}

// imageURI returns the data URI of an image node ("" when it was not read).
func (d *Doc) imageURI(n *gast.Image) string {
	for _, im := range d.images {
		if im.node == n {
			return im.uri
		}
	}
	return ""
}

// image draws an image of the prose with its embedded data. The alt text
// and the title are escaped; the data URI is built here from base64 only.
func (r *bodyRenderer) image(w util.BufWriter, src []byte, n gast.Node, entering bool) (gast.WalkStatus, error) {
	if !entering {
		return gast.WalkContinue, nil
	}
	img := n.(*gast.Image)
	w.WriteString(`<img src="` + r.d.imageURI(img) + `" alt="` + html.EscapeString(altText(img, src)) + `"`)
	if len(img.Title) > 0 {
		w.WriteString(` title="` + html.EscapeString(string(img.Title)) + `"`)
	}
	w.WriteString(">")
	return gast.WalkSkipChildren, nil
}

// altText is the plain text of an image's description.
func altText(n gast.Node, src []byte) string {
	var b strings.Builder
	for c := n.FirstChild(); c != nil; c = c.NextSibling() {
		switch t := c.(type) {
		case *gast.Text:
			b.Write(t.Segment.Value(src))
		case *gast.String:
			b.Write(t.Value)
		default:
			b.WriteString(altText(c, src))
		}
	}
	return b.String()
}
