package audit

import (
	"errors"
	"strconv"
	"strings"
	"testing"
)

// TestApproverRefusedWhileAssumptionOpen: a calc with an open assumption
// reads PRELIMINARY once signed, the approver is refused with the
// assumption named at its line; once it is confirmed the approver signs.
func TestApproverRefusedWhileAssumptionOpen(t *testing.T) {
	r := calcRepo(t)
	calc := string(r.Read("calcs/fp.calc.md"))
	open := calc + "\n```assumptions\nA1 open: pump suction is flooded at every load\n```\n"
	r.Write("calcs/fp.calc.md", open)
	r.Commit("Feed pump power: open assumption")
	line := strings.Count(open, "\n") - 1
	pkg := renderFile(t, r.Path("calcs/fp.calc.md"))
	prep, chk, appr := newKey(t, "ed25519"), newKey(t, "ed25519"), newKey(t, "ed25519")
	if s := signPkg(t, pkg, "preparer", prep, ""); strings.TrimSuffix(s.Status, KeysUnchecked) != Preliminary {
		t.Errorf("prepared with an open assumption: status %s, want %s", s.Status, Preliminary)
	}
	if s := signPkg(t, pkg, "checker", chk, ""); strings.TrimSuffix(s.Status, KeysUnchecked) != Preliminary {
		t.Errorf("checked with an open assumption: status %s, want %s", s.Status, Preliminary)
	}
	_, _, err := Sign(pkg, SignOptions{Role: "approver", Key: appr.path, VerifyOptions: VerifyOptions{Engine: "test"}})
	want := "not approved: 1 assumption is still open: A1 (line " + strconv.Itoa(line) + ")"
	if !errors.Is(err, ErrOpenAssumptions) || !strings.Contains(err.Error(), want) {
		t.Fatalf("approver with an open assumption: %v\nwant an error containing %q", err, want)
	}
	if !strings.Contains(string(r.Read("calcs/fp.html")), `<div class="stamp preliminary">PRELIMINARY`) {
		t.Error("the refused package changed or its cover does not read PRELIMINARY")
	}

	r.Write("calcs/fp.calc.md", strings.Replace(open, "A1 open: pump suction is flooded at every load",
		"A1 confirmed: pump suction is flooded at every load | DS-17 rev 2 (fictional)", 1))
	r.Commit("Feed pump power: A1 confirmed")
	pkg = renderFile(t, r.Path("calcs/fp.calc.md"))
	for i, step := range []struct {
		role string
		k    key
	}{{"preparer", prep}, {"checker", chk}, {"approver", appr}} {
		if s := signPkg(t, pkg, step.role, step.k, ""); strings.TrimSuffix(s.Status, KeysUnchecked) != stamps[i] {
			t.Errorf("after %s with every assumption confirmed: status %s, want %s", step.role, s.Status, stamps[i])
		}
	}
}
