package units

import (
	"math"
	"sync"
	"sync/atomic"
)

// maxCached bounds each cache below, so that a long-running preview server
// fed with ever new unit texts keeps a fixed amount of memory; past the
// bound a text is parsed as before, only not kept.
const maxCached = 4096

// parsedUnits caches ParseCached's results by unit text (string → Unit).
// A cached Unit is shared: nothing changes a Unit after finish, and the
// parser's mul and pow build new factor slices.
var (
	parsedUnits sync.Map
	parsedCount atomic.Int32
)

// ParseCached is Parse with a cache of the texts already read, for callers
// that parse the same few unit texts again and again (a calc's unit
// literals, display units and sweep columns). Errors are not cached.
func ParseCached(text string) (Unit, error) {
	if u, ok := parsedUnits.Load(text); ok {
		return u.(Unit), nil
	}
	u, err := Parse(text)
	if err != nil {
		return u, err
	}
	if parsedCount.Load() < maxCached {
		if _, loaded := parsedUnits.LoadOrStore(text, u); !loaded {
			parsedCount.Add(1)
		}
	}
	return u, nil
}

// displayUnits holds displayChoices parsed once, per dimension.
var displayUnits = sync.OnceValue(func() map[Dim][]Unit {
	out := make(map[Dim][]Unit, len(displayChoices))
	for d, texts := range displayChoices {
		for _, t := range texts {
			out[d] = append(out[d], MustParse(t))
		}
	}
	return out
})

// siUnits caches siUnit by dimension (Dim → Unit).
var (
	siUnits   sync.Map
	siCounted atomic.Int32
)

// cachedSIUnit is siUnit, built once per dimension.
func cachedSIUnit(d Dim) Unit {
	if u, ok := siUnits.Load(d); ok {
		return u.(Unit)
	}
	u := siUnit(d)
	if siCounted.Load() < maxCached {
		if _, loaded := siUnits.LoadOrStore(d, u); !loaded {
			siCounted.Add(1)
		}
	}
	return u
}

// defaultUnit is DefaultUnit from the parsed tables: the last choice whose
// factor the magnitude reaches, else the first.
func defaultUnit(q Quantity) Unit {
	choices, ok := displayUnits()[q.D]
	if !ok {
		return cachedSIUnit(q.D)
	}
	best := choices[0]
	for _, u := range choices[1:] {
		if math.Abs(q.V)/u.Factor >= 1 {
			best = u
		}
	}
	return best
}
