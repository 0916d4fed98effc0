package export

import (
	"hash/crc32"
	"math/rand"
	"testing"
)

// The chunk checksum is the CRC-32 of ISO/IEC 15948 (annex D), which is
// the IEEE polynomial of the standard library's hash/crc32: the two agree
// on the empty input, on the classic check string and on random data.
func TestCRCPNGMatchesIEEE(t *testing.T) {
	// "123456789" -> 0xcbf43926 is the check value of CRC-32/ISO-HDLC in
	// the published catalogues of CRC parameters (from memory; the
	// comparison with hash/crc32 below does not rest on it)
	if got := crcPNG([]byte("123456789")); got != 0xcbf43926 {
		t.Errorf("crcPNG(123456789) = %#x, want 0xcbf43926", got)
	}
	rng := rand.New(rand.NewSource(7))
	for _, n := range []int{0, 1, 2, 13, 255, 256, 4099} {
		b := make([]byte, n)
		rng.Read(b)
		if got, want := crcPNG(b), crc32.ChecksumIEEE(b); got != want {
			t.Errorf("%d bytes: crcPNG %#x, hash/crc32 %#x", n, got, want)
		}
	}
	// and the IEND chunk every PNG ends with has the well-known checksum
	// ae 42 60 82 (its bytes are in every PNG file)
	if got := crcPNG([]byte("IEND")); got != 0xae426082 {
		t.Errorf("crcPNG(IEND) = %#x, want 0xae426082", got)
	}
}
