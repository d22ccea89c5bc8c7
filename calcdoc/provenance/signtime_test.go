package provenance

import (
	"errors"
	"strings"
	"testing"
	"time"
)

// TestCheckSigningTime: the bad-input rule of issue 13 for signing times:
// before the commit or in the future is refused; the commit's own second
// and the present second are accepted.
func TestCheckSigningTime(t *testing.T) {
	commit := time.Date(2026, 3, 14, 9, 0, 0, 0, time.UTC)
	now := time.Date(2026, 3, 20, 12, 0, 0, 0, time.UTC)
	tests := []struct {
		signed  time.Time
		mention string // "" when accepted
	}{
		{commit, ""},
		{commit.Add(999 * time.Millisecond), ""},
		{now, ""},
		{now.Add(999 * time.Millisecond), ""},
		{commit.Add(3 * 24 * time.Hour), ""},
		{commit.Add(-time.Second), "signed 2026-03-14T08:59:59Z, before the package's commit of 2026-03-14T09:00:00Z"},
		{commit.AddDate(-1, 0, 0), "before the package's commit"},
		{now.Add(time.Second), "signed 2026-03-20T12:00:01Z, later than now (2026-03-20T12:00:00Z)"},
		{now.AddDate(10, 0, 0), "later than now"},
		// An offset does not change the instant.
		{time.Date(2026, 3, 14, 11, 0, 0, 0, time.FixedZone("+0200", 7200)), ""},
	}
	for _, tt := range tests {
		err := CheckSigningTime(tt.signed, commit, now)
		switch {
		case tt.mention == "" && err != nil:
			t.Errorf("%v: refused: %v", tt.signed, err)
		case tt.mention != "" && (!errors.Is(err, ErrSigningTime) || !strings.Contains(err.Error(), tt.mention)):
			t.Errorf("%v: got %v, want ErrSigningTime mentioning %q", tt.signed, err, tt.mention)
		}
	}
}

func TestSigningTimeFormat(t *testing.T) {
	at := time.Date(2026, 3, 14, 11, 26, 53, 700e6, time.FixedZone("+0200", 7200))
	s := FormatSigningTime(at)
	if s != "2026-03-14T09:26:53Z" {
		t.Fatalf("FormatSigningTime = %q", s)
	}
	back, err := ParseSigningTime(s)
	if err != nil || !back.Equal(at.Truncate(time.Second)) {
		t.Fatalf("ParseSigningTime(%q) = %v, %v", s, back, err)
	}
	for _, bad := range []string{"", "2026-03-14T11:26:53+02:00", "2026-03-14T09:26:53.7Z", "2026-03-14T09:26Z",
		"2026-03-14 09:26:53Z", "2026-02-30T09:26:53Z", "2026-03-14t09:26:53z", " 2026-03-14T09:26:53Z"} {
		if _, err := ParseSigningTime(bad); !errors.Is(err, ErrSigningTime) {
			t.Errorf("ParseSigningTime(%q) = %v, want ErrSigningTime", bad, err)
		}
	}
}
