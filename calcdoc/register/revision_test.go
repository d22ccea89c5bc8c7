package register

import (
	"bytes"
	"strings"
	"testing"
)

// TestRegisterSupersededRevision: a calc moved on to revision B while its
// signed package is of revision A shows revision B as a draft and the
// revision-A package as superseded, never A's PREPARED as B's status.
func TestRegisterSupersededRevision(t *testing.T) {
	r := newTree(t)
	r.Write(calcName(0), genCalc(0, ""))
	r.Write(calcName(1), genCalc(1, ""))
	r.Commit("Two feed pump calcs")
	signAsPreparer(t, renderBeside(t, r.Path(calcName(0))))
	signAsPreparer(t, renderBeside(t, r.Path(calcName(1))))
	r.Write(calcName(1), strings.Replace(strings.Replace(genCalc(1, ""), "revision: A", "revision: B", 1), "m_dot = 151 kg/s", "m_dot = 152 kg/s", 1))
	r.Commit("FP-001 revision B: more flow")
	sum := registerTree(t, r.Dir, t.TempDir(), nil)
	index := string(readFile(t, sum.Index))
	rows := strings.Split(index, "<tr>")
	var a, b string
	for _, row := range rows {
		switch {
		case strings.Contains(row, "FP-000"):
			a = row
		case strings.Contains(row, "FP-001"):
			b = row
		}
	}
	if !strings.Contains(a, `<span class="stamp PREPARED`) || strings.Contains(a, "SUPERSEDED") {
		t.Errorf("FP-000, still at its signed revision, lost its status:\n%s", a)
	}
	if strings.Contains(b, `<span class="stamp PREPARED`) || !strings.Contains(b, `<span class="stamp DRAFT">DRAFT</span>`) || !strings.Contains(b, "<td>B</td>") ||
		!strings.Contains(b, "SUPERSEDED</span> <span class=\"note\">revision A, PREPARED") || !strings.Contains(b, "superseded by revision B") {
		t.Errorf("FP-001 at revision B shows its revision-A package's status:\n%s", b)
	}
	if !bytes.Contains([]byte(index), []byte("never as the status of the newer one")) {
		t.Error("the index does not explain superseded packages")
	}
}
