package export

import (
	"encoding/binary"
	"hash/adler32"
)

// storedPNG encodes an rw x rh RGBA image (8 bits per channel, rows from
// the top, pix holding 4*rw*rh bytes) as a PNG file (ISO/IEC 15948) whose
// zlib stream (RFC 1950) holds the rows in stored deflate blocks (RFC 1951,
// BTYPE 00): no compression, so none of the compression code goes into
// the WebAssembly engine. The SVG raster is small (a few hundred pixels a
// side at most), so the file stays small too.
func storedPNG(rw, rh int, pix []uint8) []byte {
	// the filtered image: each row starts with filter type 0 (none)
	raw := make([]byte, 0, rh*(1+4*rw))
	for y := 0; y < rh; y++ {
		raw = append(raw, 0)
		raw = append(raw, pix[4*rw*y:4*rw*(y+1)]...)
	}
	// zlib: header (deflate, 32K window, no dictionary, check bits), stored
	// blocks of at most 65535 bytes, Adler-32 of the data
	z := []byte{0x78, 0x01}
	for i := 0; ; {
		n := min(len(raw)-i, 65535)
		final := byte(0)
		if i+n == len(raw) {
			final = 1
		}
		z = append(z, final, byte(n), byte(n>>8), byte(^n), byte(^n>>8))
		z = append(z, raw[i:i+n]...)
		i += n
		if final == 1 {
			break
		}
	}
	z = binary.BigEndian.AppendUint32(z, adler32.Checksum(raw))

	out := []byte("\x89PNG\r\n\x1a\n")
	ihdr := make([]byte, 13)
	binary.BigEndian.PutUint32(ihdr[0:], uint32(rw))
	binary.BigEndian.PutUint32(ihdr[4:], uint32(rh))
	ihdr[8], ihdr[9] = 8, 6 // 8 bits per channel, RGBA; compression, filter, interlace 0
	out = chunk(out, "IHDR", ihdr)
	out = chunk(out, "IDAT", z)
	return chunk(out, "IEND", nil)
}

func chunk(out []byte, kind string, data []byte) []byte {
	out = binary.BigEndian.AppendUint32(out, uint32(len(data)))
	start := len(out)
	out = append(out, kind...)
	out = append(out, data...)
	return binary.BigEndian.AppendUint32(out, crcPNG(out[start:]))
}

// crcPNG is the CRC-32 of a PNG chunk (ISO/IEC 15948, annex D: the
// polynomial 0xedb88320 in reflected form, the register starting at and
// finally inverted with all ones), with a table made per call: the
// standard hash/crc32 builds its tables when the engine starts, which
// took 8 ms of every start in WebAssembly for a checksum that only an
// SVG download needs.
func crcPNG(b []byte) uint32 {
	var table [256]uint32
	for n := range table {
		c := uint32(n)
		for k := 0; k < 8; k++ {
			if c&1 != 0 {
				c = 0xedb88320 ^ c>>1
			} else {
				c >>= 1
			}
		}
		table[n] = c
	}
	c := ^uint32(0)
	for _, v := range b {
		c = table[byte(c)^v] ^ c>>8
	}
	return ^c
}
