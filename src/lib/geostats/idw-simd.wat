;; The fast pass of idwEverySitePower2Rows (src/lib/geostats/idw.ts) with 128-bit SIMD: for one
;; row, eight cells per pass over all sites (four f64x2 vectors of two cells: each site's x, y, z
;; is loaded once for eight cells), w = 1/d², with the same operations in the same order as the
;; JavaScript pass, so each cell's sums are bit-identical. Cells after the last group of eight
;; are left to the JavaScript pass.
;; Memory: xs at 0, ys at 8n, zs at 16n (n doubles each); the row's results go to `out`
;; (Σw·z / Σw per cell) and its Σw to `sw` (the caller flags Σw ≥ 1/HIT_D2 for the careful pass).
;; Built to idw-simd.wasm.ts by scripts/build-wasm.js (npm run build:wasm).
(module
  (memory (export "memory") 1)
  (func (export "row")
    (param $n i32) (param $nx i32) (param $x0 f64) (param $dx f64) (param $cy f64)
    (param $out i32) (param $sw i32)
    (local $i i32) (local $q i32) (local $ys i32) (local $zs i32) (local $o i32) (local $p i32)
    (local $xv v128) (local $e2 v128) (local $zv v128) (local $ey f64) (local $fi f64)
    ;; per vector v: cell centres c, sums s (Σw) and t (Σw·z), weight w
    (local $c0 v128) (local $s0 v128) (local $t0 v128) (local $w0 v128)
    (local $c1 v128) (local $s1 v128) (local $t1 v128) (local $w1 v128)
    (local $c2 v128) (local $s2 v128) (local $t2 v128) (local $w2 v128)
    (local $c3 v128) (local $s3 v128) (local $t3 v128) (local $w3 v128)
    (local.set $ys (i32.shl (local.get $n) (i32.const 3)))
    (local.set $zs (i32.shl (local.get $n) (i32.const 4)))
    (block $rowdone
      (loop $cells
        (br_if $rowdone (i32.gt_s (i32.add (local.get $i) (i32.const 8)) (local.get $nx)))
        (local.set $fi (f64.convert_i32_s (local.get $i)))
        ;; c = x0 + (i + k + 0.5) · dx, as the JavaScript; sums from zero
        (local.set $c0 (f64x2.replace_lane 1
          (f64x2.splat (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 0.5)) (local.get $dx))))
          (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 1.5)) (local.get $dx)))))
        (local.set $s0 (v128.const f64x2 0 0))
        (local.set $t0 (v128.const f64x2 0 0))
        (local.set $c1 (f64x2.replace_lane 1
          (f64x2.splat (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 2.5)) (local.get $dx))))
          (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 3.5)) (local.get $dx)))))
        (local.set $s1 (v128.const f64x2 0 0))
        (local.set $t1 (v128.const f64x2 0 0))
        (local.set $c2 (f64x2.replace_lane 1
          (f64x2.splat (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 4.5)) (local.get $dx))))
          (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 5.5)) (local.get $dx)))))
        (local.set $s2 (v128.const f64x2 0 0))
        (local.set $t2 (v128.const f64x2 0 0))
        (local.set $c3 (f64x2.replace_lane 1
          (f64x2.splat (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 6.5)) (local.get $dx))))
          (f64.add (local.get $x0) (f64.mul (f64.add (local.get $fi) (f64.const 7.5)) (local.get $dx)))))
        (local.set $s3 (v128.const f64x2 0 0))
        (local.set $t3 (v128.const f64x2 0 0))
        (local.set $q (i32.const 0))
        (block $sitesdone
          (loop $sites
            (br_if $sitesdone (i32.ge_u (local.get $q) (local.get $ys)))
            (local.set $xv (v128.load64_splat (local.get $q)))
            (local.set $ey (f64.sub (f64.load (i32.add (local.get $q) (local.get $ys))) (local.get $cy)))
            (local.set $e2 (f64x2.splat (f64.mul (local.get $ey) (local.get $ey))))
            (local.set $zv (v128.load64_splat (i32.add (local.get $q) (local.get $zs))))
            ;; e = x − c; w = 1 / (e·e + ey²); s += w; t += w·z
            (local.set $w0 (f64x2.sub (local.get $xv) (local.get $c0)))
            (local.set $w0 (f64x2.div (v128.const f64x2 1 1)
              (f64x2.add (f64x2.mul (local.get $w0) (local.get $w0)) (local.get $e2))))
            (local.set $w1 (f64x2.sub (local.get $xv) (local.get $c1)))
            (local.set $w1 (f64x2.div (v128.const f64x2 1 1)
              (f64x2.add (f64x2.mul (local.get $w1) (local.get $w1)) (local.get $e2))))
            (local.set $w2 (f64x2.sub (local.get $xv) (local.get $c2)))
            (local.set $w2 (f64x2.div (v128.const f64x2 1 1)
              (f64x2.add (f64x2.mul (local.get $w2) (local.get $w2)) (local.get $e2))))
            (local.set $w3 (f64x2.sub (local.get $xv) (local.get $c3)))
            (local.set $w3 (f64x2.div (v128.const f64x2 1 1)
              (f64x2.add (f64x2.mul (local.get $w3) (local.get $w3)) (local.get $e2))))
            (local.set $s0 (f64x2.add (local.get $s0) (local.get $w0)))
            (local.set $t0 (f64x2.add (local.get $t0) (f64x2.mul (local.get $w0) (local.get $zv))))
            (local.set $s1 (f64x2.add (local.get $s1) (local.get $w1)))
            (local.set $t1 (f64x2.add (local.get $t1) (f64x2.mul (local.get $w1) (local.get $zv))))
            (local.set $s2 (f64x2.add (local.get $s2) (local.get $w2)))
            (local.set $t2 (f64x2.add (local.get $t2) (f64x2.mul (local.get $w2) (local.get $zv))))
            (local.set $s3 (f64x2.add (local.get $s3) (local.get $w3)))
            (local.set $t3 (f64x2.add (local.get $t3) (f64x2.mul (local.get $w3) (local.get $zv))))
            (local.set $q (i32.add (local.get $q) (i32.const 8)))
            (br $sites)))
        (local.set $o (i32.add (local.get $out) (i32.shl (local.get $i) (i32.const 3))))
        (local.set $p (i32.add (local.get $sw) (i32.shl (local.get $i) (i32.const 3))))
        (v128.store offset=0 (local.get $o) (f64x2.div (local.get $t0) (local.get $s0)))
        (v128.store offset=0 (local.get $p) (local.get $s0))
        (v128.store offset=16 (local.get $o) (f64x2.div (local.get $t1) (local.get $s1)))
        (v128.store offset=16 (local.get $p) (local.get $s1))
        (v128.store offset=32 (local.get $o) (f64x2.div (local.get $t2) (local.get $s2)))
        (v128.store offset=32 (local.get $p) (local.get $s2))
        (v128.store offset=48 (local.get $o) (f64x2.div (local.get $t3) (local.get $s3)))
        (v128.store offset=48 (local.get $p) (local.get $s3))
        (local.set $i (i32.add (local.get $i) (i32.const 8)))
        (br $cells)))))
