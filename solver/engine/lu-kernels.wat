;; The sparse LU's hot kernels as WebAssembly, for the sweep: the engine calls them through
;; solver/engine/lu-wasm.ts. Every array is a byte offset into the imported memory, laid out by
;; `KernelSpace` (lu-wasm.ts): Int32 arrays 4 bytes an entry, Float64 arrays 8, complex numbers as
;; two Float64 side by side (as `LUFactors.fac`). Each kernel does the arithmetic of the TypeScript
;; it replaced in the same order (IEEE doubles, no fused multiply-add in WebAssembly): the same
;; numbers bit for bit. Assembled by scripts/build-wasm.mjs into lu-kernels-wasm.ts.
;;
;; eliminate: the up-looking elimination over the plan's slots, after every slot holds its entry of
;; A, with the pivot tests and (fwd ≠ 0) the forward substitution of b into w; see `eliminate` in
;; sparse-lu-numeric.ts. Returns the step whose pivot failed a test, or −1.
;; backward: U·z = y (y in w) over the given steps, x = Q·z there; 1 when every z is finite.
;; forwardOfProduct: L·y = −P·M·v into w (M real, in CSR). Both as in sparse-lu-solve.ts.
;; transposed: Uᵀ·y = w forward from step `first`, then Lᵀ·v = y backward, in w, steps whose
;; entry is zero skipped (sparse-lu-solve.ts `solveFactorsTransposedInSteps`).
;; The entries a sweep calls per point take the offsets of their arrays from a header at the start
;; of the memory (`KernelSpace` writes it once; byte offsets below): few arguments, since a call from
;; JavaScript converts each one (a generic wrapper, ~10 ns an argument here), and one call per step:
;; factorPencil (load, pencilTests, eliminate), solve (backward), derive (forwardOfProduct, backward),
;; adjoint (transposed); eliminate alone for a refactor of given values.
;; load: the factors' slots from G's slot image and ω·C (sparse-lu-numeric.ts `factorPencil`).
;; pencilTests: the pivot tests' maxima at ω from a pencil's kept terms (pencil-maxima.ts).
;; equilibrate: Ruiz's max-norm sweeps in powers of two (equilibrate.ts); returns the largest
;; |re| + |im| of the scaled matrix and leaves the sweep count at `out`.
(module
  (import "env" "memory" (memory 1))
  (func $eliminate
    (param $n i32) (param $lPtr i32) (param $lIdx i32) (param $uPtr i32) (param $uIdx i32)
    (param $rowPerm i32) (param $updStart i32) (param $upd i32)
    (param $fac i32) (param $inv i32) (param $w i32) (param $cm i32) (param $rm i32)
    (param $bRe i32) (param $bIm i32) (param $offU i32) (param $offD i32)
    (param $tol2 f64) (param $half f64) (param $fwd i32)
    (result i32)
    (local $k i32) (local $l0 i32) (local $l1 i32) (local $u0 i32) (local $u1 i32) (local $dk i32)
    (local $yr f64) (local $yi f64) (local $q i32) (local $j i32) (local $a i32) (local $r i32)
    (local $xr f64) (local $xi f64) (local $ir f64) (local $ii f64) (local $lr f64) (local $li f64)
    (local $wr f64) (local $wi f64) (local $t i32) (local $m i32) (local $m1 i32) (local $c i32)
    (local $ur f64) (local $ui f64) (local $pr f64) (local $pi f64) (local $d f64) (local $ck f64) (local $hk f64)
    (local $small i32) (local $mm f64) (local $id f64)
    (local.set $u0 (local.get $offU))
    (block $done
      (loop $rows
        (br_if $done (i32.ge_s (local.get $k) (local.get $n)))
        (local.set $l1 (i32.load (i32.add (local.get $lPtr) (i32.shl (i32.add (local.get $k) (i32.const 1)) (i32.const 2)))))
        (local.set $u1 (i32.add (local.get $offU) (i32.load (i32.add (local.get $uPtr) (i32.shl (i32.add (local.get $k) (i32.const 1)) (i32.const 2))))))
        (local.set $dk (i32.add (local.get $fac) (i32.shl (i32.add (local.get $offD) (local.get $k)) (i32.const 4))))
        (local.set $yr (f64.const 0))
        (local.set $yi (f64.const 0))
        (if (local.get $fwd) (then
          (local.set $r (i32.load (i32.add (local.get $rowPerm) (i32.shl (local.get $k) (i32.const 2)))))
          (local.set $yr (f64.load (i32.add (local.get $bRe) (i32.shl (local.get $r) (i32.const 3)))))
          (local.set $yi (f64.load (i32.add (local.get $bIm) (i32.shl (local.get $r) (i32.const 3)))))))
        (local.set $q (local.get $l0))
        (block $lend
          (loop $lq
            (br_if $lend (i32.ge_s (local.get $q) (local.get $l1)))
            (local.set $j (i32.load (i32.add (local.get $lIdx) (i32.shl (local.get $q) (i32.const 2)))))
            (local.set $a (i32.add (local.get $fac) (i32.shl (local.get $q) (i32.const 4))))
            (local.set $xr (f64.load (local.get $a)))
            (local.set $xi (f64.load offset=8 (local.get $a)))
            (local.set $r (i32.add (local.get $inv) (i32.shl (local.get $j) (i32.const 4))))
            (local.set $ir (f64.load (local.get $r)))
            (local.set $ii (f64.load offset=8 (local.get $r)))
            (local.set $lr (f64.sub (f64.mul (local.get $xr) (local.get $ir)) (f64.mul (local.get $xi) (local.get $ii))))
            (local.set $li (f64.add (f64.mul (local.get $xr) (local.get $ii)) (f64.mul (local.get $xi) (local.get $ir))))
            (f64.store (local.get $a) (local.get $lr))
            (f64.store offset=8 (local.get $a) (local.get $li))
            (if (local.get $fwd) (then
              (local.set $r (i32.add (local.get $w) (i32.shl (local.get $j) (i32.const 4))))
              (local.set $wr (f64.load (local.get $r)))
              (local.set $wi (f64.load offset=8 (local.get $r)))
              (local.set $yr (f64.sub (local.get $yr) (f64.sub (f64.mul (local.get $lr) (local.get $wr)) (f64.mul (local.get $li) (local.get $wi)))))
              (local.set $yi (f64.sub (local.get $yi) (f64.add (f64.mul (local.get $lr) (local.get $wi)) (f64.mul (local.get $li) (local.get $wr)))))))
            (if (i32.eqz (i32.and (f64.eq (local.get $lr) (f64.const 0)) (f64.eq (local.get $li) (f64.const 0)))) (then
              (local.set $t (i32.add (local.get $fac) (i32.shl (i32.add (local.get $offU) (i32.load (i32.add (local.get $uPtr) (i32.shl (local.get $j) (i32.const 2))))) (i32.const 4))))
              (local.set $m (i32.add (local.get $upd) (i32.shl (i32.load (i32.add (local.get $updStart) (i32.shl (local.get $q) (i32.const 2)))) (i32.const 2))))
              (local.set $m1 (i32.add (local.get $upd) (i32.shl (i32.load (i32.add (local.get $updStart) (i32.shl (i32.add (local.get $q) (i32.const 1)) (i32.const 2)))) (i32.const 2))))
              (block $uend
                (loop $um
                  (br_if $uend (i32.ge_u (local.get $m) (local.get $m1)))
                  (local.set $c (i32.add (local.get $fac) (i32.shl (i32.load (local.get $m)) (i32.const 4))))
                  (local.set $ur (f64.load (local.get $t)))
                  (local.set $ui (f64.load offset=8 (local.get $t)))
                  (f64.store (local.get $c) (f64.sub (f64.load (local.get $c)) (f64.sub (f64.mul (local.get $lr) (local.get $ur)) (f64.mul (local.get $li) (local.get $ui)))))
                  (f64.store offset=8 (local.get $c) (f64.sub (f64.load offset=8 (local.get $c)) (f64.add (f64.mul (local.get $lr) (local.get $ui)) (f64.mul (local.get $li) (local.get $ur)))))
                  (local.set $m (i32.add (local.get $m) (i32.const 4)))
                  (local.set $t (i32.add (local.get $t) (i32.const 16)))
                  (br $um)))))
            (local.set $q (i32.add (local.get $q) (i32.const 1)))
            (br $lq)))
        (local.set $pr (f64.load (local.get $dk)))
        (local.set $pi (f64.load offset=8 (local.get $dk)))
        (local.set $d (f64.add (f64.mul (local.get $pr) (local.get $pr)) (f64.mul (local.get $pi) (local.get $pi))))
        (local.set $ck (f64.load (i32.add (local.get $cm) (i32.shl (local.get $k) (i32.const 3)))))
        (local.set $hk (f64.mul (local.get $half) (local.get $ck)))
        (local.set $small (f64.le (local.get $d) (f64.mul (f64.mul (local.get $tol2) (f64.load (i32.add (local.get $rm) (i32.shl (local.get $k) (i32.const 3))))) (local.get $ck))))
        (local.set $t (local.get $u0))
        (block $tend
          (loop $tl
            (br_if $tend (i32.or (local.get $small) (i32.ge_s (local.get $t) (local.get $u1))))
            (local.set $r (i32.add (local.get $fac) (i32.shl (local.get $t) (i32.const 4))))
            (local.set $mm (f64.add (f64.abs (f64.load (local.get $r))) (f64.abs (f64.load offset=8 (local.get $r)))))
            (if (f64.lt
                  (f64.mul (local.get $d) (f64.load (i32.add (local.get $cm) (i32.shl (i32.load (i32.add (local.get $uIdx) (i32.shl (i32.sub (local.get $t) (local.get $offU)) (i32.const 2)))) (i32.const 3)))))
                  (f64.mul (f64.mul (local.get $hk) (local.get $mm)) (local.get $mm)))
              (then (local.set $small (i32.const 1))))
            (local.set $t (i32.add (local.get $t) (i32.const 1)))
            (br $tl)))
        (local.set $l0 (local.get $l1))
        (local.set $u0 (local.get $u1))
        (if (local.get $small) (then (return (local.get $k))))
        (local.set $id (f64.div (f64.const 1) (local.get $d)))
        (local.set $r (i32.add (local.get $inv) (i32.shl (local.get $k) (i32.const 4))))
        (f64.store (local.get $r) (f64.mul (local.get $pr) (local.get $id)))
        (f64.store offset=8 (local.get $r) (f64.mul (f64.neg (local.get $pi)) (local.get $id)))
        (local.set $r (i32.add (local.get $w) (i32.shl (local.get $k) (i32.const 4))))
        (f64.store (local.get $r) (local.get $yr))
        (f64.store offset=8 (local.get $r) (local.get $yi))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $rows)))
    (i32.const -1))
  (func $backward
    (param $nsteps i32) (param $steps i32) (param $colPerm i32) (param $uPtr i32) (param $uIdx i32)
    (param $facU i32) (param $inv i32) (param $w i32) (param $xRe i32) (param $xIm i32)
    (result i32)
    (local $i i32) (local $k i32) (local $t i32) (local $t1 i32) (local $a i32) (local $b i32) (local $c i32)
    (local $yr f64) (local $yi f64) (local $ur f64) (local $ui f64) (local $wr f64) (local $wi f64)
    (local $ir f64) (local $ii f64) (local $zr f64) (local $zi f64) (local $finite f64)
    (block $done
      (loop $steps
        (br_if $done (i32.ge_s (local.get $i) (local.get $nsteps)))
        (local.set $k (i32.load (i32.add (local.get $steps) (i32.shl (local.get $i) (i32.const 2)))))
        (local.set $b (i32.add (local.get $w) (i32.shl (local.get $k) (i32.const 4))))
        (local.set $yr (f64.load (local.get $b)))
        (local.set $yi (f64.load offset=8 (local.get $b)))
        (local.set $a (i32.add (local.get $uPtr) (i32.shl (local.get $k) (i32.const 2))))
        (local.set $t (i32.load (local.get $a)))
        (local.set $t1 (i32.load offset=4 (local.get $a)))
        (block $uend
          (loop $u
            (br_if $uend (i32.ge_s (local.get $t) (local.get $t1)))
            (local.set $c (i32.add (local.get $w) (i32.shl (i32.load (i32.add (local.get $uIdx) (i32.shl (local.get $t) (i32.const 2)))) (i32.const 4))))
            (local.set $a (i32.add (local.get $facU) (i32.shl (local.get $t) (i32.const 4))))
            (local.set $ur (f64.load (local.get $a)))
            (local.set $ui (f64.load offset=8 (local.get $a)))
            (local.set $wr (f64.load (local.get $c)))
            (local.set $wi (f64.load offset=8 (local.get $c)))
            (local.set $yr (f64.sub (local.get $yr) (f64.sub (f64.mul (local.get $ur) (local.get $wr)) (f64.mul (local.get $ui) (local.get $wi)))))
            (local.set $yi (f64.sub (local.get $yi) (f64.add (f64.mul (local.get $ur) (local.get $wi)) (f64.mul (local.get $ui) (local.get $wr)))))
            (local.set $t (i32.add (local.get $t) (i32.const 1)))
            (br $u)))
        (local.set $a (i32.add (local.get $inv) (i32.shl (local.get $k) (i32.const 4))))
        (local.set $ir (f64.load (local.get $a)))
        (local.set $ii (f64.load offset=8 (local.get $a)))
        (local.set $zr (f64.sub (f64.mul (local.get $yr) (local.get $ir)) (f64.mul (local.get $yi) (local.get $ii))))
        (local.set $zi (f64.add (f64.mul (local.get $yr) (local.get $ii)) (f64.mul (local.get $yi) (local.get $ir))))
        (f64.store (local.get $b) (local.get $zr))
        (f64.store offset=8 (local.get $b) (local.get $zi))
        (local.set $c (i32.shl (i32.load (i32.add (local.get $colPerm) (i32.shl (local.get $k) (i32.const 2)))) (i32.const 3)))
        (f64.store (i32.add (local.get $xRe) (local.get $c)) (local.get $zr))
        (f64.store (i32.add (local.get $xIm) (local.get $c)) (local.get $zi))
        (local.set $finite (f64.add (local.get $finite) (f64.add (f64.mul (local.get $zr) (f64.const 0)) (f64.mul (local.get $zi) (f64.const 0)))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $steps)))
    (f64.eq (local.get $finite) (f64.const 0)))

  (func $forwardOfProduct
    (param $n i32) (param $rowPerm i32) (param $lPtr i32) (param $lIdx i32) (param $fac i32) (param $w i32)
    (param $ptr i32) (param $idx i32) (param $val i32) (param $vRe i32) (param $vIm i32)
    (local $k i32) (local $r i32) (local $p i32) (local $p1 i32) (local $q i32) (local $q0 i32) (local $q1 i32)
    (local $a i32) (local $c i32)
    (local $yr f64) (local $yi f64) (local $mv f64) (local $lr f64) (local $li f64) (local $wr f64) (local $wi f64)
    (block $done
      (loop $rows
        (br_if $done (i32.ge_s (local.get $k) (local.get $n)))
        (local.set $r (i32.load (i32.add (local.get $rowPerm) (i32.shl (local.get $k) (i32.const 2)))))
        (local.set $yr (f64.const 0))
        (local.set $yi (f64.const 0))
        (local.set $a (i32.add (local.get $ptr) (i32.shl (local.get $r) (i32.const 2))))
        (local.set $p (i32.load (local.get $a)))
        (local.set $p1 (i32.load offset=4 (local.get $a)))
        (block $mend
          (loop $m
            (br_if $mend (i32.ge_s (local.get $p) (local.get $p1)))
            (local.set $mv (f64.load (i32.add (local.get $val) (i32.shl (local.get $p) (i32.const 3)))))
            (local.set $c (i32.shl (i32.load (i32.add (local.get $idx) (i32.shl (local.get $p) (i32.const 2)))) (i32.const 3)))
            (local.set $yr (f64.sub (local.get $yr) (f64.mul (local.get $mv) (f64.load (i32.add (local.get $vRe) (local.get $c))))))
            (local.set $yi (f64.sub (local.get $yi) (f64.mul (local.get $mv) (f64.load (i32.add (local.get $vIm) (local.get $c))))))
            (local.set $p (i32.add (local.get $p) (i32.const 1)))
            (br $m)))
        (local.set $q1 (i32.load (i32.add (local.get $lPtr) (i32.shl (i32.add (local.get $k) (i32.const 1)) (i32.const 2)))))
        (local.set $q (local.get $q0))
        (block $lend
          (loop $l
            (br_if $lend (i32.ge_s (local.get $q) (local.get $q1)))
            (local.set $c (i32.add (local.get $w) (i32.shl (i32.load (i32.add (local.get $lIdx) (i32.shl (local.get $q) (i32.const 2)))) (i32.const 4))))
            (local.set $a (i32.add (local.get $fac) (i32.shl (local.get $q) (i32.const 4))))
            (local.set $lr (f64.load (local.get $a)))
            (local.set $li (f64.load offset=8 (local.get $a)))
            (local.set $wr (f64.load (local.get $c)))
            (local.set $wi (f64.load offset=8 (local.get $c)))
            (local.set $yr (f64.sub (local.get $yr) (f64.sub (f64.mul (local.get $lr) (local.get $wr)) (f64.mul (local.get $li) (local.get $wi)))))
            (local.set $yi (f64.sub (local.get $yi) (f64.add (f64.mul (local.get $lr) (local.get $wi)) (f64.mul (local.get $li) (local.get $wr)))))
            (local.set $q (i32.add (local.get $q) (i32.const 1)))
            (br $l)))
        (local.set $q0 (local.get $q1))
        (local.set $a (i32.add (local.get $w) (i32.shl (local.get $k) (i32.const 4))))
        (f64.store (local.get $a) (local.get $yr))
        (f64.store offset=8 (local.get $a) (local.get $yi))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $rows))))
  ;; 2^k for −1022 ≤ k ≤ 1023: the high word (k + 1023) << 20, the low word 0.
  (func $pow2 (param $k i32) (result f64)
    (f64.reinterpret_i64 (i64.shl (i64.extend_i32_u (i32.shl (i32.add (local.get $k) (i32.const 1023)) (i32.const 20))) (i64.const 32))))

  ;; Each factor times 2^k, k = −((floor(log2 max) + 1) >> 1), where max is outside [1/2, 2), not 0,
  ;; finite and normal; a factor that would become 0 or not finite stays. Returns how many moved.
  (func $rescale (param $factor i32) (param $max i32) (param $n i32) (result i32)
    (local $i i32) (local $moved i32) (local $m f64) (local $f f64) (local $e i32) (local $a i32)
    (block $done
      (loop $each
        (br_if $done (i32.ge_s (local.get $i) (local.get $n)))
        (local.set $m (f64.load (i32.add (local.get $max) (i32.shl (local.get $i) (i32.const 3)))))
        (block $skip
          (br_if $skip (f64.eq (local.get $m) (f64.const 0)))
          (br_if $skip (i32.and (f64.ge (local.get $m) (f64.const 0.5)) (f64.lt (local.get $m) (f64.const 2))))
          (br_if $skip (i32.eqz (f64.lt (local.get $m) (f64.const inf))))
          (br_if $skip (f64.lt (local.get $m) (f64.const 2.3e-308)))
          (local.set $e (i32.sub (i32.and (i32.shr_u (i32.wrap_i64 (i64.shr_u (i64.reinterpret_f64 (local.get $m)) (i64.const 32))) (i32.const 20)) (i32.const 0x7ff)) (i32.const 1023)))
          (local.set $a (i32.add (local.get $factor) (i32.shl (local.get $i) (i32.const 3))))
          (local.set $f (f64.mul (f64.load (local.get $a)) (call $pow2 (i32.sub (i32.const 0) (i32.shr_s (i32.add (local.get $e) (i32.const 1)) (i32.const 1))))))
          (br_if $skip (f64.eq (local.get $f) (f64.const 0)))
          (br_if $skip (i32.eqz (f64.lt (f64.abs (local.get $f)) (f64.const inf))))
          (f64.store (local.get $a) (local.get $f))
          (local.set $moved (i32.add (local.get $moved) (i32.const 1))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $each)))
    (local.get $moved))

  (func (export "equilibrate")
    (param $n i32) (param $rowPtr i32) (param $colIdx i32) (param $re i32) (param $im i32)
    (param $row i32) (param $col i32) (param $rmax i32) (param $cmax i32) (param $maxSweeps i32) (param $out i32)
    (result f64)
    (local $sweep i32) (local $i i32) (local $p i32) (local $p1 i32) (local $j i32) (local $a i32)
    (local $biggest f64) (local $ri f64) (local $m f64) (local $x f64) (local $y f64) (local $v f64)
    (block $sweeps
      (loop $sweepLoop
        (memory.fill (local.get $rmax) (i32.const 0) (i32.shl (local.get $n) (i32.const 3)))
        (memory.fill (local.get $cmax) (i32.const 0) (i32.shl (local.get $n) (i32.const 3)))
        (local.set $biggest (f64.const 0))
        (local.set $i (i32.const 0))
        (block $rowsDone
          (loop $rows
            (br_if $rowsDone (i32.ge_s (local.get $i) (local.get $n)))
            (local.set $ri (f64.load (i32.add (local.get $row) (i32.shl (local.get $i) (i32.const 3)))))
            (local.set $m (f64.const 0))
            (local.set $a (i32.add (local.get $rowPtr) (i32.shl (local.get $i) (i32.const 2))))
            (local.set $p (i32.load (local.get $a)))
            (local.set $p1 (i32.load offset=4 (local.get $a)))
            (block $entriesDone
              (loop $entries
                (br_if $entriesDone (i32.ge_s (local.get $p) (local.get $p1)))
                (local.set $j (i32.load (i32.add (local.get $colIdx) (i32.shl (local.get $p) (i32.const 2)))))
                (local.set $x (f64.load (i32.add (local.get $re) (i32.shl (local.get $p) (i32.const 3)))))
                (local.set $y (f64.load (i32.add (local.get $im) (i32.shl (local.get $p) (i32.const 3)))))
                (local.set $v (f64.mul (f64.mul
                    (f64.add
                      (select (f64.neg (local.get $x)) (local.get $x) (f64.lt (local.get $x) (f64.const 0)))
                      (select (f64.neg (local.get $y)) (local.get $y) (f64.lt (local.get $y) (f64.const 0))))
                    (local.get $ri))
                  (f64.load (i32.add (local.get $col) (i32.shl (local.get $j) (i32.const 3))))))
                (if (f64.gt (local.get $v) (local.get $m)) (then (local.set $m (local.get $v))))
                (local.set $a (i32.add (local.get $cmax) (i32.shl (local.get $j) (i32.const 3))))
                (if (f64.gt (local.get $v) (f64.load (local.get $a))) (then (f64.store (local.get $a) (local.get $v))))
                (local.set $p (i32.add (local.get $p) (i32.const 1)))
                (br $entries)))
            (f64.store (i32.add (local.get $rmax) (i32.shl (local.get $i) (i32.const 3))) (local.get $m))
            (if (f64.gt (local.get $m) (local.get $biggest)) (then (local.set $biggest (local.get $m))))
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br $rows)))
        (i32.store (local.get $out) (local.get $sweep))
        (br_if $sweeps (i32.ge_s (local.get $sweep) (local.get $maxSweeps)))
        ;; Rows and columns from the same scaled matrix (both rescaled, then the test).
        (br_if $sweeps (i32.eqz (i32.add
          (call $rescale (local.get $row) (local.get $rmax) (local.get $n))
          (call $rescale (local.get $col) (local.get $cmax) (local.get $n)))))
        (local.set $sweep (i32.add (local.get $sweep) (i32.const 1)))
        (br $sweepLoop)))
    (local.get $biggest))

  (func $load
    (param $fac i32) (param $slotG i32) (param $bytes i32) (param $cSlots i32) (param $cValues i32) (param $count i32)
    (param $omega f64)
    (local $i i32)
    (memory.copy (local.get $fac) (local.get $slotG) (local.get $bytes))
    (block $done
      (loop $each
        (br_if $done (i32.ge_s (local.get $i) (local.get $count)))
        (f64.store offset=8
          (i32.add (local.get $fac) (i32.shl (i32.load (i32.add (local.get $cSlots) (i32.shl (local.get $i) (i32.const 2)))) (i32.const 4)))
          (f64.mul (local.get $omega) (f64.load (i32.add (local.get $cValues) (i32.shl (local.get $i) (i32.const 3))))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $each))))

  ;; The largest g + w·c over terms [p, p1) (0 when none exceeds 0).
  (func $maxTerm (param $g i32) (param $c i32) (param $p i32) (param $p1 i32) (param $w f64) (result f64)
    (local $m f64) (local $v f64)
    (block $done
      (loop $each
        (br_if $done (i32.ge_s (local.get $p) (local.get $p1)))
        (local.set $v (f64.add
          (f64.load (i32.add (local.get $g) (i32.shl (local.get $p) (i32.const 3))))
          (f64.mul (local.get $w) (f64.load (i32.add (local.get $c) (i32.shl (local.get $p) (i32.const 3)))))))
        (if (f64.gt (local.get $v) (local.get $m)) (then (local.set $m (local.get $v))))
        (local.set $p (i32.add (local.get $p) (i32.const 1)))
        (br $each)))
    (local.get $m))

  ;; Each test value is m where 0 < m < ∞, else 1 (written out: a call per value costs more than it).
  (func $pencilTests (export "pencilTests")
    (param $n i32) (param $single i32) (param $rowPtr i32) (param $rowG i32) (param $rowC i32)
    (param $colPtr i32) (param $colG i32) (param $colC i32) (param $w f64) (param $cm i32) (param $rm i32)
    (local $k i32) (local $a i32) (local $b i32) (local $m f64)
    (if (local.get $single)
      (then
        ;; One term per row and column: term k of each.
        (block $done
          (loop $each
            (br_if $done (i32.ge_s (local.get $k) (local.get $n)))
            (local.set $a (i32.shl (local.get $k) (i32.const 3)))
            (local.set $m (f64.add (f64.load (i32.add (local.get $colG) (local.get $a)))
              (f64.mul (local.get $w) (f64.load (i32.add (local.get $colC) (local.get $a))))))
            (f64.store (i32.add (local.get $cm) (local.get $a)) (select (local.get $m) (f64.const 1)
              (i32.and (f64.gt (local.get $m) (f64.const 0)) (f64.lt (local.get $m) (f64.const inf)))))
            (local.set $m (f64.add (f64.load (i32.add (local.get $rowG) (local.get $a)))
              (f64.mul (local.get $w) (f64.load (i32.add (local.get $rowC) (local.get $a))))))
            (f64.store (i32.add (local.get $rm) (local.get $a)) (select (local.get $m) (f64.const 1)
              (i32.and (f64.gt (local.get $m) (f64.const 0)) (f64.lt (local.get $m) (f64.const inf)))))
            (local.set $k (i32.add (local.get $k) (i32.const 1)))
            (br $each))))
      (else
        (block $done
          (loop $each
            (br_if $done (i32.ge_s (local.get $k) (local.get $n)))
            (local.set $a (i32.shl (local.get $k) (i32.const 3)))
            (local.set $b (i32.add (local.get $colPtr) (i32.shl (local.get $k) (i32.const 2))))
            (local.set $m (call $maxTerm (local.get $colG) (local.get $colC) (i32.load (local.get $b)) (i32.load offset=4 (local.get $b)) (local.get $w)))
            (f64.store (i32.add (local.get $cm) (local.get $a)) (select (local.get $m) (f64.const 1)
              (i32.and (f64.gt (local.get $m) (f64.const 0)) (f64.lt (local.get $m) (f64.const inf)))))
            (local.set $b (i32.add (local.get $rowPtr) (i32.shl (local.get $k) (i32.const 2))))
            (local.set $m (call $maxTerm (local.get $rowG) (local.get $rowC) (i32.load (local.get $b)) (i32.load offset=4 (local.get $b)) (local.get $w)))
            (f64.store (i32.add (local.get $rm) (local.get $a)) (select (local.get $m) (f64.const 1)
              (i32.and (f64.gt (local.get $m) (f64.const 0)) (f64.lt (local.get $m) (f64.const inf)))))
            (local.set $k (i32.add (local.get $k) (i32.const 1)))
            (br $each))))))

  (func $transposed
    (param $n i32) (param $first i32) (param $uPtr i32) (param $uIdx i32) (param $facU i32)
    (param $lPtr i32) (param $lIdx i32) (param $fac i32) (param $inv i32) (param $w i32)
    (local $k i32) (local $t i32) (local $t1 i32) (local $a i32) (local $c i32)
    (local $br f64) (local $bi f64) (local $ir f64) (local $ii f64) (local $yr f64) (local $yi f64)
    (local $ur f64) (local $ui f64)
    (local.set $k (local.get $first))
    (block $fdone
      (loop $forward
        (br_if $fdone (i32.ge_s (local.get $k) (local.get $n)))
        (local.set $a (i32.add (local.get $w) (i32.shl (local.get $k) (i32.const 4))))
        (local.set $br (f64.load (local.get $a)))
        (local.set $bi (f64.load offset=8 (local.get $a)))
        (if (i32.eqz (i32.and (f64.eq (local.get $br) (f64.const 0)) (f64.eq (local.get $bi) (f64.const 0)))) (then
          (local.set $c (i32.add (local.get $inv) (i32.shl (local.get $k) (i32.const 4))))
          (local.set $ir (f64.load (local.get $c)))
          (local.set $ii (f64.load offset=8 (local.get $c)))
          (local.set $yr (f64.sub (f64.mul (local.get $br) (local.get $ir)) (f64.mul (local.get $bi) (local.get $ii))))
          (local.set $yi (f64.add (f64.mul (local.get $br) (local.get $ii)) (f64.mul (local.get $bi) (local.get $ir))))
          (f64.store (local.get $a) (local.get $yr))
          (f64.store offset=8 (local.get $a) (local.get $yi))
          (local.set $c (i32.add (local.get $uPtr) (i32.shl (local.get $k) (i32.const 2))))
          (local.set $t (i32.load (local.get $c)))
          (local.set $t1 (i32.load offset=4 (local.get $c)))
          (block $udone
            (loop $u
              (br_if $udone (i32.ge_s (local.get $t) (local.get $t1)))
              (local.set $c (i32.add (local.get $w) (i32.shl (i32.load (i32.add (local.get $uIdx) (i32.shl (local.get $t) (i32.const 2)))) (i32.const 4))))
              (local.set $a (i32.add (local.get $facU) (i32.shl (local.get $t) (i32.const 4))))
              (local.set $ur (f64.load (local.get $a)))
              (local.set $ui (f64.load offset=8 (local.get $a)))
              (f64.store (local.get $c) (f64.sub (f64.load (local.get $c)) (f64.sub (f64.mul (local.get $ur) (local.get $yr)) (f64.mul (local.get $ui) (local.get $yi)))))
              (f64.store offset=8 (local.get $c) (f64.sub (f64.load offset=8 (local.get $c)) (f64.add (f64.mul (local.get $ur) (local.get $yi)) (f64.mul (local.get $ui) (local.get $yr)))))
              (local.set $t (i32.add (local.get $t) (i32.const 1)))
              (br $u)))))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $forward)))
    (local.set $k (local.get $n))
    (block $bdone
      (loop $backward
        (br_if $bdone (i32.le_s (local.get $k) (i32.const 0)))
        (local.set $k (i32.sub (local.get $k) (i32.const 1)))
        (local.set $a (i32.add (local.get $w) (i32.shl (local.get $k) (i32.const 4))))
        (local.set $br (f64.load (local.get $a)))
        (local.set $bi (f64.load offset=8 (local.get $a)))
        (if (i32.eqz (i32.and (f64.eq (local.get $br) (f64.const 0)) (f64.eq (local.get $bi) (f64.const 0)))) (then
          (local.set $c (i32.add (local.get $lPtr) (i32.shl (local.get $k) (i32.const 2))))
          (local.set $t (i32.load (local.get $c)))
          (local.set $t1 (i32.load offset=4 (local.get $c)))
          (block $ldone
            (loop $l
              (br_if $ldone (i32.ge_s (local.get $t) (local.get $t1)))
              (local.set $c (i32.add (local.get $w) (i32.shl (i32.load (i32.add (local.get $lIdx) (i32.shl (local.get $t) (i32.const 2)))) (i32.const 4))))
              (local.set $a (i32.add (local.get $fac) (i32.shl (local.get $t) (i32.const 4))))
              (local.set $ur (f64.load (local.get $a)))
              (local.set $ui (f64.load offset=8 (local.get $a)))
              (f64.store (local.get $c) (f64.sub (f64.load (local.get $c)) (f64.sub (f64.mul (local.get $ur) (local.get $br)) (f64.mul (local.get $ui) (local.get $bi)))))
              (f64.store offset=8 (local.get $c) (f64.sub (f64.load offset=8 (local.get $c)) (f64.add (f64.mul (local.get $ur) (local.get $bi)) (f64.mul (local.get $ui) (local.get $br)))))
              (local.set $t (i32.add (local.get $t) (i32.const 1)))
              (br $l)))))
        (br $backward))))

  ;; Header (i32 at byte offset): 0 n, 4 lPtr, 8 lIdx, 12 uPtr, 16 uIdx, 20 rowPerm, 24 updStart,
  ;; 28 upd, 32 fac, 36 inv, 40 w, 44 cm, 48 rm, 52 bRe, 56 bIm, 60 offU, 64 offD, 68 colPerm,
  ;; 72 facU, 76 mPtr, 80 mIdx, 84 mVal, 88 slotG, 92 cSlots, 96 cValues, 100 cCount, 104 single,
  ;; 108 rowPtr, 112 rowG, 116 rowC, 120 colPtr, 124 colG, 128 colC, 132 slotBytes.

  (func $eliminateAt (export "eliminate") (param $h i32) (param $tol2 f64) (param $half f64) (param $fwd i32) (result i32)
    (call $eliminate
      (i32.load (local.get $h)) (i32.load offset=4 (local.get $h)) (i32.load offset=8 (local.get $h))
      (i32.load offset=12 (local.get $h)) (i32.load offset=16 (local.get $h)) (i32.load offset=20 (local.get $h))
      (i32.load offset=24 (local.get $h)) (i32.load offset=28 (local.get $h)) (i32.load offset=32 (local.get $h))
      (i32.load offset=36 (local.get $h)) (i32.load offset=40 (local.get $h)) (i32.load offset=44 (local.get $h))
      (i32.load offset=48 (local.get $h)) (i32.load offset=52 (local.get $h)) (i32.load offset=56 (local.get $h))
      (i32.load offset=60 (local.get $h)) (i32.load offset=64 (local.get $h))
      (local.get $tol2) (local.get $half) (local.get $fwd)))

  (func (export "factorPencil") (param $h i32) (param $omega f64) (param $tol2 f64) (param $half f64) (param $fwd i32) (result i32)
    (call $load (i32.load offset=32 (local.get $h)) (i32.load offset=88 (local.get $h)) (i32.load offset=132 (local.get $h))
      (i32.load offset=92 (local.get $h)) (i32.load offset=96 (local.get $h)) (i32.load offset=100 (local.get $h))
      (local.get $omega))
    (call $pencilTests (i32.load (local.get $h)) (i32.load offset=104 (local.get $h))
      (i32.load offset=108 (local.get $h)) (i32.load offset=112 (local.get $h)) (i32.load offset=116 (local.get $h))
      (i32.load offset=120 (local.get $h)) (i32.load offset=124 (local.get $h)) (i32.load offset=128 (local.get $h))
      (local.get $omega) (i32.load offset=44 (local.get $h)) (i32.load offset=48 (local.get $h)))
    (call $eliminateAt (local.get $h) (local.get $tol2) (local.get $half) (local.get $fwd)))

  (func $backwardAt (export "solve") (param $h i32) (param $nsteps i32) (param $steps i32) (param $xRe i32) (param $xIm i32) (result i32)
    (call $backward (local.get $nsteps) (local.get $steps) (i32.load offset=68 (local.get $h))
      (i32.load offset=12 (local.get $h)) (i32.load offset=16 (local.get $h)) (i32.load offset=72 (local.get $h))
      (i32.load offset=36 (local.get $h)) (i32.load offset=40 (local.get $h)) (local.get $xRe) (local.get $xIm)))

  (func (export "derive")
    (param $h i32) (param $vRe i32) (param $vIm i32) (param $nsteps i32) (param $steps i32) (param $xRe i32) (param $xIm i32)
    (result i32)
    (call $forwardOfProduct (i32.load (local.get $h)) (i32.load offset=20 (local.get $h)) (i32.load offset=4 (local.get $h))
      (i32.load offset=8 (local.get $h)) (i32.load offset=32 (local.get $h)) (i32.load offset=40 (local.get $h))
      (i32.load offset=76 (local.get $h)) (i32.load offset=80 (local.get $h)) (i32.load offset=84 (local.get $h))
      (local.get $vRe) (local.get $vIm))
    (call $backwardAt (local.get $h) (local.get $nsteps) (local.get $steps) (local.get $xRe) (local.get $xIm)))

  (func (export "adjoint") (param $h i32) (param $first i32)
    (call $transposed (i32.load (local.get $h)) (local.get $first) (i32.load offset=12 (local.get $h))
      (i32.load offset=16 (local.get $h)) (i32.load offset=72 (local.get $h)) (i32.load offset=4 (local.get $h))
      (i32.load offset=8 (local.get $h)) (i32.load offset=32 (local.get $h)) (i32.load offset=36 (local.get $h))
      (i32.load offset=40 (local.get $h))))
)
