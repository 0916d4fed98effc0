package fdcheck

// Method describes the cross-check in the words of the report: what
// Richardson computes (see the package comment for the scheme).
const Method = "Independent cross-check: a second-order finite-volume (ghost-node) scheme on node grids of n and 2n intervals, " +
	"each solved by a banded Cholesky factorisation, Richardson-extrapolated as (4 u_fine - u_coarse)/3 at the coarse nodes."
