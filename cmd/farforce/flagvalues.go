package main

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"farforce/field"
)

// parseVector parses "X,Y,Z" (or "X,Y" when two is allowed, z = 0) into a
// vector of finite numbers. flag names the option in the error.
func parseVector(flag, s string, two bool) ([3]float64, error) {
	var v [3]float64
	parts := strings.Split(s, ",")
	if len(parts) != 3 && !(two && len(parts) == 2) {
		want := "X,Y,Z"
		if two {
			want = "X,Y,Z or X,Y"
		}
		return v, fmt.Errorf("--%s %q: want %s", flag, s, want)
	}
	for i, p := range parts {
		x, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
			return v, fmt.Errorf("--%s %q: component %d (%q) is not a finite number", flag, s, i+1, p)
		}
		v[i] = x
	}
	return v, nil
}

// parseQuantity parses a NAME|VALUE flag: a finite, non-negative number
// gives a constant, anything else names an array.
func parseQuantity(flag, s string) (field.Quantity, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return field.Quantity{}, fmt.Errorf("--%s: empty value: give an array name or a number", flag)
	}
	x, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return field.Quantity{Name: s}, nil
	}
	if math.IsNaN(x) || math.IsInf(x, 0) || x < 0 {
		return field.Quantity{}, fmt.Errorf("--%s %s: want a finite, non-negative constant", flag, s)
	}
	return field.Quantity{Value: x}, nil
}

// checkNumber rejects a non-finite or negative number flag.
func checkNumber(flag string, x float64, allowNegative bool) error {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return fmt.Errorf("--%s %g: want a finite number", flag, x)
	}
	if x < 0 && !allowNegative {
		return fmt.Errorf("--%s %g: want a value >= 0", flag, x)
	}
	return nil
}
