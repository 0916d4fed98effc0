package contour

// Method describes how Lines draws isolines, in the words of the report.
const Method = "Isolines by marching squares on the output grid (linear interpolation along cell edges, saddle cells resolved by the cell's mean), at round levels."
