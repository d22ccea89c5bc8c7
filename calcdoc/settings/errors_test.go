package settings

import (
	"strings"
	"testing"
)

// TestErrors lists every message of the settings reader with its exact
// text and position.
func TestErrors(t *testing.T) {
	cases := []struct{ name, src, want string }{
		{"syntax", "paper: [A4\n", "vouch.yaml:1:1: vouch.yaml is not valid YAML: line 1: did not find expected ',' or ']'"},
		{"two documents", "paper: A4\n---\npaper: Letter\n", "vouch.yaml:2:1: vouch.yaml must hold one YAML document; remove the --- line and what follows it"},
		{"not a mapping", "- paper\n", "vouch.yaml:1:1: vouch.yaml must be a list of key: value lines, such as paper: A4"},
		{"unknown key, near", "papr: A4\n", `vouch.yaml:1:1: unknown settings key "papr"; did you mean paper?; the keys are firm, paper, caution, display, us_power, front_matter, signers, roles, compare, templates`},
		{"unknown key", "client: X\n", `vouch.yaml:1:1: unknown settings key "client"; the keys are firm, paper, caution, display, us_power, front_matter, signers, roles, compare, templates`},
		{"duplicate key", "paper: A4\ndisplay: SI\npaper: Letter\n", "vouch.yaml:3:1: paper is given twice (first at line 1); keep one"},
		{"key not plain", "[a]: 1\n", "vouch.yaml:1:1: a key must be a plain name"},
		{"firm not mapping", "firm: Harrowgate\n", "vouch.yaml:1:7: firm must be a list of key: value lines (name, address, logo)"},
		{"firm unknown", "firm:\n  nmae: X\n", `vouch.yaml:2:3: unknown key "nmae" under firm; did you mean name?; the keys are name, address, logo`},
		{"firm duplicate", "firm:\n  name: A\n  name: B\n", "vouch.yaml:3:3: firm name is given twice (first at line 2); keep one"},
		{"firm name empty", "firm:\n  name:\n", "vouch.yaml:2:8: firm name must be a text"},
		{"firm name list", "firm:\n  name: [a, b]\n", "vouch.yaml:2:9: firm name must be a text"},
		{"firm name two lines", "firm:\n  name: \"A\\nB\"\n", "vouch.yaml:2:9: firm name must be one line"},
		{"control character", "firm:\n  name: \"A\\aB\"\n", "vouch.yaml:2:9: firm name holds the control character U+0007; remove it"},
		{"address not list", "firm:\n  address: 14 Foundry Wharf\n", "vouch.yaml:2:12: firm address must be a list of lines, such as [1 Quay Street, Portlow PL1 2AB]"},
		{"address line", "firm:\n  address:\n    - x\n    - {a: b}\n", "vouch.yaml:4:7: an address line must be a text"},
		{"logo absolute", "firm:\n  logo: /etc/logo.png\n", `vouch.yaml:2:9: logo must be a path relative to the repository root, such as .vouch/logo.svg, not "/etc/logo.png"`},
		{"logo drive", "firm:\n  logo: C:/logo.png\n", `vouch.yaml:2:9: logo must be a path relative to the repository root, such as .vouch/logo.svg, not "C:/logo.png"`},
		{"logo backslash", "firm:\n  logo: .vouch\\logo.png\n", `vouch.yaml:2:9: logo must be written with / between folders: ".vouch/logo.png", not ".vouch\\logo.png"`},
		{"logo escapes", "firm:\n  logo: ../other/logo.png\n", `vouch.yaml:2:9: logo must stay inside the repository; "../other/logo.png" leaves it`},
		{"logo escapes inside", "firm:\n  logo: a/../../logo.png\n", `vouch.yaml:2:9: logo must stay inside the repository; "a/../../logo.png" leaves it`},
		{"logo unclean", "firm:\n  logo: ./.vouch//logo.png\n", `vouch.yaml:2:9: logo must be written ".vouch/logo.png", not "./.vouch//logo.png"`},
		{"logo root", "firm:\n  logo: .\n", "vouch.yaml:2:9: logo must name a file or folder inside the repository, not its root"},
		{"logo in git", "firm:\n  logo: .GIT/logo.png\n", `vouch.yaml:2:9: logo must not point into the repository's .git folder: ".GIT/logo.png"`},
		{"logo type", "firm:\n  logo: .vouch/logo.pdf\n", `vouch.yaml:2:9: logo must be a PNG, JPEG, GIF, WebP or SVG image, not ".vouch/logo.pdf"`},
		{"paper", "paper: a4\n", `vouch.yaml:1:8: paper must be A4 or Letter, not "a4"`},
		{"paper list", "paper: [A4]\n", `vouch.yaml:1:8: paper must be A4 or Letter, not "a list"`},
		{"display", "display: imperial\n", `vouch.yaml:1:10: display must be SI or US, not "imperial"`},
		{"us_power", "us_power: W\n", `vouch.yaml:1:11: us_power must be hp or kW, not "W"`},
		{"caution empty", "caution: \"  \"\n", "vouch.yaml:1:10: caution must be a text"},
		{"front_matter list", "front_matter: [client]\n", "vouch.yaml:1:15: front_matter must be a list of key: value lines ()"},
		{"front_matter name", "front_matter:\n  Client: Client\n", `vouch.yaml:2:3: front-matter key "Client" must be a lowercase name of letters, digits and _, starting with a letter, such as client_document`},
		{"front_matter built in", "front_matter:\n  title: Title\n", `vouch.yaml:2:3: front-matter key "title" is built in; a firm's key needs another name (the built-in keys are atmosphere, compare, digits, display, number, paper, people, project, references, revision, revisions, summary, title, us_power)`},
		{"front_matter duplicate", "front_matter:\n  client: Client\n  client: Customer\n", "vouch.yaml:3:3: front_matter client is given twice (first at line 2); keep one"},
		{"front_matter label", "front_matter:\n  client:\n", "vouch.yaml:2:10: the label of client must be a text"},
		{"signers escapes", "signers: ../keys\n", `vouch.yaml:1:10: signers must stay inside the repository; "../keys" leaves it`},
		{"templates in git", "templates: .git/hooks\n", `vouch.yaml:1:12: templates must not point into the repository's .git folder: ".git/hooks"`},
		{"roles unknown", "roles:\n  attestations: {}\n", `vouch.yaml:2:3: unknown key "attestations" under roles; did you mean attestation?; the keys are attestation, allow_same_signer`},
		{"attestation role", "roles:\n  attestation:\n    reviewer: I looked.\n", `vouch.yaml:3:5: unknown key "reviewer" under roles attestation; the keys are preparer, checker, approver`},
		{"attestation text", "roles:\n  attestation:\n    checker: [a]\n", "vouch.yaml:3:14: the attestation of the checker must be a text"},
		{"same signer not list", "roles:\n  allow_same_signer: checker\n", "vouch.yaml:2:22: allow_same_signer must be a list of entries, each with roles: [checker, approver] and a reason"},
		{"same signer item", "roles:\n  allow_same_signer:\n    - checker\n", "vouch.yaml:3:7: allow_same_signer must be a list of key: value lines (roles, reason)"},
		{"same signer no reason", "roles:\n  allow_same_signer:\n    - roles: [checker, approver]\n", "vouch.yaml:3:7: each allow_same_signer entry needs roles (a pair such as [checker, approver]) and a reason, which the cover prints"},
		{"same signer no roles", "roles:\n  allow_same_signer:\n    - reason: small office\n", "vouch.yaml:3:7: each allow_same_signer entry needs roles (a pair such as [checker, approver]) and a reason, which the cover prints"},
		{"same signer unknown key", "roles:\n  allow_same_signer:\n    - roles: [checker, approver]\n      reason: x\n      until: 2027\n", `vouch.yaml:5:7: unknown key "until" under allow_same_signer; the keys are roles, reason`},
		{"same signer three", "roles:\n  allow_same_signer:\n    - roles: [preparer, checker, approver]\n      reason: x\n", "vouch.yaml:3:14: roles must be a pair of roles, such as [checker, approver]"},
		{"same signer unknown role", "roles:\n  allow_same_signer:\n    - roles: [checker, boss]\n      reason: x\n", `vouch.yaml:3:24: unknown role "boss"; the roles are preparer, checker, approver`},
		{"same signer same role", "roles:\n  allow_same_signer:\n    - roles: [checker, checker]\n      reason: x\n", "vouch.yaml:3:14: roles must name two different roles, such as [checker, approver]"},
		{"same signer preparer checker", "roles:\n  allow_same_signer:\n    - roles: [checker, preparer]\n      reason: x\n", "vouch.yaml:3:14: the preparer may not check their own calc: a calc checked by the person who made it is not checked; the pairs a firm may allow are [preparer, approver] and [checker, approver]"},
		{"same signer twice", "roles:\n  allow_same_signer:\n    - roles: [checker, approver]\n      reason: x\n    - roles: [approver, checker]\n      reason: y\n", "vouch.yaml:5:7: the pair [checker, approver] is given twice (first at line 3); keep one"},
		{"tolerance no percent", "compare:\n  tolerance: 0.5\n", `vouch.yaml:2:14: compare tolerance must be a percentage such as 0.5 %, not "0.5"`},
		{"tolerance word", "compare:\n  tolerance: tight\n", `vouch.yaml:2:14: compare tolerance must be a percentage such as 0.5 %, not "tight"`},
		{"tolerance zero", "compare:\n  tolerance: 0 %\n", `vouch.yaml:2:14: compare tolerance must be more than 0 % and less than 100 %, not "0 %"`},
		{"tolerance nan", "compare:\n  tolerance: NaN %\n", `vouch.yaml:2:14: compare tolerance must be more than 0 % and less than 100 %, not "NaN %"`},
		{"compare unknown", "compare:\n  tol: 1 %\n", `vouch.yaml:2:3: unknown key "tol" under compare; the keys are tolerance`},
	}
	cases = append(cases, struct{ name, src, want string }{"too large",
		"caution: " + strings.Repeat("x", MaxSize) + "\n",
		"vouch.yaml:1:1: vouch.yaml is larger than 1048576 bytes; a settings file is a page of text"},
		struct{ name, src, want string }{"not UTF-8", "paper: \xff\n", "vouch.yaml:1:1: vouch.yaml is not valid YAML: invalid leading UTF-8 octet"})
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			s, err := Parse("vouch.yaml", []byte(c.src))
			if err == nil {
				t.Fatalf("no error; settings %+v", s)
			}
			if s != nil {
				t.Errorf("settings returned with an error: %+v", s)
			}
			if err.Error() != c.want {
				t.Errorf("got  %s\nwant %s", err, c.want)
			}
		})
	}
}

