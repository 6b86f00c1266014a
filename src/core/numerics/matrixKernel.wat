;; The one-factor fit's small dense passes in WebAssembly (matrixKernel.ts), for the reason and with the
;; rule of seriesKernel.wat: V8 runs the fit's loops, called a few dozen times a run, in its interpreter;
;; each function here is its JavaScript twin's arithmetic in the same order, so the results are the same
;; bits (a multiply, then an add or a subtract; f64.sqrt, f64.abs and f64.max are IEEE's, as Math's).
;;
;; Memory (2 pages): the state at 0 (up to 32 doubles), then n x n matrices of n <= 64, row-major: the
;; working matrix A at 1024, the rotations V at 33792, the sample covariance S at 66560, and vectors of
;; 64 doubles: X at 99328, Y at 99840 and the roots R at 100352. Cholesky factors and linear systems
;; are eliminationKernel.wat's.
(module
  (memory (export "memory") 2 2)

  ;; symmetricEigen.ts symmetricEigen's sweeps on A (n x n): the cyclic Jacobi rotations until the
  ;; off-diagonal sum of squares is at most 1e-30 of the whole's (or 100 sweeps), the rotations
  ;; accumulated in V from the identity. A's diagonal then holds the eigenvalues, V's columns the vectors.
  (func (export "jacobi") (param $n i32)
    (local $i i32) (local $j i32) (local $p i32) (local $q i32) (local $k i32) (local $sweep i32)
    (local $total f64) (local $off f64) (local $apq f64) (local $theta f64) (local $t f64) (local $c f64)
    (local $s f64) (local $x f64) (local $y f64) (local $at i32) (local $bt i32)
    ;; V = I, and the sum of squares of A, row by row.
    (local.set $i (i32.const 0))
    (block $identityDone
      (loop $identityRow
        (br_if $identityDone (i32.ge_s (local.get $i) (local.get $n)))
        (local.set $j (i32.const 0))
        (block $rowDone
          (loop $entry
            (br_if $rowDone (i32.ge_s (local.get $j) (local.get $n)))
            (local.set $at (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3)))
            (f64.store offset=33792 (local.get $at) (select (f64.const 1) (f64.const 0) (i32.eq (local.get $i) (local.get $j))))
            (local.set $x (f64.load offset=1024 (local.get $at)))
            (local.set $total (f64.add (local.get $total) (f64.mul (local.get $x) (local.get $x))))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $entry)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $identityRow)))
    (block $converged
      (loop $sweeps
        (br_if $converged (i32.ge_s (local.get $sweep) (i32.const 100)))
        (local.set $off (f64.const 0))
        (local.set $p (i32.const 0))
        (block $offDone
          (loop $offRow
            (br_if $offDone (i32.ge_s (local.get $p) (local.get $n)))
            (local.set $q (i32.add (local.get $p) (i32.const 1)))
            (block $offRowDone
              (loop $offEntry
                (br_if $offRowDone (i32.ge_s (local.get $q) (local.get $n)))
                (local.set $x (f64.load offset=1024
                  (i32.shl (i32.add (i32.mul (local.get $p) (local.get $n)) (local.get $q)) (i32.const 3))))
                (local.set $off (f64.add (local.get $off) (f64.mul (local.get $x) (local.get $x))))
                (local.set $q (i32.add (local.get $q) (i32.const 1)))
                (br $offEntry)))
            (local.set $p (i32.add (local.get $p) (i32.const 1)))
            (br $offRow)))
        (br_if $converged (i32.or
          (f64.le (local.get $off) (f64.mul (f64.const 1e-30) (local.get $total)))
          (f64.eq (local.get $off) (f64.const 0))))
        (local.set $p (i32.const 0))
        (block $pDone
          (loop $pLoop
            (br_if $pDone (i32.ge_s (local.get $p) (local.get $n)))
            (local.set $q (i32.add (local.get $p) (i32.const 1)))
            (block $qDone
              (loop $qLoop
                (br_if $qDone (i32.ge_s (local.get $q) (local.get $n)))
                (local.set $apq (f64.load offset=1024
                  (i32.shl (i32.add (i32.mul (local.get $p) (local.get $n)) (local.get $q)) (i32.const 3))))
                (if (f64.ne (local.get $apq) (f64.const 0))
                  (then
                    (local.set $theta (f64.div
                      (f64.sub
                        (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $q) (local.get $n)) (local.get $q)) (i32.const 3)))
                        (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $p) (local.get $n)) (local.get $p)) (i32.const 3))))
                      (f64.mul (f64.const 2) (local.get $apq))))
                    ;; Math.sign(theta || 1): -1 below 0, else 1 (0, -0 and NaN give 1).
                    (local.set $t (f64.div
                      (select (f64.const -1) (f64.const 1) (f64.lt (local.get $theta) (f64.const 0)))
                      (f64.add (f64.abs (local.get $theta))
                        (f64.sqrt (f64.add (f64.mul (local.get $theta) (local.get $theta)) (f64.const 1))))))
                    (local.set $c (f64.div (f64.const 1) (f64.sqrt (f64.add (f64.mul (local.get $t) (local.get $t)) (f64.const 1)))))
                    (local.set $s (f64.mul (local.get $t) (local.get $c)))
                    ;; Columns p and q of A.
                    (local.set $k (i32.const 0))
                    (block $colsDone
                      (loop $cols
                        (br_if $colsDone (i32.ge_s (local.get $k) (local.get $n)))
                        (local.set $at (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $p)) (i32.const 3)))
                        (local.set $bt (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $q)) (i32.const 3)))
                        (local.set $x (f64.load offset=1024 (local.get $at)))
                        (local.set $y (f64.load offset=1024 (local.get $bt)))
                        (f64.store offset=1024 (local.get $at) (f64.sub (f64.mul (local.get $c) (local.get $x)) (f64.mul (local.get $s) (local.get $y))))
                        (f64.store offset=1024 (local.get $bt) (f64.add (f64.mul (local.get $s) (local.get $x)) (f64.mul (local.get $c) (local.get $y))))
                        (local.set $k (i32.add (local.get $k) (i32.const 1)))
                        (br $cols)))
                    ;; Rows p and q of A.
                    (local.set $k (i32.const 0))
                    (block $rowsDone
                      (loop $rows
                        (br_if $rowsDone (i32.ge_s (local.get $k) (local.get $n)))
                        (local.set $at (i32.shl (i32.add (i32.mul (local.get $p) (local.get $n)) (local.get $k)) (i32.const 3)))
                        (local.set $bt (i32.shl (i32.add (i32.mul (local.get $q) (local.get $n)) (local.get $k)) (i32.const 3)))
                        (local.set $x (f64.load offset=1024 (local.get $at)))
                        (local.set $y (f64.load offset=1024 (local.get $bt)))
                        (f64.store offset=1024 (local.get $at) (f64.sub (f64.mul (local.get $c) (local.get $x)) (f64.mul (local.get $s) (local.get $y))))
                        (f64.store offset=1024 (local.get $bt) (f64.add (f64.mul (local.get $s) (local.get $x)) (f64.mul (local.get $c) (local.get $y))))
                        (local.set $k (i32.add (local.get $k) (i32.const 1)))
                        (br $rows)))
                    ;; Columns p and q of V.
                    (local.set $k (i32.const 0))
                    (block $vDone
                      (loop $vCols
                        (br_if $vDone (i32.ge_s (local.get $k) (local.get $n)))
                        (local.set $at (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $p)) (i32.const 3)))
                        (local.set $bt (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $q)) (i32.const 3)))
                        (local.set $x (f64.load offset=33792 (local.get $at)))
                        (local.set $y (f64.load offset=33792 (local.get $bt)))
                        (f64.store offset=33792 (local.get $at) (f64.sub (f64.mul (local.get $c) (local.get $x)) (f64.mul (local.get $s) (local.get $y))))
                        (f64.store offset=33792 (local.get $bt) (f64.add (f64.mul (local.get $s) (local.get $x)) (f64.mul (local.get $c) (local.get $y))))
                        (local.set $k (i32.add (local.get $k) (i32.const 1)))
                        (br $vCols)))))
                (local.set $q (i32.add (local.get $q) (i32.const 1)))
                (br $qLoop)))
            (local.set $p (i32.add (local.get $p) (i32.const 1)))
            (br $pLoop)))
        (local.set $sweep (i32.add (local.get $sweep) (i32.const 1)))
        (br $sweeps))))

  ;; factorModelFit.ts loadingsGiven's scaled matrix: A = S_ij / (R_i R_j).
  (func (export "scale") (param $n i32)
    (local $i i32) (local $j i32) (local $at i32)
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $n)))
        (local.set $j (i32.const 0))
        (block $rowDone
          (loop $entry
            (br_if $rowDone (i32.ge_s (local.get $j) (local.get $n)))
            (local.set $at (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3)))
            (f64.store offset=1024 (local.get $at) (f64.div (f64.load offset=66560 (local.get $at))
              (f64.mul (f64.load offset=100352 (i32.shl (local.get $i) (i32.const 3)))
                (f64.load offset=100352 (i32.shl (local.get $j) (i32.const 3))))))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $entry)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row))))

  ;; X = A v: each entry a sum from 0 in column order; returns the sum of their squares.
  (func $multiply (param $n i32) (param $from i32) (param $into i32) (result f64)
    (local $i i32) (local $j i32) (local $sum f64) (local $norm f64)
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $n)))
        (local.set $sum (f64.const 0))
        (local.set $j (i32.const 0))
        (block $rowDone
          (loop $entry
            (br_if $rowDone (i32.ge_s (local.get $j) (local.get $n)))
            (local.set $sum (f64.add (local.get $sum) (f64.mul
              (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3)))
              (f64.load (i32.add (local.get $from) (i32.shl (local.get $j) (i32.const 3)))))))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $entry)))
        (f64.store (i32.add (local.get $into) (i32.shl (local.get $i) (i32.const 3))) (local.get $sum))
        (local.set $norm (f64.add (local.get $norm) (f64.mul (local.get $sum) (local.get $sum))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (local.get $norm))

  ;; factorModelFit.ts powerIteration on A from the unit vector in X: the vector (into X) and the
  ;; Rayleigh quotient (state 0) when it settles within 100 steps (returns 1), else 0.
  (func (export "power") (param $n i32) (result i32)
    (local $step i32) (local $i i32) (local $norm f64) (local $moved f64) (local $previous f64) (local $x f64)
    (local $value f64) (local $sum f64) (local $j i32)
    (local.set $previous (f64.const inf))
    (block $failed
      (loop $steps
        (br_if $failed (i32.ge_s (local.get $step) (i32.const 100)))
        (local.set $norm (f64.sqrt (call $multiply (local.get $n) (i32.const 99328) (i32.const 99840))))
        (local.set $moved (f64.const 0))
        (local.set $i (i32.const 0))
        (block $normalised
          (loop $entry
            (br_if $normalised (i32.ge_s (local.get $i) (local.get $n)))
            (local.set $x (f64.div (f64.load offset=99840 (i32.shl (local.get $i) (i32.const 3))) (local.get $norm)))
            (local.set $moved (f64.max (local.get $moved)
              (f64.abs (f64.sub (local.get $x) (f64.load offset=99328 (i32.shl (local.get $i) (i32.const 3)))))))
            (f64.store offset=99328 (i32.shl (local.get $i) (i32.const 3)) (local.get $x))
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br $entry)))
        (if (i32.or (f64.le (local.get $moved) (f64.const 0x1p-50))
              (i32.and (f64.ge (local.get $moved) (local.get $previous)) (f64.lt (local.get $moved) (f64.const 1e-13))))
          (then
            ;; rayleigh: the sum over rows of v_i (A v)_i, each (A v)_i a sum from 0.
            (local.set $i (i32.const 0))
            (block $quotient
              (loop $row
                (br_if $quotient (i32.ge_s (local.get $i) (local.get $n)))
                (local.set $sum (f64.const 0))
                (local.set $j (i32.const 0))
                (block $rowDone
                  (loop $product
                    (br_if $rowDone (i32.ge_s (local.get $j) (local.get $n)))
                    (local.set $sum (f64.add (local.get $sum) (f64.mul
                      (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3)))
                      (f64.load offset=99328 (i32.shl (local.get $j) (i32.const 3))))))
                    (local.set $j (i32.add (local.get $j) (i32.const 1)))
                    (br $product)))
                (local.set $value (f64.add (local.get $value)
                  (f64.mul (f64.load offset=99328 (i32.shl (local.get $i) (i32.const 3))) (local.get $sum))))
                (local.set $i (i32.add (local.get $i) (i32.const 1)))
                (br $row)))
            (f64.store (i32.const 0) (local.get $value))
            (return (i32.const 1))))
        (local.set $previous (local.get $moved))
        (local.set $step (i32.add (local.get $step) (i32.const 1)))
        (br $steps)))
    (i32.const 0))
)
