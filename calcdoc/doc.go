// Package calcdoc reads a calc file — YAML front matter, Markdown prose,
// calc blocks and inline values — evaluates it, and renders the package.
// It runs no git and checks no signature: data files and images come
// through Doc.Files (an fs.FS the caller roots), and Render takes the
// provenance stamp (Stamp) as a value. It is the only importer of
// goldmark.
//
// Files:
//   - reading: parse.go (Doc, Read), front.go (front matter), errors.go
//     (Pos, Error, ErrorList, UsageError), prose.go (prose lines for the
//     diff), files.go (the work tree as an fs.FS), data.go (csv and yaml readers,
//     path rules), images.go (images of the prose), sources.go (| sources
//     of inputs, the references key), assumptions.go (assumptions blocks), house.go (the
//     repository's settings: ReadWith, SettingsIn, the firm's logo and
//     title block, paper and display system).
//   - evaluating: run.go (Evaluate, ReadFile, ReadIn), sweep.go and
//     sweeprun.go (sweep blocks), diagram.go (T-s and h-s diagrams),
//     states.go (states blocks: tables of state points), uncert.go and
//     uncertrun.go (propagation of uncertainties), budget.go, budgetrun.go
//     and budgetmc.go (budget blocks, Monte Carlo check).
//   - rendering: render.go (Render, Package), body.go (the Markdown body),
//     mathml.go and typeset.go (formulas and values), display.go (the SI
//     and US display systems), cover.go (cover,
//     signature block, history), datainputs.go (YAML values as inputs),
//     datatables.go (the CSV appendix, interp rows), budgethtml.go and
//     uncerthtml.go (budget tables, ± in calc lines), manifest.go (Stamp, the evaluation's part
//     of the manifest), writefile.go (atomic writes for the commands).
//
// Its neighbours: calcdoc/audit builds stamps from git and signs and
// verifies packages; calcdoc/diff compares two revisions; calcdoc/register
// and calcdoc/preview render many calcs or one live.
package calcdoc
