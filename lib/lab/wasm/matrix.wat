;; 3 × 3 colour matrix plus offset over interleaved RGB float32, in place, one pixel per SIMD lane
;; group. Built into matrix.wasm by `npm run wasm`; driven by lib/lab/simd.ts (matrixSimd).
;;
;; Parameters at the start of memory (written by the caller, 16 bytes each):
;;   0   column 0 of M as [m00, m10, m20, 0]     64  keep-mask: lane c all ones where row c changes
;;   16  column 1                                80  .. 144: the same five rotated one lane up
;;   32  column 2                                    ([0, m00, m10, m20] ...), for the group's last
;;   48  offset [o0, o1, o2, 0]                      pixel, which is read from 4 bytes earlier
;;   160 lanes-1..3 mask [0, ~0, ~0, ~0]
;; Each pixel is read and written as 16 bytes (r, g, b and the next value, which the mask writes back
;; unchanged). Four pixels (48 bytes) per turn, all reads before all writes, the last read as
;; [b of pixel 2, r, g, b] so no write spills into the next group (a spill would stall the next read
;; on store forwarding). The caller runs whole groups of four and does the tail itself.
(module
  (import "e" "m" (memory 1))

  (func (export "f") (param $p i32) (param $end i32)
    (local $c0 v128) (local $c1 v128) (local $c2 v128) (local $off v128) (local $keep v128)
    (local $r0 v128) (local $r1 v128) (local $r2 v128) (local $roff v128) (local $rkeep v128)
    (local $upper v128)
    (local $v0 v128) (local $v1 v128) (local $v2 v128) (local $v3 v128)
    (local $o0 v128) (local $o1 v128) (local $o2 v128) (local $o3 v128)
    (local.set $c0 (v128.load offset=0 align=1 (i32.const 0)))
    (local.set $c1 (v128.load offset=16 align=1 (i32.const 0)))
    (local.set $c2 (v128.load offset=32 align=1 (i32.const 0)))
    (local.set $off (v128.load offset=48 align=1 (i32.const 0)))
    (local.set $keep (v128.load offset=64 align=1 (i32.const 0)))
    (local.set $r0 (v128.load offset=80 align=1 (i32.const 0)))
    (local.set $r1 (v128.load offset=96 align=1 (i32.const 0)))
    (local.set $r2 (v128.load offset=112 align=1 (i32.const 0)))
    (local.set $roff (v128.load offset=128 align=1 (i32.const 0)))
    (local.set $rkeep (v128.load offset=144 align=1 (i32.const 0)))
    (local.set $upper (v128.load offset=160 align=1 (i32.const 0)))
    (block $done (loop $group
      (br_if $done (i32.ge_u (local.get $p) (local.get $end)))
      (local.set $v0 (v128.load offset=0 align=1 (local.get $p)))
      (local.set $v1 (v128.load offset=12 align=1 (local.get $p)))
      (local.set $v2 (v128.load offset=24 align=1 (local.get $p)))
      (local.set $v3 (v128.load offset=32 align=1 (local.get $p)))
      ;; out = off + c0·r + c1·g + c2·b; changed rows from the product, the rest as read
      (local.set $o0 (v128.bitselect
        (f32x4.add (f32x4.add (f32x4.add (local.get $off)
          (f32x4.mul (local.get $c0) (i8x16.shuffle 0 1 2 3 0 1 2 3 0 1 2 3 0 1 2 3 (local.get $v0) (local.get $v0))))
          (f32x4.mul (local.get $c1) (i8x16.shuffle 4 5 6 7 4 5 6 7 4 5 6 7 4 5 6 7 (local.get $v0) (local.get $v0))))
          (f32x4.mul (local.get $c2) (i8x16.shuffle 8 9 10 11 8 9 10 11 8 9 10 11 8 9 10 11 (local.get $v0) (local.get $v0))))
        (local.get $v0) (local.get $keep)))
      (local.set $o1 (v128.bitselect
        (f32x4.add (f32x4.add (f32x4.add (local.get $off)
          (f32x4.mul (local.get $c0) (i8x16.shuffle 0 1 2 3 0 1 2 3 0 1 2 3 0 1 2 3 (local.get $v1) (local.get $v1))))
          (f32x4.mul (local.get $c1) (i8x16.shuffle 4 5 6 7 4 5 6 7 4 5 6 7 4 5 6 7 (local.get $v1) (local.get $v1))))
          (f32x4.mul (local.get $c2) (i8x16.shuffle 8 9 10 11 8 9 10 11 8 9 10 11 8 9 10 11 (local.get $v1) (local.get $v1))))
        (local.get $v1) (local.get $keep)))
      (local.set $o2 (v128.bitselect
        (f32x4.add (f32x4.add (f32x4.add (local.get $off)
          (f32x4.mul (local.get $c0) (i8x16.shuffle 0 1 2 3 0 1 2 3 0 1 2 3 0 1 2 3 (local.get $v2) (local.get $v2))))
          (f32x4.mul (local.get $c1) (i8x16.shuffle 4 5 6 7 4 5 6 7 4 5 6 7 4 5 6 7 (local.get $v2) (local.get $v2))))
          (f32x4.mul (local.get $c2) (i8x16.shuffle 8 9 10 11 8 9 10 11 8 9 10 11 8 9 10 11 (local.get $v2) (local.get $v2))))
        (local.get $v2) (local.get $keep)))
      ;; pixel 3 sits in lanes 1..3 of v3; lane 0 (b of pixel 2) takes o2's new b
      (local.set $o3 (v128.bitselect
        (v128.bitselect
          (f32x4.add (f32x4.add (f32x4.add (local.get $roff)
            (f32x4.mul (local.get $r0) (i8x16.shuffle 4 5 6 7 4 5 6 7 4 5 6 7 4 5 6 7 (local.get $v3) (local.get $v3))))
            (f32x4.mul (local.get $r1) (i8x16.shuffle 8 9 10 11 8 9 10 11 8 9 10 11 8 9 10 11 (local.get $v3) (local.get $v3))))
            (f32x4.mul (local.get $r2) (i8x16.shuffle 12 13 14 15 12 13 14 15 12 13 14 15 12 13 14 15 (local.get $v3) (local.get $v3))))
          (local.get $v3) (local.get $rkeep))
        (i8x16.shuffle 8 9 10 11 8 9 10 11 8 9 10 11 8 9 10 11 (local.get $o2) (local.get $o2))
        (local.get $upper)))
      (v128.store offset=0 align=1 (local.get $p) (local.get $o0))
      (v128.store offset=12 align=1 (local.get $p) (local.get $o1))
      (v128.store offset=24 align=1 (local.get $p) (local.get $o2))
      (v128.store offset=32 align=1 (local.get $p) (local.get $o3))
      (local.set $p (i32.add (local.get $p) (i32.const 48)))
      (br $group))))
)
