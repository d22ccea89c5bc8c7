package calcdoc

import (
	"bytes"
	"html/template"

	"github.com/vouchcalc/vouch/templates"
)

var registerTemplate = template.Must(templates.Register(nil))

// RenderRegisterIndex executes the template of vouch register's index.html
// on view (the register's own view type) and returns the page. The
// templates package is read by calcdoc only, so the register subpackage
// comes through here.
func RenderRegisterIndex(view any) ([]byte, error) {
	var out bytes.Buffer
	if err := registerTemplate.Execute(&out, view); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}
