;; unpack: the offline file's engine from its text, in the worker.
;;
;; The file holds the engine gzip-compressed (RFC 1952, deflate RFC 1951)
;; and written in base 85 (base85.go). The script around this module
;; (unpack.go) copies the text into memory at 16384 and calls
;;   init()                      the tables below
;;   dec85(p, end, o) -> o'      base-85 groups of 5 characters at [p, end)
;;                               to 4 bytes each at o (o <= p: in place);
;;                               -1 for a character outside the alphabet
;;                               or a group past 32 bits
;;   inflate(src, dst) -> end    the deflate stream at src to dst; -1 for a
;;                               stream that breaks the format
;;   consumed() -> p             where the stream ended (the gzip trailer)
;;   crc(c, p, end) -> c'        CRC-32 over [p, end), carried from c
;;                               (start with -1, invert at the end)
;; The browser's own DecompressionStream took 125-270 ms for the engine on
;; a 2-core machine (the stream hands its output over in many small
;; pieces); this takes a fraction of that. The loops that run long are in
;; functions called again and again (codes per deflate block; dec85 and
;; crc per slice from the script): the browser optimizes a WebAssembly
;; function only for its next call.
;;
;; In codes, the bit buffer (32 bits) is refilled by one 4-byte read: it
;; takes the whole bytes that fit and leaves 24 to 31 bits in it (the
;; bits above them are the next byte's first bits again, so a later read
;; of that byte ORs in the same bits).
;;
;; Huffman codes are decoded by a table of the next 10 bits (a symbol with
;; a code of up to 10 bits in one look) and else bit by bit over the counts
;; of codes of each length, as in the canonical decoding of RFC 1951 3.2.2.
;;
;; Memory (bytes):
;;      0  ORDER   the order of the code-length code lengths (19 bytes)
;;     32  ALPHA   the base-85 alphabet (85 bytes; alphabet85 in base85.go)
;;    128  VAL85   the digit of each ASCII character, 255 if none (128)
;;    256  LBASE   length base of codes 257..285 (i32 x 29)
;;    384  LEXT    their extra bits (i32 x 29)
;;    512  DBASE   distance base of codes 0..29 (i32 x 30)
;;    640  DEXT    their extra bits (i32 x 30)
;;    768  LENS    code lengths being read (320 bytes)
;;   2304  LIT     the literal/length code, 5120 DIST the distance code, each
;;                 T+0 count[16] (i32), T+64 offs[16] (i32),
;;                 T+128 symbol[288] (i16, by length then value),
;;                 T+768 fast[1024] (i16: symbol<<4 | length, 0 if longer)
;;   8192  CRCT    CRC-32 tables for 4 bytes at a time (4 x i32 x 256)
;;  16384  the text, then the output
(module
  (memory (export "mem") 1)
  (data (i32.const 0) "\10\11\12\00\08\07\09\06\0a\05\0b\04\0c\03\0d\02\0e\01\0f")
  (data (i32.const 32) "!#$%()*+,.0123456789:;=?@ABCDEFGHIJKLMNOPQRSTUVWXYZ[]^_abcdefghijklmnopqrstuvwxyz{|}~")
  (global $in (mut i32) (i32.const 0))
  (global $out (mut i32) (i32.const 0))
  (global $dst0 (mut i32) (i32.const 0))
  (global $bb (mut i32) (i32.const 0))
  (global $bc (mut i32) (i32.const 0))

  ;; init fills the base-85 digits, the length and distance tables of RFC
  ;; 1951 3.2.5 and the CRC-32 table (polynomial 0xEDB88320, reflected).
  (func $init (export "init")
    (local $i i32) (local $base i32) (local $extra i32) (local $c i32) (local $k i32)
    ;; VAL85
    i32.const 0 local.set $i
    loop $clear
      local.get $i i32.const 255 i32.store8 offset=128
      local.get $i i32.const 1 i32.add local.tee $i
      i32.const 128 i32.lt_u br_if $clear
    end
    i32.const 0 local.set $i
    loop $digit
      local.get $i i32.load8_u offset=32 local.get $i i32.store8 offset=128
      local.get $i i32.const 1 i32.add local.tee $i
      i32.const 85 i32.lt_u br_if $digit
    end
    ;; lengths: 8 codes of 0 extra bits, then 4 codes for each of 1..5
    i32.const 0 local.set $i
    i32.const 3 local.set $base
    loop $len
      i32.const 0 local.set $extra
      local.get $i i32.const 8 i32.ge_u
      if
        local.get $i i32.const 2 i32.shr_u i32.const 1 i32.sub local.set $extra
      end
      local.get $i i32.const 2 i32.shl local.get $base i32.store offset=256
      local.get $i i32.const 2 i32.shl local.get $extra i32.store offset=384
      local.get $base i32.const 1 local.get $extra i32.shl i32.add local.set $base
      local.get $i i32.const 1 i32.add local.tee $i
      i32.const 28 i32.lt_u br_if $len
    end
    ;; code 285: 258, no extra bits
    i32.const 112 i32.const 258 i32.store offset=256
    i32.const 112 i32.const 0 i32.store offset=384
    ;; distances: 4 codes of 0 extra bits, then 2 codes for each of 1..13
    i32.const 0 local.set $i
    i32.const 1 local.set $base
    loop $dist
      i32.const 0 local.set $extra
      local.get $i i32.const 4 i32.ge_u
      if
        local.get $i i32.const 1 i32.shr_u i32.const 1 i32.sub local.set $extra
      end
      local.get $i i32.const 2 i32.shl local.get $base i32.store offset=512
      local.get $i i32.const 2 i32.shl local.get $extra i32.store offset=640
      local.get $base i32.const 1 local.get $extra i32.shl i32.add local.set $base
      local.get $i i32.const 1 i32.add local.tee $i
      i32.const 30 i32.lt_u br_if $dist
    end
    ;; CRC-32
    i32.const 0 local.set $i
    loop $crc
      local.get $i local.set $c
      i32.const 8 local.set $k
      loop $bit
        local.get $c i32.const 1 i32.shr_u
        i32.const 0 local.get $c i32.const 1 i32.and i32.sub i32.const 0xedb88320 i32.and
        i32.xor local.set $c
        local.get $k i32.const 1 i32.sub local.tee $k br_if $bit
      end
      local.get $i i32.const 2 i32.shl local.get $c i32.store offset=8192
      local.get $i i32.const 1 i32.add local.tee $i
      i32.const 256 i32.lt_u br_if $crc
    end
    ;; table k: the register's change over k more zero bytes
    i32.const 0 local.set $i
    loop $slice
      local.get $i i32.load offset=8192 local.set $c
      local.get $i local.set $k
      loop $more
        local.get $c i32.const 8 i32.shr_u
        local.get $c i32.const 255 i32.and i32.const 2 i32.shl i32.load offset=8192
        i32.xor local.set $c
        local.get $k i32.const 1024 i32.add local.tee $k
        local.get $c i32.store offset=8192
        local.get $k i32.const 3072 i32.lt_u br_if $more
      end
      local.get $i i32.const 4 i32.add local.tee $i
      i32.const 1024 i32.lt_u br_if $slice
    end
  )

  ;; dec85 decodes the groups of 5 characters in [p, end) (end - p a
  ;; multiple of 5), most significant digit first, to 4 bytes each,
  ;; big-endian, from o on.
  (func $dec85 (export "dec85") (param $p i32) (param $end i32) (param $o i32) (result i32)
    (local $v i64) (local $k i32) (local $c i32) (local $bad i32) (local $w i32)
    block $done
      loop $group
        local.get $p local.get $end i32.ge_u br_if $done
        i64.const 0 local.set $v
        i32.const 0 local.set $k
        loop $digit
          ;; a byte past ASCII reads as 128 or more: not a digit
          local.get $p local.get $k i32.add i32.load8_u local.tee $c
          i32.const 127 i32.and i32.load8_u offset=128
          local.get $c i32.const 128 i32.and i32.or local.set $c
          local.get $bad local.get $c i32.const 85 i32.ge_u i32.or local.set $bad
          local.get $v i64.const 85 i64.mul local.get $c i64.extend_i32_u i64.add local.set $v
          local.get $k i32.const 1 i32.add local.tee $k
          i32.const 5 i32.lt_u br_if $digit
        end
        local.get $bad local.get $v i64.const 32 i64.shr_u i64.eqz i32.eqz i32.or local.set $bad
        local.get $v i32.wrap_i64 local.set $w
        local.get $o local.get $w i32.const 24 i32.shr_u i32.store8
        local.get $o local.get $w i32.const 16 i32.shr_u i32.store8 offset=1
        local.get $o local.get $w i32.const 8 i32.shr_u i32.store8 offset=2
        local.get $o local.get $w i32.store8 offset=3
        local.get $o i32.const 4 i32.add local.set $o
        local.get $p i32.const 5 i32.add local.set $p
        br $group
      end
    end
    local.get $bad
    if
      i32.const -1 return
    end
    local.get $o
  )

  ;; crc carries the CRC-32 register c over the bytes in [p, end): 4
  ;; bytes at a time with the 4 tables, then byte by byte.
  (func $crc (export "crc") (param $c i32) (param $p i32) (param $end i32) (result i32)
    block $quads
      loop $quad
        local.get $p i32.const 4 i32.add local.get $end i32.gt_u br_if $quads
        local.get $c local.get $p i32.load align=1 i32.xor local.set $c
        local.get $c i32.const 255 i32.and i32.const 2 i32.shl i32.load offset=11264
        local.get $c i32.const 6 i32.shr_u i32.const 1020 i32.and i32.load offset=10240 i32.xor
        local.get $c i32.const 14 i32.shr_u i32.const 1020 i32.and i32.load offset=9216 i32.xor
        local.get $c i32.const 24 i32.shr_u i32.const 2 i32.shl i32.load offset=8192 i32.xor
        local.set $c
        local.get $p i32.const 4 i32.add local.set $p
        br $quad
      end
    end
    block $done
      loop $byte
        local.get $p local.get $end i32.ge_u br_if $done
        local.get $c local.get $p i32.load8_u i32.xor i32.const 255 i32.and
        i32.const 2 i32.shl i32.load offset=8192
        local.get $c i32.const 8 i32.shr_u i32.xor local.set $c
        local.get $p i32.const 1 i32.add local.set $p
        br $byte
      end
    end
    local.get $c
  )

  ;; need reads whole bytes into the bit buffer until it holds n bits
  ;; (n <= 24). Past the input it reads what follows, which only a broken
  ;; stream ever uses; the script's checks refuse that.
  (func $need (param $n i32)
    block $done
      loop $fill
        global.get $bc local.get $n i32.ge_u br_if $done
        global.get $bb global.get $in i32.load8_u global.get $bc i32.shl i32.or global.set $bb
        global.get $in i32.const 1 i32.add global.set $in
        global.get $bc i32.const 8 i32.add global.set $bc
        br $fill
      end
    end
  )

  ;; bits takes the next n bits (n <= 16), the first one lowest.
  (func $bits (param $n i32) (result i32)
    (local $v i32)
    local.get $n call $need
    global.get $bb i32.const 1 local.get $n i32.shl i32.const 1 i32.sub i32.and local.set $v
    global.get $bb local.get $n i32.shr_u global.set $bb
    global.get $bc local.get $n i32.sub global.set $bc
    local.get $v
  )

  ;; decode finds the symbol whose code begins the bits bb (15 of them at
  ;; least) in the code at t: symbol<<4 | its code's length, -1 if none.
  (func $decode (param $t i32) (param $bb i32) (result i32)
    (local $e i32) (local $code i32) (local $first i32) (local $index i32) (local $count i32) (local $len i32)
    local.get $t local.get $bb i32.const 1023 i32.and i32.const 1 i32.shl i32.add
    i32.load16_u offset=768 local.tee $e
    if
      local.get $e return
    end
    ;; code: the bits so far, first: the first code of this length,
    ;; index: the number of symbols of shorter codes
    i32.const 1 local.set $len
    loop $bit
      local.get $code local.get $bb i32.const 1 i32.and i32.or local.set $code
      local.get $bb i32.const 1 i32.shr_u local.set $bb
      local.get $t local.get $len i32.const 2 i32.shl i32.add i32.load local.set $count
      local.get $code local.get $first local.get $count i32.add i32.lt_s
      if
        local.get $t local.get $index local.get $code i32.add local.get $first i32.sub
        i32.const 1 i32.shl i32.add i32.load16_u offset=128
        i32.const 4 i32.shl local.get $len i32.or return
      end
      local.get $index local.get $count i32.add local.set $index
      local.get $first local.get $count i32.add i32.const 1 i32.shl local.set $first
      local.get $code i32.const 1 i32.shl local.set $code
      local.get $len i32.const 1 i32.add local.tee $len
      i32.const 16 i32.lt_u br_if $bit
    end
    i32.const -1
  )

  ;; build makes the code at t from the n code lengths at lens (RFC 1951
  ;; 3.2.2: shorter codes first, and within a length in symbol order).
  (func $build (param $lens i32) (param $n i32) (param $t i32)
    (local $i i32) (local $len i32) (local $o i32) (local $code i32) (local $left i32) (local $rev i32) (local $c i32) (local $k i32) (local $e i32)
    ;; count[0..15] = 0
    i32.const 0 local.set $i
    loop $zero
      local.get $t local.get $i i32.const 2 i32.shl i32.add i32.const 0 i32.store
      local.get $i i32.const 1 i32.add local.tee $i
      i32.const 16 i32.lt_u br_if $zero
    end
    ;; count the lengths
    i32.const 0 local.set $i
    block $counted
      loop $count
        local.get $i local.get $n i32.ge_u br_if $counted
        local.get $t local.get $lens local.get $i i32.add i32.load8_u i32.const 2 i32.shl i32.add local.tee $o
        local.get $o i32.load i32.const 1 i32.add i32.store
        local.get $i i32.const 1 i32.add local.set $i
        br $count
      end
    end
    ;; offs[len]: where the symbols of that length begin
    local.get $t i32.const 0 i32.store offset=68
    i32.const 1 local.set $len
    loop $offs
      local.get $t local.get $len i32.const 2 i32.shl i32.add local.tee $o
      local.get $o i32.load offset=64 local.get $o i32.load i32.add i32.store offset=68
      local.get $len i32.const 1 i32.add local.tee $len
      i32.const 15 i32.lt_u br_if $offs
    end
    ;; the symbols by length
    i32.const 0 local.set $i
    block $sorted
      loop $sort
        local.get $i local.get $n i32.ge_u br_if $sorted
        local.get $lens local.get $i i32.add i32.load8_u local.tee $len
        if
          local.get $t local.get $len i32.const 2 i32.shl i32.add local.tee $o i32.load offset=64 local.set $k
          local.get $o local.get $k i32.const 1 i32.add i32.store offset=64
          local.get $t local.get $k i32.const 1 i32.shl i32.add local.get $i i32.store16 offset=128
        end
        local.get $i i32.const 1 i32.add local.set $i
        br $sort
      end
    end
    ;; fast[] = 0
    i32.const 0 local.set $i
    loop $clear
      local.get $t local.get $i i32.add i32.const 0 i32.store offset=768
      local.get $i i32.const 4 i32.add local.tee $i
      i32.const 2048 i32.lt_u br_if $clear
    end
    ;; the codes of up to 10 bits: every 10-bit pattern that begins with a
    ;; code (read first bit first, so reversed) gives its symbol at once
    i32.const 0 local.set $i
    i32.const 0 local.set $code
    i32.const 1 local.set $len
    loop $length
      local.get $t local.get $len i32.const 2 i32.shl i32.add i32.load local.set $left
      block $lengthDone
        loop $symbol
          local.get $left i32.eqz br_if $lengthDone
          ;; rev = the len bits of code, reversed
          i32.const 0 local.set $rev
          local.get $code local.set $c
          local.get $len local.set $k
          loop $reverse
            local.get $rev i32.const 1 i32.shl local.get $c i32.const 1 i32.and i32.or local.set $rev
            local.get $c i32.const 1 i32.shr_u local.set $c
            local.get $k i32.const 1 i32.sub local.tee $k br_if $reverse
          end
          local.get $t local.get $i i32.const 1 i32.shl i32.add i32.load16_u offset=128
          i32.const 4 i32.shl local.get $len i32.or local.set $e
          loop $fill
            local.get $t local.get $rev i32.const 1 i32.shl i32.add local.get $e i32.store16 offset=768
            local.get $rev i32.const 1 local.get $len i32.shl i32.add local.tee $rev
            i32.const 1024 i32.lt_u br_if $fill
          end
          local.get $i i32.const 1 i32.add local.set $i
          local.get $code i32.const 1 i32.add local.set $code
          local.get $left i32.const 1 i32.sub local.set $left
          br $symbol
        end
      end
      local.get $code i32.const 1 i32.shl local.set $code
      local.get $len i32.const 1 i32.add local.tee $len
      i32.const 11 i32.lt_u br_if $length
    end
  )

  ;; codes copies out one block's literals and matches (RFC 1951 3.2.5)
  ;; with the codes at 2304 and 5120, up to the end-of-block symbol: 0, or
  ;; 1 for a broken stream.
  (func $codes (result i32)
    (local $in i32) (local $out i32) (local $bb i32) (local $bc i32) (local $lo i32)
    (local $e i32) (local $sym i32) (local $n i32) (local $len i32) (local $dist i32) (local $from i32)
    global.get $in local.set $in
    global.get $out local.set $out
    global.get $bb local.set $bb
    global.get $bc local.set $bc
    global.get $dst0 local.set $lo
    block $fail
      block $done
        loop $next
          ;; 24 bits at least in the buffer (refill): a literal/length
          ;; code takes 15 at most
          local.get $bb local.get $in i32.load align=1 local.get $bc i32.shl i32.or local.set $bb
          local.get $in i32.const 3 local.get $bc i32.const 3 i32.shr_u i32.sub i32.add local.set $in
          local.get $bc i32.const 24 i32.or local.set $bc
          ;; the 10-bit table here, the rest in decode
          local.get $bb i32.const 1023 i32.and i32.const 1 i32.shl i32.load16_u offset=3072
          local.tee $e i32.eqz
          if
            i32.const 2304 local.get $bb call $decode local.set $e
          end
          local.get $e i32.const 0 i32.lt_s br_if $fail
          local.get $bb local.get $e i32.const 15 i32.and local.tee $n i32.shr_u local.set $bb
          local.get $bc local.get $n i32.sub local.set $bc
          local.get $e i32.const 4 i32.shr_u local.tee $sym
          i32.const 256 i32.lt_u
          if
            local.get $out local.get $sym i32.store8
            local.get $out i32.const 1 i32.add local.set $out
            br $next
          end
          local.get $sym i32.const 256 i32.eq br_if $done
          ;; a length: its base and up to 5 extra bits, after a refill
          ;; (the distance's code, 15 bits at most, is in the same 24)
          local.get $sym i32.const 257 i32.sub local.tee $sym
          i32.const 29 i32.ge_u br_if $fail
          local.get $bb local.get $in i32.load align=1 local.get $bc i32.shl i32.or local.set $bb
          local.get $in i32.const 3 local.get $bc i32.const 3 i32.shr_u i32.sub i32.add local.set $in
          local.get $bc i32.const 24 i32.or local.set $bc
          local.get $sym i32.const 2 i32.shl local.tee $sym i32.load offset=384 local.set $n
          local.get $sym i32.load offset=256
          local.get $bb i32.const 1 local.get $n i32.shl i32.const 1 i32.sub i32.and i32.add local.set $len
          local.get $bb local.get $n i32.shr_u local.set $bb
          local.get $bc local.get $n i32.sub local.set $bc
          ;; the distance's code
          local.get $bb i32.const 1023 i32.and i32.const 1 i32.shl i32.load16_u offset=5888
          local.tee $e i32.eqz
          if
            i32.const 5120 local.get $bb call $decode local.set $e
          end
          local.get $e i32.const 0 i32.lt_s br_if $fail
          local.get $bb local.get $e i32.const 15 i32.and local.tee $n i32.shr_u local.set $bb
          local.get $bc local.get $n i32.sub local.set $bc
          local.get $e i32.const 4 i32.shr_u local.tee $sym
          i32.const 30 i32.ge_u br_if $fail
          ;; and, after a refill, up to 13 extra bits
          local.get $bb local.get $in i32.load align=1 local.get $bc i32.shl i32.or local.set $bb
          local.get $in i32.const 3 local.get $bc i32.const 3 i32.shr_u i32.sub i32.add local.set $in
          local.get $bc i32.const 24 i32.or local.set $bc
          local.get $sym i32.const 2 i32.shl local.tee $sym i32.load offset=640 local.set $n
          local.get $sym i32.load offset=512
          local.get $bb i32.const 1 local.get $n i32.shl i32.const 1 i32.sub i32.and i32.add local.set $dist
          local.get $bb local.get $n i32.shr_u local.set $bb
          local.get $bc local.get $n i32.sub local.set $bc
          ;; no further back than the output's start
          local.get $dist local.get $out local.get $lo i32.sub i32.gt_u br_if $fail
          local.get $out local.get $dist i32.sub local.set $from
          local.get $dist i32.const 4 i32.ge_u
          if
            ;; 4 bytes at a time, all of them written already; up to 3
            ;; bytes past the match, which what follows writes over
            loop $quad
              local.get $out local.get $from i32.load align=1 i32.store align=1
              local.get $out i32.const 4 i32.add local.set $out
              local.get $from i32.const 4 i32.add local.set $from
              local.get $len i32.const 4 i32.sub local.tee $len
              i32.const 0 i32.gt_s br_if $quad
            end
            local.get $out local.get $len i32.add local.set $out
          else
            loop $byte
              local.get $out local.get $from i32.load8_u i32.store8
              local.get $out i32.const 1 i32.add local.set $out
              local.get $from i32.const 1 i32.add local.set $from
              local.get $len i32.const 1 i32.sub local.tee $len
              br_if $byte
            end
          end
          br $next
        end
      end
      local.get $in global.set $in
      local.get $out global.set $out
      local.get $bb global.set $bb
      local.get $bc global.set $bc
      i32.const 0 return
    end
    i32.const 1
  )

  ;; fill sets the bytes in [p, end) to v.
  (func $fill (param $p i32) (param $end i32) (param $v i32)
    block $done
      loop $byte
        local.get $p local.get $end i32.ge_u br_if $done
        local.get $p local.get $v i32.store8
        local.get $p i32.const 1 i32.add local.set $p
        br $byte
      end
    end
  )

  ;; stored copies a stored block (RFC 1951 3.2.4): 0, or 1 if broken.
  (func $stored (result i32)
    (local $in i32) (local $len i32) (local $out i32)
    ;; the rest of the byte is padding; the whole bytes read ahead are
    ;; given back
    global.get $in global.get $bc i32.const 3 i32.shr_u i32.sub local.tee $in
    i32.load16_u local.set $len
    i32.const 0 global.set $bb
    i32.const 0 global.set $bc
    local.get $in i32.load16_u offset=2 local.get $len i32.const 0xffff i32.xor i32.ne
    if
      i32.const 1 return
    end
    local.get $in i32.const 4 i32.add local.set $in
    global.get $out local.set $out
    block $done
      loop $byte
        local.get $len i32.eqz br_if $done
        local.get $out local.get $in i32.load8_u i32.store8
        local.get $out i32.const 1 i32.add local.set $out
        local.get $in i32.const 1 i32.add local.set $in
        local.get $len i32.const 1 i32.sub local.set $len
        br $byte
      end
    end
    local.get $in global.set $in
    local.get $out global.set $out
    i32.const 0
  )

  ;; fixed reads a block with the fixed codes (RFC 1951 3.2.6).
  (func $fixed (result i32)
    i32.const 768 i32.const 912 i32.const 8 call $fill
    i32.const 912 i32.const 1024 i32.const 9 call $fill
    i32.const 1024 i32.const 1048 i32.const 7 call $fill
    i32.const 1048 i32.const 1056 i32.const 8 call $fill
    i32.const 1056 i32.const 1086 i32.const 5 call $fill
    i32.const 768 i32.const 288 i32.const 2304 call $build
    i32.const 1056 i32.const 30 i32.const 5120 call $build
    call $codes
  )

  ;; dynamic reads a block's own codes (RFC 1951 3.2.7), then the block.
  (func $dynamic (result i32)
    (local $hlit i32) (local $n i32) (local $hclen i32) (local $i i32) (local $e i32) (local $sym i32) (local $rep i32) (local $prev i32)
    i32.const 5 call $bits i32.const 257 i32.add local.set $hlit
    i32.const 5 call $bits i32.const 1 i32.add local.get $hlit i32.add local.set $n
    i32.const 4 call $bits i32.const 4 i32.add local.set $hclen
    ;; the code-length code
    i32.const 768 i32.const 787 i32.const 0 call $fill
    i32.const 0 local.set $i
    loop $cl
      local.get $i i32.load8_u i32.const 3 call $bits i32.store8 offset=768
      local.get $i i32.const 1 i32.add local.tee $i
      local.get $hclen i32.lt_u br_if $cl
    end
    i32.const 768 i32.const 19 i32.const 2304 call $build
    ;; with it, the lengths of both codes
    i32.const 0 local.set $i
    block $read
      loop $length
        local.get $i local.get $n i32.ge_u br_if $read
        i32.const 15 call $need
        i32.const 2304 global.get $bb call $decode local.tee $e
        i32.const 0 i32.lt_s
        if
          i32.const 1 return
        end
        local.get $e i32.const 15 i32.and call $bits drop
        local.get $e i32.const 4 i32.shr_u local.tee $sym
        i32.const 16 i32.lt_u
        if
          local.get $i local.get $sym i32.store8 offset=768
          local.get $i i32.const 1 i32.add local.set $i
          br $length
        end
        i32.const 0 local.set $prev
        local.get $sym i32.const 16 i32.eq
        if
          ;; the previous length, 3 to 6 times
          local.get $i i32.eqz
          if
            i32.const 1 return
          end
          local.get $i i32.load8_u offset=767 local.set $prev
          i32.const 2 call $bits i32.const 3 i32.add local.set $rep
        else
          local.get $sym i32.const 17 i32.eq
          if
            ;; 3 to 10 zeros
            i32.const 3 call $bits i32.const 3 i32.add local.set $rep
          else
            ;; 11 to 138 zeros
            i32.const 7 call $bits i32.const 11 i32.add local.set $rep
          end
        end
        local.get $i local.get $rep i32.add local.get $n i32.gt_u
        if
          i32.const 1 return
        end
        local.get $i i32.const 768 i32.add
        local.get $i local.get $rep i32.add local.tee $i i32.const 768 i32.add
        local.get $prev call $fill
        br $length
      end
    end
    ;; a block must be able to end
    i32.const 1024 i32.load8_u i32.eqz
    if
      i32.const 1 return
    end
    i32.const 768 local.get $hlit i32.const 2304 call $build
    local.get $hlit i32.const 768 i32.add local.get $n local.get $hlit i32.sub i32.const 5120 call $build
    call $codes
  )

  ;; inflate writes the deflate stream at src to dst on: the output's end,
  ;; or -1 for a stream that breaks the format.
  (func $inflate (export "inflate") (param $src i32) (param $dst i32) (result i32)
    (local $final i32) (local $type i32) (local $e i32)
    local.get $src global.set $in
    local.get $dst global.set $out
    local.get $dst global.set $dst0
    i32.const 0 global.set $bb
    i32.const 0 global.set $bc
    block $fail
      loop $block
        i32.const 1 call $bits local.set $final
        i32.const 2 call $bits local.set $type
        local.get $type i32.const 3 i32.eq br_if $fail
        local.get $type i32.eqz
        if
          call $stored local.set $e
        else
          local.get $type i32.const 1 i32.eq
          if
            call $fixed local.set $e
          else
            call $dynamic local.set $e
          end
        end
        local.get $e br_if $fail
        local.get $final i32.eqz br_if $block
      end
      global.get $out return
    end
    i32.const -1
  )

  ;; consumed is where the stream read up to: the whole bytes read ahead
  ;; into the bit buffer are not part of it.
  (func $consumed (export "consumed") (result i32)
    global.get $in global.get $bc i32.const 3 i32.shr_u i32.sub
  )
)
