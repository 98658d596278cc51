;; Dense kernels of the supernodal Cholesky, WebAssembly SIMD (f64x2).
;; Regenerate src/linalg/wasm-kernels.ts with: node src/linalg/build-kernels.mjs
;;
;; All addresses are BYTE offsets into the imported memory; panels are column-major.
(module
  (import "env" "mem" (memory 1))

  ;; C (m4 × k4, column-major, leading dimension m4) = X · Yᵀ on the lower block triangle,
  ;; where X is rows 0 … m4-1 and Y rows 0 … k4-1 of a panel kk columns deep that starts at
  ;; px with column stride ld (bytes). m4 and k4 are multiples of 4; only 4 × 4 tiles whose
  ;; first row is ≥ their first column are computed. The caller pads memory so rows read past
  ;; the real panel are finite values it then ignores.
  ;; Each tile keeps its 4 × 4 sums in eight f64x2 registers over the whole depth, so per
  ;; depth step it loads two vectors of X and four scalars of Y for sixteen multiply-adds.
  (func $syrk (export "syrk") (param $px i32) (param $ld i32) (param $m4 i32) (param $k4 i32) (param $kk i32) (param $pc i32)
    (local $j i32) (local $i i32) (local $q i32)
    (local $ax i32) (local $ay i32) (local $cc i32) (local $ldc i32)
    (local $c00 v128) (local $c10 v128) (local $c01 v128) (local $c11 v128)
    (local $c02 v128) (local $c12 v128) (local $c03 v128) (local $c13 v128)
    (local $x0 v128) (local $x1 v128) (local $y v128)
    (local.set $ldc (i32.shl (local.get $m4) (i32.const 3)))
    (local.set $j (i32.const 0))
    (block $jdone
      (loop $jloop
        (br_if $jdone (i32.ge_u (local.get $j) (local.get $k4)))
        (local.set $i (local.get $j))
        (block $idone
          (loop $iloop
            (br_if $idone (i32.ge_u (local.get $i) (local.get $m4)))
            (local.set $c00 (v128.const f64x2 0 0)) (local.set $c10 (v128.const f64x2 0 0))
            (local.set $c01 (v128.const f64x2 0 0)) (local.set $c11 (v128.const f64x2 0 0))
            (local.set $c02 (v128.const f64x2 0 0)) (local.set $c12 (v128.const f64x2 0 0))
            (local.set $c03 (v128.const f64x2 0 0)) (local.set $c13 (v128.const f64x2 0 0))
            (local.set $ax (i32.add (local.get $px) (i32.shl (local.get $i) (i32.const 3))))
            (local.set $ay (i32.add (local.get $px) (i32.shl (local.get $j) (i32.const 3))))
            (local.set $q (local.get $kk))
            (if (i32.gt_s (local.get $q) (i32.const 0))
              (then
                (loop $qloop
                  (local.set $x0 (v128.load (local.get $ax)))
                  (local.set $x1 (v128.load offset=16 (local.get $ax)))
                  (local.set $y (v128.load64_splat (local.get $ay)))
                  (local.set $c00 (f64x2.add (local.get $c00) (f64x2.mul (local.get $x0) (local.get $y))))
                  (local.set $c10 (f64x2.add (local.get $c10) (f64x2.mul (local.get $x1) (local.get $y))))
                  (local.set $y (v128.load64_splat offset=8 (local.get $ay)))
                  (local.set $c01 (f64x2.add (local.get $c01) (f64x2.mul (local.get $x0) (local.get $y))))
                  (local.set $c11 (f64x2.add (local.get $c11) (f64x2.mul (local.get $x1) (local.get $y))))
                  (local.set $y (v128.load64_splat offset=16 (local.get $ay)))
                  (local.set $c02 (f64x2.add (local.get $c02) (f64x2.mul (local.get $x0) (local.get $y))))
                  (local.set $c12 (f64x2.add (local.get $c12) (f64x2.mul (local.get $x1) (local.get $y))))
                  (local.set $y (v128.load64_splat offset=24 (local.get $ay)))
                  (local.set $c03 (f64x2.add (local.get $c03) (f64x2.mul (local.get $x0) (local.get $y))))
                  (local.set $c13 (f64x2.add (local.get $c13) (f64x2.mul (local.get $x1) (local.get $y))))
                  (local.set $ax (i32.add (local.get $ax) (local.get $ld)))
                  (local.set $ay (i32.add (local.get $ay) (local.get $ld)))
                  (local.set $q (i32.sub (local.get $q) (i32.const 1)))
                  (br_if $qloop (local.get $q)))))
            (local.set $cc (i32.add (local.get $pc)
              (i32.shl (i32.add (i32.mul (local.get $j) (local.get $m4)) (local.get $i)) (i32.const 3))))
            (v128.store (local.get $cc) (local.get $c00))
            (v128.store offset=16 (local.get $cc) (local.get $c10))
            (local.set $cc (i32.add (local.get $cc) (local.get $ldc)))
            (v128.store (local.get $cc) (local.get $c01))
            (v128.store offset=16 (local.get $cc) (local.get $c11))
            (local.set $cc (i32.add (local.get $cc) (local.get $ldc)))
            (v128.store (local.get $cc) (local.get $c02))
            (v128.store offset=16 (local.get $cc) (local.get $c12))
            (local.set $cc (i32.add (local.get $cc) (local.get $ldc)))
            (v128.store (local.get $cc) (local.get $c03))
            (v128.store offset=16 (local.get $cc) (local.get $c13))
            (local.set $i (i32.add (local.get $i) (i32.const 4)))
            (br $iloop)))
        (local.set $j (i32.add (local.get $j) (i32.const 4)))
        (br $jloop))))

  ;; Scatter-subtract C (leading dimension m4) into a target panel: for column jj < k and
  ;; row ii = jj … m-1, mem[colAddr[jj] + rowOff[ii]] -= C[ii + jj·m4]. colAddr (at pcol) holds
  ;; the byte address of each target column, rowOff (at prow) each row's byte offset in it.
  (func (export "scatter") (param $pc i32) (param $m4 i32) (param $m i32) (param $k i32) (param $prow i32) (param $pcol i32)
    (local $jj i32) (local $ii i32) (local $dst i32) (local $src i32) (local $a i32)
    (local.set $jj (i32.const 0))
    (block $jdone
      (loop $jloop
        (br_if $jdone (i32.ge_u (local.get $jj) (local.get $k)))
        (local.set $dst (i32.load (i32.add (local.get $pcol) (i32.shl (local.get $jj) (i32.const 2)))))
        (local.set $src (i32.add (local.get $pc)
          (i32.shl (i32.add (i32.mul (local.get $jj) (local.get $m4)) (local.get $jj)) (i32.const 3))))
        (local.set $ii (local.get $jj))
        (block $idone
          (loop $iloop
            (br_if $idone (i32.ge_u (local.get $ii) (local.get $m)))
            (local.set $a (i32.add (local.get $dst)
              (i32.load (i32.add (local.get $prow) (i32.shl (local.get $ii) (i32.const 2))))))
            (f64.store (local.get $a) (f64.sub (f64.load (local.get $a)) (f64.load (local.get $src))))
            (local.set $src (i32.add (local.get $src) (i32.const 8)))
            (local.set $ii (i32.add (local.get $ii) (i32.const 1)))
            (br $iloop)))
        (local.set $jj (i32.add (local.get $jj) (i32.const 1)))
        (br $jloop))))

  ;; dst[i] -= src[i] · a for i < count (byte addresses; pairs as f64x2, then the odd one)
  (func $axpyNeg (param $dst i32) (param $src i32) (param $a f64) (param $count i32)
    (local $va v128) (local $end i32)
    (local.set $va (f64x2.splat (local.get $a)))
    (local.set $end (i32.add (local.get $dst) (i32.shl (i32.and (local.get $count) (i32.const -2)) (i32.const 3))))
    (block $done
      (loop $pairs
        (br_if $done (i32.ge_u (local.get $dst) (local.get $end)))
        (v128.store (local.get $dst)
          (f64x2.sub (v128.load (local.get $dst)) (f64x2.mul (v128.load (local.get $src)) (local.get $va))))
        (local.set $dst (i32.add (local.get $dst) (i32.const 16)))
        (local.set $src (i32.add (local.get $src) (i32.const 16)))
        (br $pairs)))
    (if (i32.and (local.get $count) (i32.const 1))
      (then (f64.store (local.get $dst)
        (f64.sub (f64.load (local.get $dst)) (f64.mul (f64.load (local.get $src)) (local.get $a)))))))

  ;; dst[i] -= src[i] for i < count
  (func $subtract (param $dst i32) (param $src i32) (param $count i32)
    (local $end i32)
    (local.set $end (i32.add (local.get $dst) (i32.shl (i32.and (local.get $count) (i32.const -2)) (i32.const 3))))
    (block $done
      (loop $pairs
        (br_if $done (i32.ge_u (local.get $dst) (local.get $end)))
        (v128.store (local.get $dst) (f64x2.sub (v128.load (local.get $dst)) (v128.load (local.get $src))))
        (local.set $dst (i32.add (local.get $dst) (i32.const 16)))
        (local.set $src (i32.add (local.get $src) (i32.const 16)))
        (br $pairs)))
    (if (i32.and (local.get $count) (i32.const 1))
      (then (f64.store (local.get $dst) (f64.sub (f64.load (local.get $dst)) (f64.load (local.get $src)))))))

  ;; dst[i] *= a for i < count
  (func $scale (param $dst i32) (param $a f64) (param $count i32)
    (local $va v128) (local $end i32)
    (local.set $va (f64x2.splat (local.get $a)))
    (local.set $end (i32.add (local.get $dst) (i32.shl (i32.and (local.get $count) (i32.const -2)) (i32.const 3))))
    (block $done
      (loop $pairs
        (br_if $done (i32.ge_u (local.get $dst) (local.get $end)))
        (v128.store (local.get $dst) (f64x2.mul (v128.load (local.get $dst)) (local.get $va)))
        (local.set $dst (i32.add (local.get $dst) (i32.const 16)))
        (br $pairs)))
    (if (i32.and (local.get $count) (i32.const 1))
      (then (f64.store (local.get $dst) (f64.mul (f64.load (local.get $dst)) (local.get $a))))))

  ;; Dense Cholesky of an nr × nc panel at pa (column-major, leading dimension nr): the top
  ;; nc × nc block becomes L11, the rows below L21 = A21 L11⁻ᵀ. Blocked left-looking in blocks
  ;; of 4 columns: each block takes the update of all earlier columns through syrk (into the
  ;; work block at pw), then is factored column by column. ptol holds, per column, the
  ;; smallest pivot accepted; returns the first column whose pivot fails, or -1.
  (func (export "panel") (param $pa i32) (param $nr i32) (param $nc i32) (param $ptol i32) (param $pw i32) (result i32)
    (local $j0 i32) (local $jb i32) (local $m i32) (local $m4 i32) (local $t i32)
    (local $j i32) (local $q i32) (local $cj i32) (local $cq i32) (local $ld i32)
    (local $d f64) (local $r f64)
    (local.set $ld (i32.shl (local.get $nr) (i32.const 3)))
    (local.set $j0 (i32.const 0))
    (block $blocksDone
      (loop $blocks
        (br_if $blocksDone (i32.ge_s (local.get $j0) (local.get $nc)))
        (local.set $jb (i32.sub (local.get $nc) (local.get $j0)))
        (if (i32.gt_s (local.get $jb) (i32.const 4)) (then (local.set $jb (i32.const 4))))
        (local.set $m (i32.sub (local.get $nr) (local.get $j0)))
        (if (i32.gt_s (local.get $j0) (i32.const 0))
          (then
            (local.set $m4 (i32.and (i32.add (local.get $m) (i32.const 3)) (i32.const -4)))
            (call $syrk (i32.add (local.get $pa) (i32.shl (local.get $j0) (i32.const 3)))
              (local.get $ld) (local.get $m4) (i32.const 4) (local.get $j0) (local.get $pw))
            (local.set $t (i32.const 0))
            (block $subDone
              (loop $sub
                (br_if $subDone (i32.ge_s (local.get $t) (local.get $jb)))
                ;; column j0+t, rows j0+t … nr-1  -=  work column t, rows t … m-1
                (call $subtract
                  (i32.add (local.get $pa) (i32.shl
                    (i32.add (i32.mul (i32.add (local.get $j0) (local.get $t)) (local.get $nr))
                             (i32.add (local.get $j0) (local.get $t))) (i32.const 3)))
                  (i32.add (local.get $pw) (i32.shl
                    (i32.add (i32.mul (local.get $t) (local.get $m4)) (local.get $t)) (i32.const 3)))
                  (i32.sub (local.get $m) (local.get $t)))
                (local.set $t (i32.add (local.get $t) (i32.const 1)))
                (br $sub)))))
        (local.set $j (local.get $j0))
        (block $colsDone
          (loop $cols
            (br_if $colsDone (i32.ge_s (local.get $j) (i32.add (local.get $j0) (local.get $jb))))
            (local.set $cj (i32.add (local.get $pa) (i32.mul (local.get $j) (local.get $ld))))
            (local.set $q (local.get $j0))
            (block $qDone
              (loop $qs
                (br_if $qDone (i32.ge_s (local.get $q) (local.get $j)))
                (local.set $cq (i32.add (local.get $pa) (i32.mul (local.get $q) (local.get $ld))))
                (call $axpyNeg
                  (i32.add (local.get $cj) (i32.shl (local.get $j) (i32.const 3)))
                  (i32.add (local.get $cq) (i32.shl (local.get $j) (i32.const 3)))
                  (f64.load (i32.add (local.get $cq) (i32.shl (local.get $j) (i32.const 3))))
                  (i32.sub (local.get $nr) (local.get $j)))
                (local.set $q (i32.add (local.get $q) (i32.const 1)))
                (br $qs)))
            (local.set $d (f64.load (i32.add (local.get $cj) (i32.shl (local.get $j) (i32.const 3)))))
            (if (i32.eqz (i32.and
                  (f64.gt (local.get $d) (f64.load (i32.add (local.get $ptol) (i32.shl (local.get $j) (i32.const 3)))))
                  (f64.gt (local.get $d) (f64.const 0))))
              (then (return (local.get $j))))
            (local.set $r (f64.sqrt (local.get $d)))
            (f64.store (i32.add (local.get $cj) (i32.shl (local.get $j) (i32.const 3))) (local.get $r))
            (call $scale
              (i32.add (local.get $cj) (i32.shl (i32.add (local.get $j) (i32.const 1)) (i32.const 3)))
              (f64.div (f64.const 1) (local.get $r))
              (i32.sub (i32.sub (local.get $nr) (local.get $j)) (i32.const 1)))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $cols)))
        (local.set $j0 (i32.add (local.get $j0) (i32.const 4)))
        (br $blocks)))
    (i32.const -1))
)