// TestErrorsGathered checks that one bad line does not hide the next, that
// the errors come in file order, and that Format quotes the line.
func TestErrorsGathered(t *testing.T) {
	src := "display: metric\npaper: B5\nfirm:\n  logo: ../x.png\n"
	_, err := Parse("vouch.yaml", []byte(src))
	list, ok := err.(ErrorList)
	if !ok || len(list) != 3 {
		t.Fatalf("got %v, want three errors", err)
	}
	if list[0].Line != 1 || list[1].Line != 2 || list[2].Line != 4 {
		t.Errorf("errors out of order: %v", err)
	}
	want := `vouch.yaml:2:8: paper must be A4 or Letter, not "B5"` + "\n    paper: B5\n           ^\n"
	if got := (ErrorList{list[1]}).Format([]byte(src)); got != want {
		t.Errorf("Format:\n%s\nwant\n%s", got, want)
	}
}

func TestAccepted(t *testing.T) {
	for _, src := range []string{
		"", "# only a comment\n", "~\n", "paper: Letter\ndisplay: US\nus_power: kW\n",
		"compare:\n  tolerance: 2.5%\n", "front_matter: {}\n",
		"roles:\n  allow_same_signer:\n    - roles: [preparer, approver]\n      reason: |\n        Two lines\n        of reason.\n",
	} {
		s, err := Parse("vouch.yaml", []byte(src))
		if err != nil {
			t.Errorf("%q: %v", src, err)
			continue
		}
		roundTrip(t, s)
	}
}
