package diff

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"path"
	"strings"

	"github.com/vouchcalc/vouch/calcdoc"
)

// MaxCellChanges is the most value changes listed for one data file; the
// rest are counted.
const MaxCellChanges = 200

// CellChange is one value of a data file that changed: a YAML key, or a
// CSV cell named by its row key (the row's first column) and its column.
type CellChange struct {
	Where            string // "DN" or "T_cw [degC] = 20: p_cond [kPa]"
	Old, New         string // as written; "" on the side without it
	OldLine, NewLine int    // lines in the files; 0 on the side without it
}

// dataValueChanges compares a changed data file value by value: YAML key
// by key, CSV cell by cell with row keys. Images and files either side
// cannot read give none, and a note says why.
func dataValueChanges(old, new *calcdoc.Doc, f calcdoc.DataFile, oldHash string) ([]CellChange, int, string) {
	ext := strings.ToLower(path.Ext(f.Path))
	if ext != ".csv" && ext != ".yaml" && ext != ".yml" {
		return nil, 0, ""
	}
	a, errA := old.ReadData(calcdoc.DataFile{Path: f.Path, Hash: oldHash})
	b, errB := new.ReadData(f)
	if errA != nil || errB != nil {
		return nil, 0, "values not compared: the file cannot be read at both revisions"
	}
	var out []CellChange
	var err error
	if ext == ".csv" {
		out, err = csvChanges(a, b)
	} else {
		out, err = yamlChanges(a, b)
	}
	if err != nil {
		return nil, 0, "values not compared: " + err.Error()
	}
	more := 0
	if len(out) > MaxCellChanges {
		more, out = len(out)-MaxCellChanges, out[:MaxCellChanges]
	}
	return out, more, ""
}

// yamlChanges compares two YAML data files key by key, in the new file's
// order, then the keys only the old one has.
func yamlChanges(a, b []byte) ([]CellChange, error) {
	old, err := calcdoc.DataValues(a)
	if err != nil {
		return nil, fmt.Errorf("old file: %v", err)
	}
	new, err := calcdoc.DataValues(b)
	if err != nil {
		return nil, fmt.Errorf("new file: %v", err)
	}
	was := map[string]int{}
	for i, kv := range old {
		was[kv.Key] = i
	}
	var out []CellChange
	seen := map[string]bool{}
	for _, kv := range new {
		seen[kv.Key] = true
		i, ok := was[kv.Key]
		switch {
		case !ok:
			out = append(out, CellChange{Where: kv.Key, New: kv.Value, NewLine: kv.Line})
		case old[i].Value != kv.Value || old[i].Quoted != kv.Quoted:
			out = append(out, CellChange{Where: kv.Key, Old: old[i].Value, New: kv.Value, OldLine: old[i].Line, NewLine: kv.Line})
		}
	}
	for _, kv := range old {
		if !seen[kv.Key] {
			out = append(out, CellChange{Where: kv.Key, Old: kv.Value, OldLine: kv.Line})
		}
	}
	return out, nil
}

// csvTable is a CSV data file as written: header, rows and their lines.
type csvTable struct {
	head  []string
	rows  [][]string
	lines []int
}

func readCSV(raw []byte) (*csvTable, error) {
	r := csv.NewReader(bytes.NewReader(raw))
	r.Comment = '#'
	r.FieldsPerRecord = -1
	t := &csvTable{}
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		for i := range rec {
			rec[i] = strings.TrimSpace(rec[i])
		}
		line, _ := r.FieldPos(0)
		if t.head == nil {
			t.head = rec
			continue
		}
		t.rows, t.lines = append(t.rows, rec), append(t.lines, line)
	}
	if len(t.head) == 0 {
		return nil, fmt.Errorf("no header row")
	}
	return t, nil
}

// csvChanges compares two CSV tables cell by cell. Rows are matched by
// their key, the first column as written (a row whose key is not unique
// is matched by its place among the rows of that key); columns by header.
func csvChanges(a, b []byte) ([]CellChange, error) {
	old, err := readCSV(a)
	if err != nil {
		return nil, fmt.Errorf("old file: %v", err)
	}
	new, err := readCSV(b)
	if err != nil {
		return nil, fmt.Errorf("new file: %v", err)
	}
	var out []CellChange
	if strings.Join(old.head, ",") != strings.Join(new.head, ",") {
		out = append(out, CellChange{Where: "header", Old: strings.Join(old.head, ", "), New: strings.Join(new.head, ", "), OldLine: 1, NewLine: 1})
	}
	oldRows := rowIndex(old)
	seen := map[string]bool{}
	for i, key := range rowKeys(new) {
		seen[key] = true
		j, ok := oldRows[key]
		if !ok {
			out = append(out, CellChange{Where: rowName(new, key) + ": row added", New: strings.Join(new.rows[i], ", "), NewLine: new.lines[i]})
			continue
		}
		out = append(out, cellChanges(old, new, j, i, key)...)
	}
	for j, key := range rowKeys(old) {
		if !seen[key] {
			out = append(out, CellChange{Where: rowName(old, key) + ": row removed", Old: strings.Join(old.rows[j], ", "), OldLine: old.lines[j]})
		}
	}
	return out, nil
}

// cellChanges compares row j of old with row i of new, column by column
// (columns matched by header; the key column is skipped).
func cellChanges(old, new *csvTable, j, i int, key string) []CellChange {
	var out []CellChange
	for c := 1; c < len(new.head); c++ {
		oc := indexOf(old.head, new.head[c])
		nv, ov := cell(new.rows[i], c), ""
		if oc >= 0 {
			ov = cell(old.rows[j], oc)
		}
		if oc >= 1 && ov == nv {
			continue
		}
		out = append(out, CellChange{Where: rowName(new, key) + ": " + new.head[c], Old: ov, New: nv, OldLine: old.lines[j], NewLine: new.lines[i]})
	}
	return out
}

// rowKeys are the rows' keys: the first cell, with "#2", "#3"… after a key
// that repeats.
func rowKeys(t *csvTable) []string {
	count := map[string]int{}
	var out []string
	for _, r := range t.rows {
		k := cell(r, 0)
		count[k]++
		if n := count[k]; n > 1 {
			k += fmt.Sprintf(" #%d", n)
		}
		out = append(out, k)
	}
	return out
}

func rowIndex(t *csvTable) map[string]int {
	m := map[string]int{}
	for i, k := range rowKeys(t) {
		m[k] = i
	}
	return m
}

// rowName names a row by its key column: "T_cw [degC] = 20".
func rowName(t *csvTable, key string) string { return "row " + t.head[0] + " = " + key }

func cell(r []string, i int) string {
	if i < len(r) {
		return r[i]
	}
	return ""
}

func indexOf(s []string, x string) int {
	for i, v := range s {
		if v == x {
			return i
		}
	}
	return -1
}
