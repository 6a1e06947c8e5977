;; The 8-bit cell quantiser of lib/lab/srgb.ts (quantiseCells) as a scalar loop: the JS loop's bounds
;; checks and three dependent typed-array reads cost ~4 ns a value, a third of a 1024-px proxy
;; render. Built into quant8.wasm by `npm run wasm`; driven by lib/lab/simd.ts (quantise8InPlace).
;;
;; f(src, end, dst, cells, edges, lowBits, count): for each float's bits b at src .. end
;;   t = (b − lowBits) >> 15, 0 when outside the table; k = cells[t];
;;   v = k + ((edges[k] − b − 1) >>> 31); 0 below lowBits; >= 1.0: 255; NaN: 0. One byte to dst.
;; dst may equal src: byte i is written after float i is read, and later floats lie beyond it.
(module
  (import "e" "m" (memory 1))

  (func (export "f") (param $src i32) (param $end i32) (param $dst i32) (param $cells i32) (param $edges i32)
    (param $low i32) (param $count i32)
    (local $b i32) (local $t i32) (local $k i32) (local $v i32)
    (block $done (loop $next
      (br_if $done (i32.ge_u (local.get $src) (local.get $end)))
      (local.set $b (i32.load (local.get $src)))
      (local.set $t (i32.shr_s (i32.sub (local.get $b) (local.get $low)) (i32.const 15)))
      (local.set $t (select (local.get $t) (i32.const 0) (i32.lt_u (local.get $t) (local.get $count))))
      (local.set $k (i32.load8_u (i32.add (local.get $cells) (local.get $t))))
      ;; x >= edge as integers on the bits (both positive): one past the cell's first code
      (local.set $v (i32.add (local.get $k)
        (i32.shr_u
          (i32.sub (i32.sub (i32.load (i32.add (local.get $edges) (i32.shl (local.get $k) (i32.const 2)))) (local.get $b)) (i32.const 1))
          (i32.const 31))))
      (local.set $v (select (i32.const 0) (local.get $v) (i32.lt_s (local.get $b) (local.get $low))))
      ;; 1.0 and above: 255; NaN (bits above +∞'s): 0
      (local.set $v (select
        (select (i32.const 0) (i32.const 255) (i32.gt_s (local.get $b) (i32.const 0x7f800000)))
        (local.get $v)
        (i32.ge_s (local.get $b) (i32.const 0x3f800000))))
      (i32.store8 (local.get $dst) (local.get $v))
      (local.set $dst (i32.add (local.get $dst) (i32.const 1)))
      (local.set $src (i32.add (local.get $src) (i32.const 4)))
      (br $next))))
)
