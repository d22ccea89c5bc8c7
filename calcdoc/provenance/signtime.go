package provenance

import (
	"fmt"
	"time"
)

// SigningTimeLayout is how a signing time is written: RFC 3339 in UTC, to
// the second, as 2026-03-14T09:26:53Z.
const SigningTimeLayout = "2006-01-02T15:04:05Z"

// FormatSigningTime writes t as SigningTimeLayout, in UTC, dropping any
// fraction of a second.
func FormatSigningTime(t time.Time) string {
	return t.UTC().Truncate(time.Second).Format(SigningTimeLayout)
}

// ParseSigningTime reads a signing time written by FormatSigningTime. Any
// other form (another offset, a fraction of a second, no seconds) is an
// error wrapping ErrSigningTime, so that one instant has one spelling.
func ParseSigningTime(s string) (time.Time, error) {
	t, err := time.Parse(SigningTimeLayout, s)
	if err != nil || FormatSigningTime(t) != s {
		return time.Time{}, fmt.Errorf("%w: %q is not a UTC time to the second, such as 2026-03-14T09:26:53Z", ErrSigningTime, clip(s))
	}
	return t, nil
}

// CheckSigningTime checks the signing time a signature records against
// the commit time of the package it signs and the present: a package
// cannot be signed before its commit existed, nor later than now. Times
// are compared in whole seconds, both bounds included. A time out of bounds
// gives an error wrapping ErrSigningTime that states both times.
func CheckSigningTime(signed, commit, now time.Time) error {
	switch {
	case signed.Unix() < commit.Unix():
		return fmt.Errorf("%w: signed %s, before the package's commit of %s: a signature cannot predate what it signs",
			ErrSigningTime, FormatSigningTime(signed), FormatSigningTime(commit))
	case signed.Unix() > now.Unix():
		return fmt.Errorf("%w: signed %s, later than now (%s): the signing clock was wrong or the time was edited",
			ErrSigningTime, FormatSigningTime(signed), FormatSigningTime(now))
	}
	return nil
}
