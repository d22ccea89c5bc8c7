// Package docs carries, inside the binary, the documents vouch reads at
// run time: the engine's errata list, docs/errata.yaml.
package docs

import _ "embed"

// Errata is docs/errata.yaml as it was when the binary was built.
//
//go:embed errata.yaml
var Errata []byte
