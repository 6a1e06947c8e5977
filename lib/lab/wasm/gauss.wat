;; Exact sampled Gaussian, one direction at a time: each row of a plane convolved with a symmetric
;; kernel, the row's end pixels repeated beyond the frame; and the transposes that turn columns into
;; rows, so the second direction is the same row pass. Built into gauss.wasm by `npm run wasm`.
;;
;; Kernel: k[0..r] (the centre weight and one half), normalised by the caller. Outputs are computed
;; 16 (f32) or 8 (f64) at a time in SIMD lanes; each tap adds k[t] * (x[i-t] + x[i+t]), outermost tap
;; first, so the small weights are summed before the large ones.
;;
;; Memory is the caller's (imported); every address is a byte offset the caller laid out.
(module
  (import "e" "m" (memory 1))

  ;; ---------------------------------------------------------------------------------------------
  ;; float32 planes

  ;; pad[0..r) = row[0], pad[r..r+w) = row, pad[r+w..r+w+r) = row[w-1]
  (func $pad32 (param $src i32) (param $pad i32) (param $w i32) (param $r i32)
    (local $v f32) (local $p i32) (local $e i32)
    (local.set $v (f32.load (local.get $src)))
    (local.set $p (local.get $pad))
    (local.set $e (i32.add (local.get $pad) (i32.shl (local.get $r) (i32.const 2))))
    (block $done (loop $fill
      (br_if $done (i32.ge_u (local.get $p) (local.get $e)))
      (f32.store (local.get $p) (local.get $v))
      (local.set $p (i32.add (local.get $p) (i32.const 4)))
      (br $fill)))
    (memory.copy (local.get $p) (local.get $src) (i32.shl (local.get $w) (i32.const 2)))
    (local.set $p (i32.add (local.get $p) (i32.shl (local.get $w) (i32.const 2))))
    (local.set $v (f32.load (i32.sub (local.get $p) (i32.const 4))))
    (local.set $e (i32.add (local.get $p) (i32.shl (local.get $r) (i32.const 2))))
    (block $done2 (loop $fill2
      (br_if $done2 (i32.ge_u (local.get $p) (local.get $e)))
      (f32.store (local.get $p) (local.get $v))
      (local.set $p (i32.add (local.get $p) (i32.const 4)))
      (br $fill2))))

  ;; 16 outputs; $c is the address of the first output's centre tap in the padded row
  (func $taps16x32 (param $c i32) (param $dst i32) (param $k i32) (param $r i32)
    (local $a0 v128) (local $a1 v128) (local $a2 v128) (local $a3 v128) (local $kv v128)
    (local $lo i32) (local $hi i32) (local $kp i32)
    (local.set $kp (i32.add (local.get $k) (i32.shl (local.get $r) (i32.const 2))))
    (local.set $lo (i32.sub (local.get $c) (i32.shl (local.get $r) (i32.const 2))))
    (local.set $hi (i32.add (local.get $c) (i32.shl (local.get $r) (i32.const 2))))
    (block $done (loop $tap
      (br_if $done (i32.le_u (local.get $kp) (local.get $k)))
      (local.set $kv (f32x4.splat (f32.load (local.get $kp))))
      (local.set $a0 (f32x4.add (local.get $a0) (f32x4.mul (local.get $kv)
        (f32x4.add (v128.load (local.get $lo)) (v128.load (local.get $hi))))))
      (local.set $a1 (f32x4.add (local.get $a1) (f32x4.mul (local.get $kv)
        (f32x4.add (v128.load offset=16 (local.get $lo)) (v128.load offset=16 (local.get $hi))))))
      (local.set $a2 (f32x4.add (local.get $a2) (f32x4.mul (local.get $kv)
        (f32x4.add (v128.load offset=32 (local.get $lo)) (v128.load offset=32 (local.get $hi))))))
      (local.set $a3 (f32x4.add (local.get $a3) (f32x4.mul (local.get $kv)
        (f32x4.add (v128.load offset=48 (local.get $lo)) (v128.load offset=48 (local.get $hi))))))
      (local.set $lo (i32.add (local.get $lo) (i32.const 4)))
      (local.set $hi (i32.sub (local.get $hi) (i32.const 4)))
      (local.set $kp (i32.sub (local.get $kp) (i32.const 4)))
      (br $tap)))
    (local.set $kv (f32x4.splat (f32.load (local.get $k))))
    (v128.store (local.get $dst) (f32x4.add (local.get $a0) (f32x4.mul (local.get $kv) (v128.load (local.get $c)))))
    (v128.store offset=16 (local.get $dst) (f32x4.add (local.get $a1) (f32x4.mul (local.get $kv) (v128.load offset=16 (local.get $c)))))
    (v128.store offset=32 (local.get $dst) (f32x4.add (local.get $a2) (f32x4.mul (local.get $kv) (v128.load offset=32 (local.get $c)))))
    (v128.store offset=48 (local.get $dst) (f32x4.add (local.get $a3) (f32x4.mul (local.get $kv) (v128.load offset=48 (local.get $c))))))

  ;; 4 outputs
  (func $taps4x32 (param $c i32) (param $dst i32) (param $k i32) (param $r i32)
    (local $a0 v128) (local $kv v128) (local $lo i32) (local $hi i32) (local $kp i32)
    (local.set $kp (i32.add (local.get $k) (i32.shl (local.get $r) (i32.const 2))))
    (local.set $lo (i32.sub (local.get $c) (i32.shl (local.get $r) (i32.const 2))))
    (local.set $hi (i32.add (local.get $c) (i32.shl (local.get $r) (i32.const 2))))
    (block $done (loop $tap
      (br_if $done (i32.le_u (local.get $kp) (local.get $k)))
      (local.set $kv (f32x4.splat (f32.load (local.get $kp))))
      (local.set $a0 (f32x4.add (local.get $a0) (f32x4.mul (local.get $kv)
        (f32x4.add (v128.load (local.get $lo)) (v128.load (local.get $hi))))))
      (local.set $lo (i32.add (local.get $lo) (i32.const 4)))
      (local.set $hi (i32.sub (local.get $hi) (i32.const 4)))
      (local.set $kp (i32.sub (local.get $kp) (i32.const 4)))
      (br $tap)))
    (local.set $kv (f32x4.splat (f32.load (local.get $k))))
    (v128.store (local.get $dst) (f32x4.add (local.get $a0) (f32x4.mul (local.get $kv) (v128.load (local.get $c))))))

  ;; rows32(src, dst, w, rows, k, r, pad): every row of a w-wide float32 plane (w >= 4), src -> dst.
  ;; pad holds w + 2r floats.
  (func (export "rows32") (param $src i32) (param $dst i32) (param $w i32) (param $rows i32)
    (param $k i32) (param $r i32) (param $pad i32)
    (local $row i32) (local $x i32) (local $rb i32) (local $c0 i32)
    (local.set $rb (i32.shl (local.get $w) (i32.const 2)))
    (local.set $c0 (i32.add (local.get $pad) (i32.shl (local.get $r) (i32.const 2))))
    (block $rowsdone (loop $rowl
      (br_if $rowsdone (i32.ge_u (local.get $row) (local.get $rows)))
      (call $pad32 (local.get $src) (local.get $pad) (local.get $w) (local.get $r))
      (local.set $x (i32.const 0))
      (block $d16 (loop $l16
        (br_if $d16 (i32.gt_u (i32.add (local.get $x) (i32.const 16)) (local.get $w)))
        (call $taps16x32 (i32.add (local.get $c0) (i32.shl (local.get $x) (i32.const 2)))
          (i32.add (local.get $dst) (i32.shl (local.get $x) (i32.const 2))) (local.get $k) (local.get $r))
        (local.set $x (i32.add (local.get $x) (i32.const 16)))
        (br $l16)))
      ;; The rest 4 at a time, the last group moved back to end at w (it recomputes equal values).
      (block $d4 (loop $l4
        (br_if $d4 (i32.ge_u (local.get $x) (local.get $w)))
        (if (i32.gt_u (i32.add (local.get $x) (i32.const 4)) (local.get $w))
          (then (local.set $x (i32.sub (local.get $w) (i32.const 4)))))
        (call $taps4x32 (i32.add (local.get $c0) (i32.shl (local.get $x) (i32.const 2)))
          (i32.add (local.get $dst) (i32.shl (local.get $x) (i32.const 2))) (local.get $k) (local.get $r))
        (local.set $x (i32.add (local.get $x) (i32.const 4)))
        (br $l4)))
      (local.set $src (i32.add (local.get $src) (local.get $rb)))
      (local.set $dst (i32.add (local.get $dst) (local.get $rb)))
      (local.set $row (i32.add (local.get $row) (i32.const 1)))
      (br $rowl))))

  ;; transpose32(src, dst, w, h): dst (h wide, w tall) = src (w wide, h tall) transposed, in 8 x 8 tiles
  (func (export "transpose32") (param $src i32) (param $dst i32) (param $w i32) (param $h i32)
    (local $x0 i32) (local $y0 i32) (local $x1 i32) (local $y1 i32) (local $x i32) (local $y i32)
    (block $yd (loop $yl
      (br_if $yd (i32.ge_u (local.get $y0) (local.get $h)))
      (local.set $y1 (select (i32.add (local.get $y0) (i32.const 8)) (local.get $h)
        (i32.lt_u (i32.add (local.get $y0) (i32.const 8)) (local.get $h))))
      (local.set $x0 (i32.const 0))
      (block $xd (loop $xl
        (br_if $xd (i32.ge_u (local.get $x0) (local.get $w)))
        (local.set $x1 (select (i32.add (local.get $x0) (i32.const 8)) (local.get $w)
          (i32.lt_u (i32.add (local.get $x0) (i32.const 8)) (local.get $w))))
        (local.set $y (local.get $y0))
        (block $td (loop $tl
          (br_if $td (i32.ge_u (local.get $y) (local.get $y1)))
          (local.set $x (local.get $x0))
          (block $ud (loop $ul
            (br_if $ud (i32.ge_u (local.get $x) (local.get $x1)))
            (f32.store
              (i32.add (local.get $dst) (i32.shl (i32.add (i32.mul (local.get $x) (local.get $h)) (local.get $y)) (i32.const 2)))
              (f32.load (i32.add (local.get $src) (i32.shl (i32.add (i32.mul (local.get $y) (local.get $w)) (local.get $x)) (i32.const 2)))))
            (local.set $x (i32.add (local.get $x) (i32.const 1)))
            (br $ul)))
          (local.set $y (i32.add (local.get $y) (i32.const 1)))
          (br $tl)))
        (local.set $x0 (local.get $x1))
        (br $xl)))
      (local.set $y0 (local.get $y1))
      (br $yl))))

  ;; ---------------------------------------------------------------------------------------------
  ;; float64 planes (mattes and weights, where 1 - m must keep its digits)

  (func $pad64 (param $src i32) (param $pad i32) (param $w i32) (param $r i32)
    (local $v f64) (local $p i32) (local $e i32)
    (local.set $v (f64.load (local.get $src)))
    (local.set $p (local.get $pad))
    (local.set $e (i32.add (local.get $pad) (i32.shl (local.get $r) (i32.const 3))))
    (block $done (loop $fill
      (br_if $done (i32.ge_u (local.get $p) (local.get $e)))
      (f64.store (local.get $p) (local.get $v))
      (local.set $p (i32.add (local.get $p) (i32.const 8)))
      (br $fill)))
    (memory.copy (local.get $p) (local.get $src) (i32.shl (local.get $w) (i32.const 3)))
    (local.set $p (i32.add (local.get $p) (i32.shl (local.get $w) (i32.const 3))))
    (local.set $v (f64.load (i32.sub (local.get $p) (i32.const 8))))
    (local.set $e (i32.add (local.get $p) (i32.shl (local.get $r) (i32.const 3))))
    (block $done2 (loop $fill2
      (br_if $done2 (i32.ge_u (local.get $p) (local.get $e)))
      (f64.store (local.get $p) (local.get $v))
      (local.set $p (i32.add (local.get $p) (i32.const 8)))
      (br $fill2))))

  ;; 8 outputs
  (func $taps8x64 (param $c i32) (param $dst i32) (param $k i32) (param $r i32)
    (local $a0 v128) (local $a1 v128) (local $a2 v128) (local $a3 v128) (local $kv v128)
    (local $lo i32) (local $hi i32) (local $kp i32)
    (local.set $kp (i32.add (local.get $k) (i32.shl (local.get $r) (i32.const 3))))
    (local.set $lo (i32.sub (local.get $c) (i32.shl (local.get $r) (i32.const 3))))
    (local.set $hi (i32.add (local.get $c) (i32.shl (local.get $r) (i32.const 3))))
    (block $done (loop $tap
      (br_if $done (i32.le_u (local.get $kp) (local.get $k)))
      (local.set $kv (f64x2.splat (f64.load (local.get $kp))))
      (local.set $a0 (f64x2.add (local.get $a0) (f64x2.mul (local.get $kv)
        (f64x2.add (v128.load (local.get $lo)) (v128.load (local.get $hi))))))
      (local.set $a1 (f64x2.add (local.get $a1) (f64x2.mul (local.get $kv)
        (f64x2.add (v128.load offset=16 (local.get $lo)) (v128.load offset=16 (local.get $hi))))))
      (local.set $a2 (f64x2.add (local.get $a2) (f64x2.mul (local.get $kv)
        (f64x2.add (v128.load offset=32 (local.get $lo)) (v128.load offset=32 (local.get $hi))))))
      (local.set $a3 (f64x2.add (local.get $a3) (f64x2.mul (local.get $kv)
        (f64x2.add (v128.load offset=48 (local.get $lo)) (v128.load offset=48 (local.get $hi))))))
      (local.set $lo (i32.add (local.get $lo) (i32.const 8)))
      (local.set $hi (i32.sub (local.get $hi) (i32.const 8)))
      (local.set $kp (i32.sub (local.get $kp) (i32.const 8)))
      (br $tap)))
    (local.set $kv (f64x2.splat (f64.load (local.get $k))))
    (v128.store (local.get $dst) (f64x2.add (local.get $a0) (f64x2.mul (local.get $kv) (v128.load (local.get $c)))))
    (v128.store offset=16 (local.get $dst) (f64x2.add (local.get $a1) (f64x2.mul (local.get $kv) (v128.load offset=16 (local.get $c)))))
    (v128.store offset=32 (local.get $dst) (f64x2.add (local.get $a2) (f64x2.mul (local.get $kv) (v128.load offset=32 (local.get $c)))))
    (v128.store offset=48 (local.get $dst) (f64x2.add (local.get $a3) (f64x2.mul (local.get $kv) (v128.load offset=48 (local.get $c))))))

  ;; 2 outputs
  (func $taps2x64 (param $c i32) (param $dst i32) (param $k i32) (param $r i32)
    (local $a0 v128) (local $kv v128) (local $lo i32) (local $hi i32) (local $kp i32)
    (local.set $kp (i32.add (local.get $k) (i32.shl (local.get $r) (i32.const 3))))
    (local.set $lo (i32.sub (local.get $c) (i32.shl (local.get $r) (i32.const 3))))
    (local.set $hi (i32.add (local.get $c) (i32.shl (local.get $r) (i32.const 3))))
    (block $done (loop $tap
      (br_if $done (i32.le_u (local.get $kp) (local.get $k)))
      (local.set $kv (f64x2.splat (f64.load (local.get $kp))))
      (local.set $a0 (f64x2.add (local.get $a0) (f64x2.mul (local.get $kv)
        (f64x2.add (v128.load (local.get $lo)) (v128.load (local.get $hi))))))
      (local.set $lo (i32.add (local.get $lo) (i32.const 8)))
      (local.set $hi (i32.sub (local.get $hi) (i32.const 8)))
      (local.set $kp (i32.sub (local.get $kp) (i32.const 8)))
      (br $tap)))
    (local.set $kv (f64x2.splat (f64.load (local.get $k))))
    (v128.store (local.get $dst) (f64x2.add (local.get $a0) (f64x2.mul (local.get $kv) (v128.load (local.get $c))))))

  ;; rows64(src, dst, w, rows, k, r, pad): as rows32 for float64 planes (w >= 2), k in float64.
  (func (export "rows64") (param $src i32) (param $dst i32) (param $w i32) (param $rows i32)
    (param $k i32) (param $r i32) (param $pad i32)
    (local $row i32) (local $x i32) (local $rb i32) (local $c0 i32)
    (local.set $rb (i32.shl (local.get $w) (i32.const 3)))
    (local.set $c0 (i32.add (local.get $pad) (i32.shl (local.get $r) (i32.const 3))))
    (block $rowsdone (loop $rowl
      (br_if $rowsdone (i32.ge_u (local.get $row) (local.get $rows)))
      (call $pad64 (local.get $src) (local.get $pad) (local.get $w) (local.get $r))
      (local.set $x (i32.const 0))
      (block $d8 (loop $l8
        (br_if $d8 (i32.gt_u (i32.add (local.get $x) (i32.const 8)) (local.get $w)))
        (call $taps8x64 (i32.add (local.get $c0) (i32.shl (local.get $x) (i32.const 3)))
          (i32.add (local.get $dst) (i32.shl (local.get $x) (i32.const 3))) (local.get $k) (local.get $r))
        (local.set $x (i32.add (local.get $x) (i32.const 8)))
        (br $l8)))
      (block $d2 (loop $l2
        (br_if $d2 (i32.ge_u (local.get $x) (local.get $w)))
        (if (i32.gt_u (i32.add (local.get $x) (i32.const 2)) (local.get $w))
          (then (local.set $x (i32.sub (local.get $w) (i32.const 2)))))
        (call $taps2x64 (i32.add (local.get $c0) (i32.shl (local.get $x) (i32.const 3)))
          (i32.add (local.get $dst) (i32.shl (local.get $x) (i32.const 3))) (local.get $k) (local.get $r))
        (local.set $x (i32.add (local.get $x) (i32.const 2)))
        (br $l2)))
      (local.set $src (i32.add (local.get $src) (local.get $rb)))
      (local.set $dst (i32.add (local.get $dst) (local.get $rb)))
      (local.set $row (i32.add (local.get $row) (i32.const 1)))
      (br $rowl))))

  (func (export "transpose64") (param $src i32) (param $dst i32) (param $w i32) (param $h i32)
    (local $x0 i32) (local $y0 i32) (local $x1 i32) (local $y1 i32) (local $x i32) (local $y i32)
    (block $yd (loop $yl
      (br_if $yd (i32.ge_u (local.get $y0) (local.get $h)))
      (local.set $y1 (select (i32.add (local.get $y0) (i32.const 8)) (local.get $h)
        (i32.lt_u (i32.add (local.get $y0) (i32.const 8)) (local.get $h))))
      (local.set $x0 (i32.const 0))
      (block $xd (loop $xl
        (br_if $xd (i32.ge_u (local.get $x0) (local.get $w)))
        (local.set $x1 (select (i32.add (local.get $x0) (i32.const 8)) (local.get $w)
          (i32.lt_u (i32.add (local.get $x0) (i32.const 8)) (local.get $w))))
        (local.set $y (local.get $y0))
        (block $td (loop $tl
          (br_if $td (i32.ge_u (local.get $y) (local.get $y1)))
          (local.set $x (local.get $x0))
          (block $ud (loop $ul
            (br_if $ud (i32.ge_u (local.get $x) (local.get $x1)))
            (f64.store
              (i32.add (local.get $dst) (i32.shl (i32.add (i32.mul (local.get $x) (local.get $h)) (local.get $y)) (i32.const 3)))
              (f64.load (i32.add (local.get $src) (i32.shl (i32.add (i32.mul (local.get $y) (local.get $w)) (local.get $x)) (i32.const 3)))))
            (local.set $x (i32.add (local.get $x) (i32.const 1)))
            (br $ul)))
          (local.set $y (i32.add (local.get $y) (i32.const 1)))
          (br $tl)))
        (local.set $x0 (local.get $x1))
        (br $xl)))
      (local.set $y0 (local.get $y1))
      (br $yl))))
)
