package project

import (
	"fmt"
	"strings"
)

// maxDigits is the longest run of digits a message shows in full.
const maxDigits = 20

// Shorten cuts every run of more than maxDigits digits in a message to its
// first digits and its length, so that a 5000-digit number in the input is
// never echoed back in full: "12345678...(5000 digits)". Every *Error
// prints through it, on the page and in the runner alike.
func Shorten(msg string) string {
	if !hasLongRun(msg) {
		return msg
	}
	var b strings.Builder
	for i := 0; i < len(msg); {
		j := i
		for j < len(msg) && msg[j] >= '0' && msg[j] <= '9' {
			j++
		}
		switch {
		case j-i > maxDigits:
			fmt.Fprintf(&b, "%s...(%d digits)", msg[i:i+8], j-i)
			i = j
		case j > i:
			b.WriteString(msg[i:j])
			i = j
		default:
			b.WriteByte(msg[i])
			i++
		}
	}
	return b.String()
}

func hasLongRun(msg string) bool {
	run := 0
	for i := 0; i < len(msg); i++ {
		if msg[i] >= '0' && msg[i] <= '9' {
			if run++; run > maxDigits {
				return true
			}
		} else {
			run = 0
		}
	}
	return false
}
