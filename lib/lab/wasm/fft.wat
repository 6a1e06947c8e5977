;; Rows of a float64 plane convolved with a symmetric kernel through the discrete Fourier transform,
;; for kernels too wide for the direct passes of gauss.wat (the cost per pixel grows with log M, not
;; with the radius). Built into fft.wasm by `npm run wasm`.
;;
;; Two real rows a, b travel as one complex row a + ib. Each row is padded to n = w + 2r values with
;; its end pixels repeated, then zeros up to M (a power of two, M >= n): a circular convolution of
;; length M then equals the linear one at every output the frame keeps. The kernel is symmetric, so
;; its spectrum is real and spectrum x (A + iB) transforms back to (kernel * a) + i(kernel * b).
;;
;; The forward transform runs by decimation in frequency (natural order in, bit-reversed out), the
;; inverse by decimation in time (bit-reversed in, natural out), so no permutation pass is needed;
;; the spectrum is kept in bit-reversed order too (from the same forward transform of the kernel).
;; The inverse is conj(FFT(conj(.))) / M, with 1/M folded into the spectrum.
;;
;; Both transforms pair radix-2 stages (radix 2^2): one pass over memory per two stages.
;; Twiddle table tw[j], j < M/2: four f64 [cos θ, cos θ, sin θ, -sin θ] for θ = 2πj/M, so that
;; x·e^(-iθ) = x·[c, c] + swap(x)·[s, -s].
(module
  (import "e" "m" (memory 1))

  ;; Calls are not inlined by every engine, so the complex multiply is written out each time:
  ;;   x·e^(-iθ) = x·[c, c] + swap(x)·[s, −s]        and x·(−i) = swap(x) xor [0, −0] = [im, −re]

  ;; One radix-2 stage of span 1 (twiddle 1): pairs (0,1), (2,3), ...
  (func $span1 (param $buf i32) (param $m i32)
    (local $p i32) (local $end i32) (local $a v128) (local $b v128)
    (local.set $p (local.get $buf))
    (local.set $end (i32.add (local.get $buf) (i32.shl (local.get $m) (i32.const 4))))
    (block $d (loop $l
      (br_if $d (i32.ge_u (local.get $p) (local.get $end)))
      (local.set $a (v128.load (local.get $p)))
      (local.set $b (v128.load offset=16 (local.get $p)))
      (v128.store (local.get $p) (f64x2.add (local.get $a) (local.get $b)))
      (v128.store offset=16 (local.get $p) (f64x2.sub (local.get $a) (local.get $b)))
      (local.set $p (i32.add (local.get $p) (i32.const 32)))
      (br $l))))

  ;; Forward transform (decimation in frequency), natural order in, bit-reversed order out.
  ;; Spans 2q and q together for q = M/4, M/16, ... > 1; the last pair (q = 1, all twiddles 1)
  ;; without multiplies; a single span-1 stage left over when log2 M is odd.
  (func $dif (export "dif") (param $buf i32) (param $m i32) (param $tw i32)
    (local $q i32) (local $qb i32) (local $end i32) (local $s i32) (local $p i32) (local $pe i32)
    (local $p1 i32) (local $p2 i32) (local $p3 i32)
    (local $stepT i32) (local $stepW i32) (local $pt i32) (local $pw i32)
    (local $tc v128) (local $ts v128) (local $wc v128) (local $ws v128) (local $neg1 v128)
    (local $x0 v128) (local $x1 v128) (local $x2 v128) (local $x3 v128)
    (local $y0 v128) (local $y1 v128) (local $y2 v128) (local $y3 v128) (local $t v128)
    (local.set $neg1 (v128.const i64x2 0 0x8000000000000000))
    (local.set $end (i32.add (local.get $buf) (i32.shl (local.get $m) (i32.const 4))))
    (local.set $q (i32.shr_u (local.get $m) (i32.const 2)))
    (block $qd (loop $ql
      (br_if $qd (i32.le_u (local.get $q) (i32.const 1)))
      (local.set $qb (i32.shl (local.get $q) (i32.const 4)))
      ;; T = e^(-2πi j / 4q): table step M/4q entries of 32 bytes; W = T²: twice that
      (local.set $stepT (i32.shl (i32.div_u (local.get $m) (i32.shl (local.get $q) (i32.const 2))) (i32.const 5)))
      (local.set $stepW (i32.shl (local.get $stepT) (i32.const 1)))
      (local.set $s (local.get $buf))
      (block $sd (loop $sl
        (br_if $sd (i32.ge_u (local.get $s) (local.get $end)))
        (local.set $p (local.get $s))
        (local.set $pe (i32.add (local.get $s) (local.get $qb)))
        (local.set $pt (local.get $tw))
        (local.set $pw (local.get $tw))
        (block $jd (loop $jl
          (br_if $jd (i32.ge_u (local.get $p) (local.get $pe)))
          (local.set $p1 (i32.add (local.get $p) (local.get $qb)))
          (local.set $p2 (i32.add (local.get $p1) (local.get $qb)))
          (local.set $p3 (i32.add (local.get $p2) (local.get $qb)))
          (local.set $tc (v128.load (local.get $pt)))
          (local.set $ts (v128.load offset=16 (local.get $pt)))
          (local.set $wc (v128.load (local.get $pw)))
          (local.set $ws (v128.load offset=16 (local.get $pw)))
          (local.set $x0 (v128.load (local.get $p)))
          (local.set $x1 (v128.load (local.get $p1)))
          (local.set $x2 (v128.load (local.get $p2)))
          (local.set $x3 (v128.load (local.get $p3)))
          ;; span 2q: (x0, x2) with T, (x1, x3) with T·(−i)
          (local.set $y0 (f64x2.add (local.get $x0) (local.get $x2)))
          (local.set $t (f64x2.sub (local.get $x0) (local.get $x2)))
          (local.set $y2 (f64x2.add
            (f64x2.mul (local.get $t) (local.get $tc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $ts))))
          (local.set $y1 (f64x2.add (local.get $x1) (local.get $x3)))
          (local.set $t (f64x2.sub (local.get $x1) (local.get $x3)))
          (local.set $t (f64x2.add
            (f64x2.mul (local.get $t) (local.get $tc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $ts))))
          (local.set $y3 (v128.xor (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $neg1)))
          ;; span q: (y0, y1), (y2, y3) with W
          (v128.store (local.get $p) (f64x2.add (local.get $y0) (local.get $y1)))
          (local.set $t (f64x2.sub (local.get $y0) (local.get $y1)))
          (v128.store (local.get $p1) (f64x2.add
            (f64x2.mul (local.get $t) (local.get $wc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $ws))))
          (v128.store (local.get $p2) (f64x2.add (local.get $y2) (local.get $y3)))
          (local.set $t (f64x2.sub (local.get $y2) (local.get $y3)))
          (v128.store (local.get $p3) (f64x2.add
            (f64x2.mul (local.get $t) (local.get $wc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $ws))))
          (local.set $p (i32.add (local.get $p) (i32.const 16)))
          (local.set $pt (i32.add (local.get $pt) (local.get $stepT)))
          (local.set $pw (i32.add (local.get $pw) (local.get $stepW)))
          (br $jl)))
        (local.set $s (i32.add (local.get $s) (i32.shl (local.get $qb) (i32.const 2))))
        (br $sl)))
      (local.set $q (i32.shr_u (local.get $q) (i32.const 2)))
      (br $ql)))
    (if (i32.eq (local.get $q) (i32.const 1))
      (then
        ;; q = 1: groups of four neighbours, every twiddle 1
        (local.set $p (local.get $buf))
        (block $d (loop $l
          (br_if $d (i32.ge_u (local.get $p) (local.get $end)))
          (local.set $x0 (v128.load (local.get $p)))
          (local.set $x1 (v128.load offset=16 (local.get $p)))
          (local.set $x2 (v128.load offset=32 (local.get $p)))
          (local.set $x3 (v128.load offset=48 (local.get $p)))
          (local.set $y0 (f64x2.add (local.get $x0) (local.get $x2)))
          (local.set $y2 (f64x2.sub (local.get $x0) (local.get $x2)))
          (local.set $y1 (f64x2.add (local.get $x1) (local.get $x3)))
          (local.set $t (f64x2.sub (local.get $x1) (local.get $x3)))
          (local.set $y3 (v128.xor (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $neg1)))
          (v128.store (local.get $p) (f64x2.add (local.get $y0) (local.get $y1)))
          (v128.store offset=16 (local.get $p) (f64x2.sub (local.get $y0) (local.get $y1)))
          (v128.store offset=32 (local.get $p) (f64x2.add (local.get $y2) (local.get $y3)))
          (v128.store offset=48 (local.get $p) (f64x2.sub (local.get $y2) (local.get $y3)))
          (local.set $p (i32.add (local.get $p) (i32.const 64)))
          (br $l))))
      (else
        ;; log2 M odd: the last stage, span 1, is left over
        (call $span1 (local.get $buf) (local.get $m)))))

  ;; The same transform by decimation in time: bit-reversed order in, natural order out. The first
  ;; pair of spans (1 and 2, all twiddles 1) without multiplies, or a single span-1 stage when
  ;; log2 M is odd; then spans q and 2q together for q = 4 (or 2), ×4 up to M/4.
  (func $dit (export "dit") (param $buf i32) (param $m i32) (param $tw i32)
    (local $q i32) (local $qb i32) (local $end i32) (local $s i32) (local $p i32) (local $pe i32)
    (local $p1 i32) (local $p2 i32) (local $p3 i32)
    (local $stepT i32) (local $stepW i32) (local $pt i32) (local $pw i32)
    (local $tc v128) (local $ts v128) (local $wc v128) (local $ws v128) (local $neg1 v128)
    (local $x0 v128) (local $x1 v128) (local $x2 v128) (local $x3 v128)
    (local $y0 v128) (local $y1 v128) (local $y2 v128) (local $y3 v128) (local $t v128)
    (local.set $neg1 (v128.const i64x2 0 0x8000000000000000))
    (local.set $end (i32.add (local.get $buf) (i32.shl (local.get $m) (i32.const 4))))
    (if (i32.and (i32.ctz (local.get $m)) (i32.const 1))
      (then
        (call $span1 (local.get $buf) (local.get $m))
        (local.set $q (i32.const 2)))
      (else
        ;; q = 1: groups of four neighbours, every twiddle 1
        (local.set $p (local.get $buf))
        (block $d (loop $l
          (br_if $d (i32.ge_u (local.get $p) (local.get $end)))
          (local.set $x0 (v128.load (local.get $p)))
          (local.set $x1 (v128.load offset=16 (local.get $p)))
          (local.set $x2 (v128.load offset=32 (local.get $p)))
          (local.set $x3 (v128.load offset=48 (local.get $p)))
          (local.set $y0 (f64x2.add (local.get $x0) (local.get $x1)))
          (local.set $y1 (f64x2.sub (local.get $x0) (local.get $x1)))
          (local.set $y2 (f64x2.add (local.get $x2) (local.get $x3)))
          (local.set $t (f64x2.sub (local.get $x2) (local.get $x3)))
          (local.set $y3 (v128.xor (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $neg1)))
          (v128.store (local.get $p) (f64x2.add (local.get $y0) (local.get $y2)))
          (v128.store offset=32 (local.get $p) (f64x2.sub (local.get $y0) (local.get $y2)))
          (v128.store offset=16 (local.get $p) (f64x2.add (local.get $y1) (local.get $y3)))
          (v128.store offset=48 (local.get $p) (f64x2.sub (local.get $y1) (local.get $y3)))
          (local.set $p (i32.add (local.get $p) (i32.const 64)))
          (br $l)))
        (local.set $q (i32.const 4))))
    (block $qd (loop $ql
      (br_if $qd (i32.gt_u (i32.shl (local.get $q) (i32.const 2)) (local.get $m)))
      (local.set $qb (i32.shl (local.get $q) (i32.const 4)))
      (local.set $stepT (i32.shl (i32.div_u (local.get $m) (i32.shl (local.get $q) (i32.const 2))) (i32.const 5)))
      (local.set $stepW (i32.shl (local.get $stepT) (i32.const 1)))
      (local.set $s (local.get $buf))
      (block $sd (loop $sl
        (br_if $sd (i32.ge_u (local.get $s) (local.get $end)))
        (local.set $p (local.get $s))
        (local.set $pe (i32.add (local.get $s) (local.get $qb)))
        (local.set $pt (local.get $tw))
        (local.set $pw (local.get $tw))
        (block $jd (loop $jl
          (br_if $jd (i32.ge_u (local.get $p) (local.get $pe)))
          (local.set $p1 (i32.add (local.get $p) (local.get $qb)))
          (local.set $p2 (i32.add (local.get $p1) (local.get $qb)))
          (local.set $p3 (i32.add (local.get $p2) (local.get $qb)))
          (local.set $tc (v128.load (local.get $pt)))
          (local.set $ts (v128.load offset=16 (local.get $pt)))
          (local.set $wc (v128.load (local.get $pw)))
          (local.set $ws (v128.load offset=16 (local.get $pw)))
          (local.set $x0 (v128.load (local.get $p)))
          (local.set $x1 (v128.load (local.get $p1)))
          (local.set $x2 (v128.load (local.get $p2)))
          (local.set $x3 (v128.load (local.get $p3)))
          ;; span q: (x0, x1), (x2, x3) with W = e^(-2πi j / 2q)
          (local.set $t (f64x2.add
            (f64x2.mul (local.get $x1) (local.get $wc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $x1) (local.get $x1)) (local.get $ws))))
          (local.set $y0 (f64x2.add (local.get $x0) (local.get $t)))
          (local.set $y1 (f64x2.sub (local.get $x0) (local.get $t)))
          (local.set $t (f64x2.add
            (f64x2.mul (local.get $x3) (local.get $wc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $x3) (local.get $x3)) (local.get $ws))))
          (local.set $y2 (f64x2.add (local.get $x2) (local.get $t)))
          (local.set $y3 (f64x2.sub (local.get $x2) (local.get $t)))
          ;; span 2q: (y0, y2) with T = e^(-2πi j / 4q), (y1, y3) with T·(−i)
          (local.set $t (f64x2.add
            (f64x2.mul (local.get $y2) (local.get $tc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $y2) (local.get $y2)) (local.get $ts))))
          (v128.store (local.get $p) (f64x2.add (local.get $y0) (local.get $t)))
          (v128.store (local.get $p2) (f64x2.sub (local.get $y0) (local.get $t)))
          (local.set $t (f64x2.add
            (f64x2.mul (local.get $y3) (local.get $tc))
            (f64x2.mul (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $y3) (local.get $y3)) (local.get $ts))))
          (local.set $t (v128.xor (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $t) (local.get $t)) (local.get $neg1)))
          (v128.store (local.get $p1) (f64x2.add (local.get $y1) (local.get $t)))
          (v128.store (local.get $p3) (f64x2.sub (local.get $y1) (local.get $t)))
          (local.set $p (i32.add (local.get $p) (i32.const 16)))
          (local.set $pt (i32.add (local.get $pt) (local.get $stepT)))
          (local.set $pw (i32.add (local.get $pw) (local.get $stepW)))
          (br $jl)))
        (local.set $s (i32.add (local.get $s) (i32.shl (local.get $qb) (i32.const 2))))
        (br $sl)))
      (local.set $q (i32.shl (local.get $q) (i32.const 2)))
      (br $ql))))

  ;; The circular convolution of one complex line in place: forward transform, times the kernel's
  ;; spectrum (conjugated, for the inverse by the same forward transform), forward transform again.
  ;; The line comes out conjugated: the caller takes (Re, −Im).
  (func $filter (param $work i32) (param $m i32) (param $spec i32) (param $tw i32)
    (local $q i32) (local $e i32) (local $sp i32)
    (call $dif (local.get $work) (local.get $m) (local.get $tw))
    ;; conj(X) · spec, both in bit-reversed order
    (local.set $q (local.get $work))
    (local.set $sp (local.get $spec))
    (local.set $e (i32.add (local.get $work) (i32.shl (local.get $m) (i32.const 4))))
    (block $d (loop $l
      (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
      (v128.store (local.get $q)
        (f64x2.mul (v128.load (local.get $q))
          (v128.xor (f64x2.splat (f64.load (local.get $sp))) (v128.const i64x2 0 0x8000000000000000))))
      (local.set $q (i32.add (local.get $q) (i32.const 16)))
      (local.set $sp (i32.add (local.get $sp) (i32.const 8)))
      (br $l)))
    (call $dit (local.get $work) (local.get $m) (local.get $tw)))

  ;; convColumns8(src, dst, w, h, x0, x1, r, m, spec, tw, work): the columns [x0, x1) of a w-wide,
  ;; h-tall f64 plane convolved, src -> dst (distinct), eight columns at a time (x1 − x0 a multiple
  ;; of 8): one 64-byte line of each row feeds four complex lines (neighbour pairs) held in four work
  ;; buffers of M complex each (work, work + 16M, ...), so each row's cache line and memory page
  ;; are visited once per eight columns instead of once per two. Segments as in convLines.
  (func (export "convColumns8") (param $src i32) (param $dst i32) (param $w i32) (param $h i32)
    (param $x0 i32) (param $x1 i32) (param $r i32) (param $m i32) (param $spec i32) (param $tw i32) (param $work i32)
    (local $x i32) (local $rb i32) (local $wb i32) (local $y0 i32) (local $len i32) (local $cnt i32) (local $i i32)
    (local $row i32) (local $a i32) (local $q i32) (local $k i32)
    (local.set $rb (i32.shl (local.get $w) (i32.const 3)))
    (local.set $wb (i32.shl (local.get $m) (i32.const 4)))
    (local.set $x (local.get $x0))
    (block $xd (loop $xl
      (br_if $xd (i32.ge_u (local.get $x) (local.get $x1)))
      (local.set $y0 (i32.const 0))
      (block $sd (loop $sl
        (br_if $sd (i32.ge_u (local.get $y0) (local.get $h)))
        (local.set $len (i32.sub (i32.sub (local.get $m) (local.get $r)) (local.get $r)))
        (if (i32.gt_u (i32.add (local.get $y0) (local.get $len)) (local.get $h))
          (then (local.set $len (i32.sub (local.get $h) (local.get $y0)))))
        (local.set $cnt (i32.add (local.get $len) (i32.shl (local.get $r) (i32.const 1))))
        ;; padded index i reads row clamp(y0 + i − r): four 16-byte pairs from one 64-byte line
        (local.set $i (i32.const 0))
        (block $pd (loop $pl
          (br_if $pd (i32.ge_u (local.get $i) (local.get $cnt)))
          (local.set $row (i32.sub (i32.add (local.get $y0) (local.get $i)) (local.get $r)))
          (if (i32.lt_s (local.get $row) (i32.const 0)) (then (local.set $row (i32.const 0))))
          (if (i32.ge_s (local.get $row) (local.get $h)) (then (local.set $row (i32.sub (local.get $h) (i32.const 1)))))
          (local.set $a (i32.add (local.get $src)
            (i32.add (i32.mul (local.get $row) (local.get $rb)) (i32.shl (local.get $x) (i32.const 3)))))
          (local.set $q (i32.add (local.get $work) (i32.shl (local.get $i) (i32.const 4))))
          (v128.store (local.get $q) (v128.load (local.get $a)))
          (v128.store (i32.add (local.get $q) (local.get $wb)) (v128.load offset=16 (local.get $a)))
          (v128.store (i32.add (local.get $q) (i32.shl (local.get $wb) (i32.const 1))) (v128.load offset=32 (local.get $a)))
          (v128.store (i32.add (local.get $q) (i32.mul (local.get $wb) (i32.const 3))) (v128.load offset=48 (local.get $a)))
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (br $pl)))
        (local.set $k (i32.const 0))
        (block $kd (loop $kl
          (br_if $kd (i32.ge_u (local.get $k) (i32.const 4)))
          (local.set $q (i32.add (local.get $work) (i32.mul (local.get $k) (local.get $wb))))
          (memory.fill (i32.add (local.get $q) (i32.shl (local.get $cnt) (i32.const 4))) (i32.const 0)
            (i32.shl (i32.sub (local.get $m) (local.get $cnt)) (i32.const 4)))
          (call $filter (local.get $q) (local.get $m) (local.get $spec) (local.get $tw))
          (local.set $k (i32.add (local.get $k) (i32.const 1)))
          (br $kl)))
        ;; outputs y0 .. y0 + len: (Re, −Im) of padded index r + i, one 64-byte line per row
        (local.set $i (i32.const 0))
        (block $od (loop $ol
          (br_if $od (i32.ge_u (local.get $i) (local.get $len)))
          (local.set $a (i32.add (local.get $dst)
            (i32.add (i32.mul (i32.add (local.get $y0) (local.get $i)) (local.get $rb)) (i32.shl (local.get $x) (i32.const 3)))))
          (local.set $q (i32.add (local.get $work) (i32.shl (i32.add (local.get $r) (local.get $i)) (i32.const 4))))
          (v128.store (local.get $a) (v128.xor (v128.load (local.get $q)) (v128.const i64x2 0 0x8000000000000000)))
          (v128.store offset=16 (local.get $a)
            (v128.xor (v128.load (i32.add (local.get $q) (local.get $wb))) (v128.const i64x2 0 0x8000000000000000)))
          (v128.store offset=32 (local.get $a)
            (v128.xor (v128.load (i32.add (local.get $q) (i32.shl (local.get $wb) (i32.const 1)))) (v128.const i64x2 0 0x8000000000000000)))
          (v128.store offset=48 (local.get $a)
            (v128.xor (v128.load (i32.add (local.get $q) (i32.mul (local.get $wb) (i32.const 3)))) (v128.const i64x2 0 0x8000000000000000)))
          (local.set $i (i32.add (local.get $i) (i32.const 1)))
          (br $ol)))
        (local.set $y0 (i32.add (local.get $y0) (local.get $len)))
        (br $sl)))
      (local.set $x (i32.add (local.get $x) (i32.const 8)))
      (br $xl))))

  ;; convLines(src, dst, n, lines, lineStride, elemStride, r, m, spec, tw, work): lines of n f64 values
  ;; (n >= 1) convolved, src -> dst (distinct planes). Line l starts at src + l·lineStride, its values
  ;; elemStride bytes apart: rows of a w-wide plane are (w·8, 8), its columns (8, w·8). Lines go in
  ;; pairs (l, l+1) as one complex line; a last odd line is paired with itself.
  ;; spec: M f64, the kernel's spectrum / M in bit-reversed order; work: M complex f64.
  ;; Long lines run in segments (overlap-save): each transform yields M − 2r outputs.
  (func (export "convLines") (param $src i32) (param $dst i32) (param $n i32) (param $lines i32)
    (param $ls i32) (param $es i32) (param $r i32) (param $m i32) (param $spec i32) (param $tw i32) (param $work i32)
    (local $l i32) (local $pa i32) (local $pb i32) (local $da i32) (local $db i32) (local $two i32)
    (local $x0 i32) (local $len i32) (local $i i32) (local $c i32) (local $cnt i32) (local $q i32) (local $e i32)
    (local $sp i32) (local $edge v128) (local $v v128) (local $adj i32)
    (block $ld (loop $ll
      (br_if $ld (i32.ge_u (local.get $l) (local.get $lines)))
      (local.set $two (i32.lt_u (i32.add (local.get $l) (i32.const 1)) (local.get $lines)))
      (local.set $pa (i32.add (local.get $src) (i32.mul (local.get $l) (local.get $ls))))
      (local.set $pb (select (i32.add (local.get $pa) (local.get $ls)) (local.get $pa) (local.get $two)))
      (local.set $da (i32.add (local.get $dst) (i32.mul (local.get $l) (local.get $ls))))
      (local.set $db (i32.add (local.get $da) (local.get $ls)))
      (local.set $adj (i32.and (local.get $two) (i32.eq (local.get $ls) (i32.const 8))))
      (local.set $x0 (i32.const 0))
      (block $sd (loop $sl
        (br_if $sd (i32.ge_u (local.get $x0) (local.get $n)))
        ;; outputs x0 .. x0 + len need inputs x0 − r .. x0 + len + r (clamped to the line)
        (local.set $len (i32.sub (i32.sub (local.get $m) (local.get $r)) (local.get $r)))
        (if (i32.gt_u (i32.add (local.get $x0) (local.get $len)) (local.get $n))
          (then (local.set $len (i32.sub (local.get $n) (local.get $x0)))))
        (local.set $cnt (i32.add (local.get $len) (i32.shl (local.get $r) (i32.const 1))))
        (local.set $q (local.get $work))
        ;; padded index i reads line index c = x0 + i − r: the first value while c < 0, the last
        ;; once c >= n
        (local.set $i (i32.sub (local.get $r) (local.get $x0)))
        (if (i32.lt_s (local.get $i) (i32.const 0)) (then (local.set $i (i32.const 0))))
        (local.set $e (i32.add (local.get $work) (i32.shl (local.get $i) (i32.const 4))))
        (local.set $edge (f64x2.replace_lane 1 (f64x2.splat (f64.load (local.get $pa))) (f64.load (local.get $pb))))
        (block $d (loop $l3
          (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
          (v128.store (local.get $q) (local.get $edge))
          (local.set $q (i32.add (local.get $q) (i32.const 16)))
          (br $l3)))
        (local.set $i (i32.add (i32.sub (local.get $n) (local.get $x0)) (local.get $r)))
        (if (i32.gt_s (local.get $i) (local.get $cnt)) (then (local.set $i (local.get $cnt))))
        (local.set $e (i32.add (local.get $work) (i32.shl (local.get $i) (i32.const 4))))
        (local.set $c (i32.mul (i32.add (i32.sub (local.get $x0) (local.get $r))
          (i32.shr_u (i32.sub (local.get $q) (local.get $work)) (i32.const 4))) (local.get $es)))
        (if (local.get $adj)
          (then
            ;; columns: a value and its right neighbour are one 16-byte load
            (block $d (loop $l4
              (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
              (v128.store (local.get $q) (v128.load (i32.add (local.get $pa) (local.get $c))))
              (local.set $c (i32.add (local.get $c) (local.get $es)))
              (local.set $q (i32.add (local.get $q) (i32.const 16)))
              (br $l4))))
          (else
            (block $d (loop $l5
              (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
              (v128.store (local.get $q) (f64x2.replace_lane 1
                (f64x2.splat (f64.load (i32.add (local.get $pa) (local.get $c))))
                (f64.load (i32.add (local.get $pb) (local.get $c)))))
              (local.set $c (i32.add (local.get $c) (local.get $es)))
              (local.set $q (i32.add (local.get $q) (i32.const 16)))
              (br $l5)))))
        (local.set $c (i32.mul (i32.sub (local.get $n) (i32.const 1)) (local.get $es)))
        (local.set $edge (f64x2.replace_lane 1 (f64x2.splat (f64.load (i32.add (local.get $pa) (local.get $c))))
          (f64.load (i32.add (local.get $pb) (local.get $c)))))
        (local.set $e (i32.add (local.get $work) (i32.shl (local.get $cnt) (i32.const 4))))
        (block $d (loop $l6
          (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
          (v128.store (local.get $q) (local.get $edge))
          (local.set $q (i32.add (local.get $q) (i32.const 16)))
          (br $l6)))
        (memory.fill (local.get $q) (i32.const 0)
          (i32.sub (i32.add (local.get $work) (i32.shl (local.get $m) (i32.const 4))) (local.get $q)))
        (call $filter (local.get $work) (local.get $m) (local.get $spec) (local.get $tw))
        ;; line a = Re, line b = −Im, at padded indices r .. r + len
        (local.set $q (i32.add (local.get $work) (i32.shl (local.get $r) (i32.const 4))))
        (local.set $i (i32.const 0))
        (local.set $c (i32.mul (local.get $x0) (local.get $es)))
        (local.set $e (i32.add (local.get $q) (i32.shl (local.get $len) (i32.const 4))))
        (if (local.get $adj)
          (then
            (block $d (loop $l7
              (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
              (v128.store (i32.add (local.get $da) (local.get $c))
                (v128.xor (v128.load (local.get $q)) (v128.const i64x2 0 0x8000000000000000)))
              (local.set $c (i32.add (local.get $c) (local.get $es)))
              (local.set $q (i32.add (local.get $q) (i32.const 16)))
              (br $l7))))
          (else
            (block $d (loop $l8
              (br_if $d (i32.ge_u (local.get $q) (local.get $e)))
              (local.set $v (v128.load (local.get $q)))
              (f64.store (i32.add (local.get $da) (local.get $c)) (f64x2.extract_lane 0 (local.get $v)))
              (if (local.get $two)
                (then (f64.store (i32.add (local.get $db) (local.get $c)) (f64.neg (f64x2.extract_lane 1 (local.get $v))))))
              (local.set $c (i32.add (local.get $c) (local.get $es)))
              (local.set $q (i32.add (local.get $q) (i32.const 16)))
              (br $l8)))))
        (local.set $x0 (i32.add (local.get $x0) (local.get $len)))
        (br $sl)))
      (local.set $l (i32.add (local.get $l) (i32.const 2)))
      (br $ll))))
)
