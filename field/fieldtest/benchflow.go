package fieldtest

import (
	"math"

	"farforce/field"
)

// SampleBenchFlow adds to z a smooth point velocity ("velocity", three
// components) and pressure ("pressure") for benchmarks: invented fields with
// no known answer, chosen only so that interpolation and gradient fits do
// representative work.
func SampleBenchFlow(z *field.Zone) {
	SamplePoints(z, "velocity", 3, func(x [3]float64, dst []float64) {
		dst[0] = 1 + 0.1*math.Sin(2*x[0])*math.Cos(x[1])
		dst[1] = 0.1 * math.Cos(x[1]+x[2])
		dst[2] = 0.05 * x[2] * x[0]
	})
	SamplePoints(z, "pressure", 1, func(x [3]float64, dst []float64) {
		dst[0] = 0.5 * math.Exp(-x[0]*x[0]-x[1]*x[1]-x[2]*x[2])
	})
}
