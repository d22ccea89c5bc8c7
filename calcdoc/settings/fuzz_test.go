package settings

import "testing"

// FuzzSettings: any input gives settings or errors, never a panic; every
// error has a position; every accepted file's values survive Marshal and a
// second Parse unchanged.
func FuzzSettings(f *testing.F) {
	f.Add(referenceExample(f))
	f.Add([]byte(""))
	f.Add([]byte("paper: Letter\ndisplay: US\nus_power: kW\ncompare:\n  tolerance: 1e-3 %\n"))
	f.Add([]byte("firm:\n  name: \"A: B # C\"\n  address: [\"'x'\", \"- y\"]\n  logo: a/b.svg\n"))
	f.Add([]byte("front_matter:\n  client: \"null\"\n  x1: \"~\"\nroles:\n  attestation:\n    checker: |\n      two\n      lines\n"))
	f.Add([]byte("roles:\n  allow_same_signer:\n    - roles: [approver, preparer]\n      reason: \" spaced \"\n"))
	f.Add([]byte("a: &x 1\nb: *x\n<<: {c: 1}\n"))
	f.Fuzz(func(t *testing.T, src []byte) {
		s, err := Parse("vouch.yaml", src)
		if err != nil {
			if s != nil {
				t.Fatal("settings returned with errors")
			}
			for _, e := range err.(ErrorList) {
				if e.Line < 1 || e.Col < 1 || e.Msg == "" {
					t.Fatalf("error without a position or message: %+v", e)
				}
			}
			return
		}
		roundTrip(t, s)
	})
}
