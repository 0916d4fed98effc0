package spectral

// Method describes the method for a report's list of methods.
const Method = "Independent cross-check: a Legendre spectral Galerkin solution (one element, Gauss-Lobatto-Legendre nodes and " +
	"quadrature, the separable system solved by fast diagonalisation) on two numbers of nodes; their difference says how far it " +
	"resolves the problem itself."
