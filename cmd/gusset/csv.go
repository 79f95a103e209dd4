package main

import (
	"encoding/csv"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
)

// writeCSV writes every member and node table of the answers into dir,
// one file per table named ID-TABLE.csv, with a header line; numbers in
// the shortest form that reads back to the same double. It returns the
// number of files written.
func writeCSV(dir string, list []answered) (int, error) {
	n := 0
	for _, a := range list {
		for _, t := range resultTables(a) {
			file := filepath.Join(dir, fileName(a.ID)+"-"+safeName(t.Name)+".csv")
			if err := writeTableCSV(file, t); err != nil {
				return n, err
			}
			n++
		}
	}
	return n, nil
}

func writeTableCSV(file string, t table) error {
	f, err := os.Create(file)
	if err != nil {
		return err
	}
	w := csv.NewWriter(f)
	w.Write(t.Columns)
	for _, row := range t.Rows {
		cells := make([]string, len(row))
		for i, v := range row {
			cells[i] = csvCell(v)
		}
		w.Write(cells)
	}
	w.Flush()
	if err := w.Error(); err != nil {
		f.Close()
		return fmt.Errorf("writing %s: %v", file, err)
	}
	return f.Close()
}

func csvCell(v any) string {
	switch x := v.(type) {
	case float64:
		if x == 0 {
			x = 0 // no negative zero in a spreadsheet
		}
		return strconv.FormatFloat(x, 'g', -1, 64)
	case *float64:
		if x == nil {
			return ""
		}
		return strconv.FormatFloat(*x, 'g', -1, 64)
	case string:
		return x
	}
	return fmt.Sprint(v)
}

// safeName keeps letters, digits, '-', '_' and '.' of a table name.
func safeName(s string) string {
	out := []rune{}
	for _, c := range s {
		switch {
		case c >= 'a' && c <= 'z', c >= 'A' && c <= 'Z', c >= '0' && c <= '9', c == '-', c == '_', c == '.':
			out = append(out, c)
		default:
			out = append(out, '_')
		}
	}
	return string(out)
}
