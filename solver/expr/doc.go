// Package expr is the edge-formula language of edgewise: how a user writes
// a prescribed value, a flux profile or an ambient value that varies along
// an edge. It has a scanner (scan.go), a parser (parse.go) and a compiler to
// a small stack program (compile.go) that Eval runs without allocating.
//
// Compile once, evaluate many times:
//
//	e, err := expr.Compile("180 - 40*(2*s/W - 1)^2", "x", "y", "s", "W", "H")
//	v := e.Eval([]float64{x, y, s, W, H})
//
// # Grammar
//
// Lowest to highest binding; LANGUAGE.md lists every name with an example.
//
//	formula = expr EOF
//	expr    = sum { cmp sum }              comparisons chain: a < b <= c means a < b and b <= c;
//	                                       allowed only as the condition of when(...)
//	cmp     = "<" | "<=" | ">" | ">="
//	sum     = term { ("+" | "-") term }    left-associative: 1 - 2 - 3 = (1 - 2) - 3
//	term    = unary { ("*" | "/") unary }  left-associative: 8 / 4 / 2 = 1
//	unary   = ("-" | "+") unary | power    -2^2 = -(2^2) = -4;  2*-3 = -6
//	power   = primary [ "^" unary ]        right-associative: 2^3^2 = 2^9 = 512;  2^-1 = 0.5
//	primary = number | name | name "(" [ expr { "," expr } ] ")" | "(" expr ")"
//	number  = digits [ "." digits ] [ ("e" | "E") [ "+" | "-" ] digits ]   also ".5" and "5."
//	name    = letter { letter | digit | "_" }  (ASCII; case matters: W is not w)
//
// This is how mathematical notation reads: a power binds tighter than the
// minus sign in front of it (-x^2 is minus the square), a tower of powers is
// read from the top down, and a sign may follow an operator (2*-3, 2^-1).
// There is no implied multiplication: 2x and 2(x+1) are errors that say to
// write *.
//
// # Decimal commas
//
// A comma between two digits with no space (0,5) is always an error that says
// to write 0.5, even inside a call where it could separate two arguments:
// max(0,5) is rejected and max(0, 5) is accepted, so a formula typed with a
// decimal comma is never silently read as two numbers.
//
// # Values that are not numbers
//
// Evaluation follows IEEE 754 and the Go math package: sqrt(-1) is NaN and
// 1/0 is +Inf. Nothing in the language hides a NaN: a comparison with a NaN
// side makes the whole when(...) NaN rather than choosing a branch, and min,
// max, rise and readings return NaN for a NaN argument. The caller checks the
// values it gets and reports a non-finite one with the place on the edge.
//
// # Limits
//
// The source may be at most MaxLen bytes, nested at most MaxDepth levels
// deep (parentheses, calls, signs and powers each count), and the compiled
// program may hold at most 128 intermediate values. Beyond that Compile
// returns an error; it never panics on any input.
//
// # Errors
//
// Compile returns an *Error with the 1-based byte column of the problem,
// printing as `col 7: unknown name "sinn" (did you mean sinh?)`. Caret gives
// the source line and a caret line to show under it. The caller prefixes the
// field path: `edges.top.expr: col 7: ...`.
package expr
