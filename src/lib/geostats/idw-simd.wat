;; The fast pass of idwEverySitePower2Rows (src/lib/geostats/idw.ts) with 128-bit SIMD: for one
;; row of cells, four cells per pass over all sites (two f64x2 lanes pairs), w = 1/d², the same
;; operations in the same order as the JavaScript loop, so each cell's sums are bit-identical.
;; Memory: xs at 0, ys at 8n, zs at 16n (n doubles each); the row's results at `out`
;; (Σw·z / Σw per cell) and its Σw at `sw` (the caller flags Σw ≥ 1/HIT_D2 for the careful pass).
;; Built to idw-simd.wasm.ts by scripts/build-wasm.js (npm run build:wasm).
(module
  (memory (export "memory") 1)
  (func (export "row")
    (param $n i32) (param $nx i32) (param $x0 f64) (param $dx f64) (param $cy f64)
    (param $out i32) (param $sw i32)
    (local $i i32) (local $q i32) (local $ys i32) (local $zs i32) (local $end i32)
    (local $c01 v128) (local $c23 v128) (local $s01 v128) (local $s23 v128)
    (local $t01 v128) (local $t23 v128) (local $xv v128) (local $e2 v128) (local $zv v128)
    (local $e v128) (local $w v128) (local $ey f64) (local $fi f64)
    (local.set $ys (i32.shl (local.get $n) (i32.const 3)))
    (local.set $zs (i32.shl (local.get $n) (i32.const 4)))
    (local.set $end (local.get $ys))
    (block $rowdone
      (loop $cells
        (br_if $rowdone (i32.gt_s (i32.add (local.get $i) (i32.const 4)) (local.get $nx)))
        (local.set $fi (f64.convert_i32_s (local.get $i)))
        ;; c = x0 + (i + k + 0.5) · dx, as the JavaScript
        (local.set $c01 (f64x2.replace_lane 1
          (f64x2.splat (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 0.5)) (local.get $dx))))
          (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 1.5)) (local.get $dx)))))
        (local.set $c23 (f64x2.replace_lane 1
          (f64x2.splat (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 2.5)) (local.get $dx))))
          (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 3.5)) (local.get $dx)))))
        (local.set $s01 (v128.const f64x2 0 0))
        (local.set $s23 (v128.const f64x2 0 0))
        (local.set $t01 (v128.const f64x2 0 0))
        (local.set $t23 (v128.const f64x2 0 0))
        (local.set $q (i32.const 0))
        (block $sitesdone
          (loop $sites
            (br_if $sitesdone (i32.ge_u (local.get $q) (local.get $end)))
            (local.set $xv (v128.load64_splat (local.get $q)))
            (local.set $ey (f64.sub (f64.load (i32.add (local.get $q) (local.get $ys))) (local.get $cy)))
            (local.set $e2 (f64x2.splat (f64.mul (local.get $ey) (local.get $ey))))
            (local.set $zv (v128.load64_splat (i32.add (local.get $q) (local.get $zs))))
            (local.set $e (f64x2.sub (local.get $xv) (local.get $c01)))
            (local.set $w (f64x2.div (v128.const f64x2 1 1)
              (f64x2.add (f64x2.mul (local.get $e) (local.get $e)) (local.get $e2))))
            (local.set $s01 (f64x2.add (local.get $s01) (local.get $w)))
            (local.set $t01 (f64x2.add (local.get $t01) (f64x2.mul (local.get $w) (local.get $zv))))
            (local.set $e (f64x2.sub (local.get $xv) (local.get $c23)))
            (local.set $w (f64x2.div (v128.const f64x2 1 1)
              (f64x2.add (f64x2.mul (local.get $e) (local.get $e)) (local.get $e2))))
            (local.set $s23 (f64x2.add (local.get $s23) (local.get $w)))
            (local.set $t23 (f64x2.add (local.get $t23) (f64x2.mul (local.get $w) (local.get $zv))))
            (local.set $q (i32.add (local.get $q) (i32.const 8)))
            (br $sites)))
        (v128.store (i32.add (local.get $out) (i32.shl (local.get $i) (i32.const 3)))
          (f64x2.div (local.get $t01) (local.get $s01)))
        (v128.store (i32.add (local.get $out) (i32.add (i32.shl (local.get $i) (i32.const 3)) (i32.const 16)))
          (f64x2.div (local.get $t23) (local.get $s23)))
        (v128.store (i32.add (local.get $sw) (i32.shl (local.get $i) (i32.const 3))) (local.get $s01))
        (v128.store (i32.add (local.get $sw) (i32.add (i32.shl (local.get $i) (i32.const 3)) (i32.const 16)))
          (local.get $s23))
        (local.set $i (i32.add (local.get $i) (i32.const 4)))
        (br $cells)))))
