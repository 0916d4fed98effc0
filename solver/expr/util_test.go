package expr

import "strconv"

func fmtG(x float64) string { return strconv.FormatFloat(x, 'g', 17, 64) }
