package surface

import (
	"fmt"
	"math"
)

// gradeSamples is the number of intervals on which a size function is
// sampled along a curve to grade its subdivision.
const gradeSamples = 256

// grade subdivides a curve of length length, parametrised by t in [0,1],
// into at least minN intervals whose lengths follow h(t): the number of
// intervals is ceil(∫ dl/h) and the break points are equally spaced in the
// cumulative ∫ dl/h (trapezoid rule on gradeSamples intervals). It returns
// the break points t_0 = 0 < ... < t_N = 1. A constant h gives equal
// intervals. Errors: a bad h value, more than MaxFacets intervals.
func grade(spec string, length float64, minN int, h func(t float64) (float64, error)) ([]float64, error) {
	var g [gradeSamples + 1]float64
	for k := 0; k <= gradeSamples; k++ {
		hk, err := h(float64(k) / gradeSamples)
		if err != nil {
			return nil, err
		}
		g[k] = length / hk
	}
	var cum [gradeSamples + 1]float64
	for k := 1; k <= gradeSamples; k++ {
		cum[k] = cum[k-1] + (g[k-1]+g[k])/(2*gradeSamples)
	}
	total := cum[gradeSamples]
	if !(total < MaxFacets) {
		return nil, fmt.Errorf("surface %q: %.3g subdivisions along one curve exceeds the limit of %d facets; give a larger size=", spec, total, MaxFacets)
	}
	n := int(math.Ceil(total - 1e-9))
	if n < minN {
		n = minN
	}
	ts := make([]float64, n+1)
	k := 0
	for i := 1; i < n; i++ {
		target := total * float64(i) / float64(n)
		for k < gradeSamples-1 && cum[k+1] < target {
			k++
		}
		w := cum[k+1] - cum[k]
		f := 0.0
		if w > 0 {
			f = (target - cum[k]) / w
		}
		ts[i] = (float64(k) + f) / gradeSamples
	}
	ts[n] = 1
	return ts, nil
}

// ringSamples is the number of points around a ring at which the size
// function is sampled; the ring takes the smallest size found.
const ringSamples = 48

// ringCount returns the number of vertices of a ring of radius r whose edge
// should be about h: ceil(2πr/h), at least 3; 1 for a ring of radius 0;
// MaxFacets+1 when that would exceed MaxFacets.
func ringCount(r, h float64) int {
	if r == 0 {
		return 1
	}
	v := math.Ceil(2*math.Pi*r/h - 1e-9)
	if !(v <= MaxFacets) {
		return MaxFacets + 1 // rejected by the facet count check
	}
	n := int(v)
	if n < 3 {
		n = 3
	}
	return n
}
