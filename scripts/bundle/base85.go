package main

// The engine is embedded as text (unpack.wat reads it back in the worker).
// Base64 takes 4 characters for 3 bytes; this base-85 form takes 5 for 4,
// which keeps the offline file about 6% smaller. Its alphabet is printable
// ASCII without the characters that mean something in HTML or in a script
// (" & ' < > \ `) and without - and /, so the text can never form
// "</script" or "<!--".
const alphabet85 = "!#$%()*+,.0123456789:;=?@ABCDEFGHIJKLMNOPQRSTUVWXYZ[]^_abcdefghijklmnopqrstuvwxyz{|}~"

// encode85 writes each group of 4 bytes (big-endian) as 5 base-85 digits,
// most significant first; a final group of k < 4 bytes is padded with zero
// bytes and written as its first k+1 digits.
func encode85(data []byte) string {
	out := make([]byte, 0, (len(data)+3)/4*5)
	for i := 0; i < len(data); i += 4 {
		var g [4]byte
		k := copy(g[:], data[i:])
		v := uint32(g[0])<<24 | uint32(g[1])<<16 | uint32(g[2])<<8 | uint32(g[3])
		var d [5]byte
		for j := 4; j >= 0; j-- {
			d[j] = alphabet85[v%85]
			v /= 85
		}
		out = append(out, d[:k+1]...)
	}
	return string(out)
}
