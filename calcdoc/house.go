package calcdoc

import (
	"encoding/base64"
	"errors"
	"html/template"
	"io/fs"
	"path"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc/provenance"
	"github.com/vouchcalc/vouch/calcdoc/settings"
)

// ReadOptions are what the caller hands the reader beyond the calc file:
// the repository's settings (vouch.yaml), read by the caller from the work
// tree or from a commit's tree.
type ReadOptions struct {
	// Settings are the repository's settings; nil means settings.Default().
	Settings *settings.Settings
	// SettingsSource is the settings file as read, nil when the repository
	// has none. Its git blob hash goes into the manifest's data files, so
	// that verify reproduces the package with the settings as committed.
	SettingsSource []byte
}

// SettingsIn reads the settings file at the root of files, whose folder on
// disk is root (for messages). A missing file gives the defaults; a bad
// file gives a settings.ErrorList, which Format prints with the source
// returned beside it.
func SettingsIn(files fs.FS, root string) (ReadOptions, []byte, error) {
	s, src, err := settings.Load(files, root)
	if errors.Is(err, provenance.ErrNotAtCommit) {
		return ReadOptions{Settings: settings.Default()}, nil, nil // a commit's tree without the file
	}
	if err != nil {
		return ReadOptions{}, src, err
	}
	return ReadOptions{Settings: s, SettingsSource: src}, src, nil
}

// ReadWith parses a calc file's bytes with the repository's settings: the
// firm's extra front-matter keys are known, and paper, display and caution
// default to the firm's. It never fails: problems are gathered in
// Doc.Errors.
func ReadWith(path string, src []byte, opt ReadOptions) *Doc {
	return read(path, src, opt)
}

// settingsData is the manifest's entry for the settings file, if read.
func (d *Doc) settingsData() []provenance.DataFile {
	if d.settingsSrc == nil {
		return nil
	}
	return []provenance.DataFile{{Path: settings.FileName, Hash: provenance.BlobHash(d.settingsSrc)}}
}

// loadLogo reads the firm's logo from the root of Files, records it as a
// data file and makes its data URI. A logo that cannot be read is an error
// of the calc (at its first line): the cover would lie about the firm.
func (d *Doc) loadLogo() {
	logo := d.Settings.Firm.Logo
	if logo == "" {
		return
	}
	mime, ok := imageTypes[strings.ToLower(path.Ext(logo))]
	if !ok {
		d.errorf(0, "%s: firm logo %s: the logo is a PNG, JPEG, GIF, WebP or SVG image (.png .jpg .jpeg .gif .webp .svg)", settings.FileName, logo)
		return
	}
	raw, err := fs.ReadFile(d.Files, logo)
	if errors.Is(err, fs.ErrNotExist) {
		d.errorf(0, "%s: firm logo %s does not exist in the repository; commit the image or correct the path", settings.FileName, logo)
		return
	}
	if err != nil {
		d.errorf(0, "%s: firm logo %s: %v", settings.FileName, logo, err)
		return
	}
	if len(raw) > MaxImageBytes {
		d.errorf(0, "%s: firm logo %s is %d bytes; a package embeds images of at most %d bytes", settings.FileName, logo, len(raw), MaxImageBytes)
		return
	}
	d.logoURI = "data:" + mime + ";base64," + base64.StdEncoding.EncodeToString(raw)
	d.logoData = &provenance.DataFile{Path: logo, Hash: provenance.BlobHash(raw)}
}

// SettingsErrorText is the text of an error of SettingsIn: each problem of
// the settings file at its line, with the line quoted.
func SettingsErrorText(err error, src []byte) string {
	var list settings.ErrorList
	if errors.As(err, &list) {
		return strings.TrimRight(list.Format(src), "\n")
	}
	return err.Error()
}

// Paper is the calc's paper size: its front matter's, else the firm's.
func (d *Doc) Paper() string {
	if d.Front.Paper != "" {
		return d.Front.Paper
	}
	return d.Settings.Paper
}

// Display is the system results without a [UNIT] are shown in: the front
// matter's, else the firm's.
func (d *Doc) Display() string {
	if d.Front.Display != "" {
		return d.Front.Display
	}
	return d.Settings.Display
}

// USPower is the power unit of the US system: the front matter's, else
// the firm's.
func (d *Doc) USPower() string {
	if d.Front.USPower != "" {
		return d.Front.USPower
	}
	return d.Settings.USPower
}

// houseView is the firm's part of the cover and of every page header.
type houseView struct {
	FirmName    string
	FirmAddress []string
	Logo        template.URL // a data URI built by loadLogo from base64 only
	Fields      []ExtraField
	PageSize    string // the CSS @page size
	Header      string // the running header: firm, number, revision, status
}

// pageSizes are the CSS page sizes of the papers.
var pageSizes = map[string]string{settings.A4: "A4", settings.Letter: "letter"}

// house fills the firm's part of the view; the status comes from the stamp.
func (d *Doc) house(status string) houseView {
	s := d.Settings
	h := houseView{FirmName: s.Firm.Name, FirmAddress: s.Firm.Address, Logo: template.URL(d.logoURI),
		Fields: d.Front.Extra, PageSize: pageSizes[d.Paper()]}
	var parts []string
	for _, p := range []string{s.Firm.Name, d.Front.Number} {
		if p != "" {
			parts = append(parts, p)
		}
	}
	if d.Front.Revision != "" {
		parts = append(parts, "revision "+d.Front.Revision)
	}
	h.Header = strings.Join(append(parts, status), " · ")
	return h
}
