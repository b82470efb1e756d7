package main

import (
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"farforce/field"
	"farforce/readers"
)

// loadField reads the solution files of a command (several files are the
// zones of one partitioned solution); errors are bad input.
func loadField(paths []string, opt readers.Options) (*field.Field, error) {
	f, err := readers.ReadFiles(paths, opt)
	return f, inputErr(err)
}

// writeJSON prints v as indented JSON.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// writeReport prints rep on e.stdout in the format chosen by --json and
// --csv (at most one of them set): as JSON, through csv with the notice on
// stderr (so that stdout holds only the table), or through text.
func writeReport(e *env, rep any, asJSON, asCSV bool, csv func(io.Writer) error, text func(io.Writer)) error {
	switch {
	case asJSON:
		return writeJSON(e.stdout, rep)
	case asCSV:
		if err := csv(e.stdout); err != nil {
			return err
		}
		fmt.Fprintln(e.stderr, notice)
	default:
		text(e.stdout)
	}
	return nil
}

// writeFileAtomic writes a file through write into a temporary file in the
// same folder and renames it over path, so readers never see a half-written
// file. On error the temporary file is removed and path is untouched.
func writeFileAtomic(path string, write func(w io.Writer) error) (err error) {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err = write(tmp); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = os.Chmod(tmp.Name(), 0o644); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}
