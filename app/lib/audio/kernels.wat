;; The sample hot loops of the WAV reader, in WebAssembly SIMD. simd.ts copies a slice of sample
;; bytes to DATA_AT (64) in this memory, padded with zero bytes to the loop's stride (a zero
;; sample changes no extreme and is never at full scale), calls one function, and reads its
;; answer from the first 64 bytes. After editing, run `npm run wasm` to rebuild kernels.wasm.ts;
;; a test fails while the two differ.
;;
;; Answer layout: bytes 0–15 smallest lanes, 16–31 largest lanes, 32–47 full-scale counts,
;; 48–63 float peak bits.
(module
  (memory (export "mem") 9)

  ;; 16-bit PCM, 64 bytes per turn: smallest and largest sample, eight lanes, two accumulators
  ;; each so consecutive loads do not wait on one another.
  (func (export "minmax16") (param $p i32) (param $end i32)
    (local $lo0 v128) (local $hi0 v128) (local $lo1 v128) (local $hi1 v128) (local $v v128) (local $w v128)
    (block
      (loop
        (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $v (v128.load (local.get $p)))
        (local.set $w (v128.load offset=16 (local.get $p)))
        (local.set $lo0 (i16x8.min_s (local.get $lo0) (local.get $v)))
        (local.set $hi0 (i16x8.max_s (local.get $hi0) (local.get $v)))
        (local.set $lo1 (i16x8.min_s (local.get $lo1) (local.get $w)))
        (local.set $hi1 (i16x8.max_s (local.get $hi1) (local.get $w)))
        (local.set $v (v128.load offset=32 (local.get $p)))
        (local.set $w (v128.load offset=48 (local.get $p)))
        (local.set $lo0 (i16x8.min_s (local.get $lo0) (local.get $v)))
        (local.set $hi0 (i16x8.max_s (local.get $hi0) (local.get $v)))
        (local.set $lo1 (i16x8.min_s (local.get $lo1) (local.get $w)))
        (local.set $hi1 (i16x8.max_s (local.get $hi1) (local.get $w)))
        (local.set $p (i32.add (local.get $p) (i32.const 64)))
        (br 0)))
    (v128.store (i32.const 0) (i16x8.min_s (local.get $lo0) (local.get $lo1)))
    (v128.store (i32.const 16) (i16x8.max_s (local.get $hi0) (local.get $hi1))))

  ;; 16-bit PCM, 16 bytes per turn: how many samples sit at either extreme. Only called on a
  ;; slice whose extremes reached full scale. A lane equal to an extreme compares as all ones
  ;; (-1), so subtracting the comparison counts one; a lane sees at most one per turn, and a
  ;; call covers at most 32,752 turns, so the i16 counters cannot wrap.
  (func (export "clip16") (param $p i32) (param $end i32)
    (local $n v128) (local $v v128) (local $top v128) (local $bot v128)
    (local.set $top (i16x8.splat (i32.const 32767)))
    (local.set $bot (i16x8.splat (i32.const -32768)))
    (block
      (loop
        (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $v (v128.load (local.get $p)))
        (local.set $n
          (i16x8.sub (local.get $n)
            (v128.or (i16x8.eq (local.get $v) (local.get $top)) (i16x8.eq (local.get $v) (local.get $bot)))))
        (local.set $p (i32.add (local.get $p) (i32.const 16)))
        (br 0)))
    (v128.store (i32.const 32) (local.get $n)))

  ;; 24-bit PCM, 24 bytes (eight samples) per turn: each 12 bytes are spread into four 32-bit
  ;; lanes by a constant shuffle (lane k takes a zero byte, then the sample's three bytes) and
  ;; sign-extended by an arithmetic shift of 8. The second load reads four bytes past its group;
  ;; the shuffle ignores them.
  (func (export "minmax24") (param $p i32) (param $end i32)
    (local $lo0 v128) (local $hi0 v128) (local $lo1 v128) (local $hi1 v128) (local $v v128) (local $w v128) (local $zero v128)
    (block
      (loop
        (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $v
          (i32x4.shr_s
            (i8x16.shuffle 16 0 1 2 16 3 4 5 16 6 7 8 16 9 10 11 (v128.load (local.get $p)) (local.get $zero))
            (i32.const 8)))
        (local.set $w
          (i32x4.shr_s
            (i8x16.shuffle 16 0 1 2 16 3 4 5 16 6 7 8 16 9 10 11 (v128.load offset=12 (local.get $p)) (local.get $zero))
            (i32.const 8)))
        (local.set $lo0 (i32x4.min_s (local.get $lo0) (local.get $v)))
        (local.set $hi0 (i32x4.max_s (local.get $hi0) (local.get $v)))
        (local.set $lo1 (i32x4.min_s (local.get $lo1) (local.get $w)))
        (local.set $hi1 (i32x4.max_s (local.get $hi1) (local.get $w)))
        (local.set $p (i32.add (local.get $p) (i32.const 24)))
        (br 0)))
    (v128.store (i32.const 0) (i32x4.min_s (local.get $lo0) (local.get $lo1)))
    (v128.store (i32.const 16) (i32x4.max_s (local.get $hi0) (local.get $hi1))))

  ;; 24-bit PCM, 12 bytes per turn: samples at either extreme, in i32 counters.
  (func (export "clip24") (param $p i32) (param $end i32)
    (local $n v128) (local $v v128) (local $top v128) (local $bot v128) (local $zero v128)
    (local.set $top (i32x4.splat (i32.const 8388607)))
    (local.set $bot (i32x4.splat (i32.const -8388608)))
    (block
      (loop
        (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $v
          (i32x4.shr_s
            (i8x16.shuffle 16 0 1 2 16 3 4 5 16 6 7 8 16 9 10 11 (v128.load (local.get $p)) (local.get $zero))
            (i32.const 8)))
        (local.set $n
          (i32x4.sub (local.get $n)
            (v128.or (i32x4.eq (local.get $v) (local.get $top)) (i32x4.eq (local.get $v) (local.get $bot)))))
        (local.set $p (i32.add (local.get $p) (i32.const 12)))
        (br 0)))
    (v128.store (i32.const 32) (local.get $n)))

  ;; 32-bit float, 64 bytes per turn: the largest |sample| as its bit pattern. Clearing the sign
  ;; bit gives |x|, and for non-negative IEEE 754 singles the bit patterns order as the values
  ;; do, so an unsigned integer maximum finds the peak; infinities (0x7f800000) and NaNs (above
  ;; it) come out on top, where the caller sees them.
  (func (export "peak32") (param $p i32) (param $end i32)
    (local $a0 v128) (local $a1 v128) (local $mask v128)
    (local.set $mask (i32x4.splat (i32.const 0x7fffffff)))
    (block
      (loop
        (br_if 1 (i32.ge_u (local.get $p) (local.get $end)))
        (local.set $a0 (i32x4.max_u (local.get $a0) (v128.and (v128.load (local.get $p)) (local.get $mask))))
        (local.set $a1 (i32x4.max_u (local.get $a1) (v128.and (v128.load offset=16 (local.get $p)) (local.get $mask))))
        (local.set $a0 (i32x4.max_u (local.get $a0) (v128.and (v128.load offset=32 (local.get $p)) (local.get $mask))))
        (local.set $a1 (i32x4.max_u (local.get $a1) (v128.and (v128.load offset=48 (local.get $p)) (local.get $mask))))
        (local.set $p (i32.add (local.get $p) (i32.const 64)))
        (br 0)))
    (v128.store (i32.const 48) (i32x4.max_u (local.get $a0) (local.get $a1)))))
