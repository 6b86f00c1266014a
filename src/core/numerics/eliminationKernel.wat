;; Cholesky factors and linear systems in WebAssembly (matrixKernel.ts, eliminationKernel), for the
;; reason and with the rule of matrixKernel.wat: each function is its JavaScript twin's arithmetic in the
;; same order (symmetricEigen.ts choleskyLogDetInverse, linearAlgebra.ts solveOrNull), so the same bits.
;;
;; Memory (2 pages): n x n matrices of n <= 64, row-major: A at 1024, a second (L, or the right-hand
;; sides B) at 33792, a third (L^-1, or the solution X) at 66560.
(module
  (memory (export "memory") 2 2)

  ;; symmetricEigen.ts choleskyLogDetInverse on A (n x n): L at 33792 (zeros above its diagonal), L^-1 at
  ;; 66560, then A^-1 = L^-T L^-1 into A. Returns 0 when a pivot is not above 1e-12 of its diagonal
  ;; entry (not numerically positive definite; A is then left as it was read up to that column), else 1.
  ;; The caller forms log det from L's diagonal (WebAssembly has no logarithm).
  (func (export "cholesky") (param $n i32) (result i32)
    (local $i i32) (local $j i32) (local $k i32) (local $c i32) (local $d f64) (local $s f64) (local $root f64)
    (local $cells i32)
    (local.set $cells (i32.mul (local.get $n) (local.get $n)))
    (local.set $i (i32.const 0))
    (block $zeroed
      (loop $zero
        (br_if $zeroed (i32.ge_s (local.get $i) (local.get $cells)))
        (f64.store offset=33792 (i32.shl (local.get $i) (i32.const 3)) (f64.const 0))
        (f64.store offset=66560 (i32.shl (local.get $i) (i32.const 3)) (f64.const 0))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $zero)))
    (local.set $j (i32.const 0))
    (block $factored
      (loop $column
        (br_if $factored (i32.ge_s (local.get $j) (local.get $n)))
        (local.set $d (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $j) (local.get $n)) (local.get $j)) (i32.const 3))))
        (local.set $k (i32.const 0))
        (block $pivot
          (loop $minus
            (br_if $pivot (i32.ge_s (local.get $k) (local.get $j)))
            (local.set $s (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $j) (local.get $n)) (local.get $k)) (i32.const 3))))
            (local.set $d (f64.sub (local.get $d) (f64.mul (local.get $s) (local.get $s))))
            (local.set $k (i32.add (local.get $k) (i32.const 1)))
            (br $minus)))
        (if (i32.eqz (f64.gt (local.get $d) (f64.mul (f64.const 1e-12)
              (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $j) (local.get $n)) (local.get $j)) (i32.const 3))))))
          (then (return (i32.const 0))))
        (local.set $root (f64.sqrt (local.get $d)))
        (f64.store offset=33792 (i32.shl (i32.add (i32.mul (local.get $j) (local.get $n)) (local.get $j)) (i32.const 3)) (local.get $root))
        (local.set $i (i32.add (local.get $j) (i32.const 1)))
        (block $below
          (loop $row
            (br_if $below (i32.ge_s (local.get $i) (local.get $n)))
            (local.set $s (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3))))
            (local.set $k (i32.const 0))
            (block $summed
              (loop $term
                (br_if $summed (i32.ge_s (local.get $k) (local.get $j)))
                (local.set $s (f64.sub (local.get $s) (f64.mul
                  (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $k)) (i32.const 3)))
                  (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $j) (local.get $n)) (local.get $k)) (i32.const 3))))))
                (local.set $k (i32.add (local.get $k) (i32.const 1)))
                (br $term)))
            (f64.store offset=33792 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3))
              (f64.div (local.get $s) (local.get $root)))
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br $row)))
        (local.set $j (i32.add (local.get $j) (i32.const 1)))
        (br $column)))
    ;; L^-1 by forward substitution, column by column.
    (local.set $c (i32.const 0))
    (block $inverted
      (loop $columns
        (br_if $inverted (i32.ge_s (local.get $c) (local.get $n)))
        (local.set $i (local.get $c))
        (block $rowsDone
          (loop $rows
            (br_if $rowsDone (i32.ge_s (local.get $i) (local.get $n)))
            (local.set $s (select (f64.const 1) (f64.const 0) (i32.eq (local.get $i) (local.get $c))))
            (local.set $k (local.get $c))
            (block $summed
              (loop $term
                (br_if $summed (i32.ge_s (local.get $k) (local.get $i)))
                (local.set $s (f64.sub (local.get $s) (f64.mul
                  (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $k)) (i32.const 3)))
                  (f64.load offset=66560 (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $c)) (i32.const 3))))))
                (local.set $k (i32.add (local.get $k) (i32.const 1)))
                (br $term)))
            (f64.store offset=66560 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $c)) (i32.const 3))
              (f64.div (local.get $s)
                (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $i)) (i32.const 3)))))
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br $rows)))
        (local.set $c (i32.add (local.get $c) (i32.const 1)))
        (br $columns)))
    ;; A^-1_ij = sum over k from max(i, j) of Li_ki Li_kj, from 0.
    (local.set $i (i32.const 0))
    (block $done
      (loop $inverseRow
        (br_if $done (i32.ge_s (local.get $i) (local.get $n)))
        (local.set $j (i32.const 0))
        (block $rowDone
          (loop $inverseEntry
            (br_if $rowDone (i32.ge_s (local.get $j) (local.get $n)))
            (local.set $s (f64.const 0))
            (local.set $k (select (local.get $i) (local.get $j) (i32.gt_s (local.get $i) (local.get $j))))
            (block $summed
              (loop $term
                (br_if $summed (i32.ge_s (local.get $k) (local.get $n)))
                (local.set $s (f64.add (local.get $s) (f64.mul
                  (f64.load offset=66560 (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $i)) (i32.const 3)))
                  (f64.load offset=66560 (i32.shl (i32.add (i32.mul (local.get $k) (local.get $n)) (local.get $j)) (i32.const 3))))))
                (local.set $k (i32.add (local.get $k) (i32.const 1)))
                (br $term)))
            (f64.store offset=1024 (i32.shl (i32.add (i32.mul (local.get $i) (local.get $n)) (local.get $j)) (i32.const 3)) (local.get $s))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $inverseEntry)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $inverseRow)))
    (i32.const 1))

  ;; linearAlgebra.ts solveOrNull: A X = B by elimination with partial pivoting (the largest entry below
  ;; the diagonal, the first on ties; rows swapped whole), A (n x n) at 1024, B (n x m) at 33792, X into
  ;; 66560; returns 0 (no X) when a pivot is not above `tolerance` times A's largest magnitude.
  (func (export "solve") (param $n i32) (param $m i32) (param $tolerance f64) (result i32)
    (local $i i32) (local $j i32) (local $r i32) (local $c i32) (local $col i32) (local $pivot i32)
    (local $largest f64) (local $smallest f64) (local $factor f64) (local $x f64) (local $value f64)
    (local $cells i32)
    (local.set $cells (i32.mul (local.get $n) (local.get $n)))
    (block $scanned
      (loop $scan
        (br_if $scanned (i32.ge_s (local.get $i) (local.get $cells)))
        (local.set $largest (f64.max (local.get $largest) (f64.abs (f64.load offset=1024 (i32.shl (local.get $i) (i32.const 3))))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $scan)))
    (local.set $smallest (f64.mul (local.get $tolerance) (local.get $largest)))
    (block $eliminated
      (loop $columns
        (br_if $eliminated (i32.ge_s (local.get $col) (local.get $n)))
        (local.set $pivot (local.get $col))
        (local.set $r (i32.add (local.get $col) (i32.const 1)))
        (block $found
          (loop $search
            (br_if $found (i32.ge_s (local.get $r) (local.get $n)))
            (if (f64.gt
                  (f64.abs (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $r) (local.get $n)) (local.get $col)) (i32.const 3))))
                  (f64.abs (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $pivot) (local.get $n)) (local.get $col)) (i32.const 3)))))
              (then (local.set $pivot (local.get $r))))
            (local.set $r (i32.add (local.get $r) (i32.const 1)))
            (br $search)))
        (if (i32.eqz (f64.gt
              (f64.abs (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $pivot) (local.get $n)) (local.get $col)) (i32.const 3))))
              (local.get $smallest)))
          (then (return (i32.const 0))))
        (if (i32.ne (local.get $pivot) (local.get $col))
          (then
            (local.set $j (i32.const 0))
            (block $swappedA
              (loop $swapA
                (br_if $swappedA (i32.ge_s (local.get $j) (local.get $n)))
                (local.set $i (i32.shl (i32.add (i32.mul (local.get $pivot) (local.get $n)) (local.get $j)) (i32.const 3)))
                (local.set $r (i32.shl (i32.add (i32.mul (local.get $col) (local.get $n)) (local.get $j)) (i32.const 3)))
                (local.set $x (f64.load offset=1024 (local.get $i)))
                (f64.store offset=1024 (local.get $i) (f64.load offset=1024 (local.get $r)))
                (f64.store offset=1024 (local.get $r) (local.get $x))
                (local.set $j (i32.add (local.get $j) (i32.const 1)))
                (br $swapA)))
            (local.set $j (i32.const 0))
            (block $swappedB
              (loop $swapB
                (br_if $swappedB (i32.ge_s (local.get $j) (local.get $m)))
                (local.set $i (i32.shl (i32.add (i32.mul (local.get $pivot) (local.get $m)) (local.get $j)) (i32.const 3)))
                (local.set $r (i32.shl (i32.add (i32.mul (local.get $col) (local.get $m)) (local.get $j)) (i32.const 3)))
                (local.set $x (f64.load offset=33792 (local.get $i)))
                (f64.store offset=33792 (local.get $i) (f64.load offset=33792 (local.get $r)))
                (f64.store offset=33792 (local.get $r) (local.get $x))
                (local.set $j (i32.add (local.get $j) (i32.const 1)))
                (br $swapB)))))
        (local.set $r (i32.add (local.get $col) (i32.const 1)))
        (block $rowsDone
          (loop $rows
            (br_if $rowsDone (i32.ge_s (local.get $r) (local.get $n)))
            (local.set $factor (f64.div
              (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $r) (local.get $n)) (local.get $col)) (i32.const 3)))
              (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $col) (local.get $n)) (local.get $col)) (i32.const 3)))))
            (if (f64.ne (local.get $factor) (f64.const 0))
              (then
                (local.set $j (local.get $col))
                (block $aDone
                  (loop $aEntry
                    (br_if $aDone (i32.ge_s (local.get $j) (local.get $n)))
                    (local.set $i (i32.shl (i32.add (i32.mul (local.get $r) (local.get $n)) (local.get $j)) (i32.const 3)))
                    (f64.store offset=1024 (local.get $i) (f64.sub (f64.load offset=1024 (local.get $i)) (f64.mul (local.get $factor)
                      (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $col) (local.get $n)) (local.get $j)) (i32.const 3))))))
                    (local.set $j (i32.add (local.get $j) (i32.const 1)))
                    (br $aEntry)))
                (local.set $j (i32.const 0))
                (block $bDone
                  (loop $bEntry
                    (br_if $bDone (i32.ge_s (local.get $j) (local.get $m)))
                    (local.set $i (i32.shl (i32.add (i32.mul (local.get $r) (local.get $m)) (local.get $j)) (i32.const 3)))
                    (f64.store offset=33792 (local.get $i) (f64.sub (f64.load offset=33792 (local.get $i)) (f64.mul (local.get $factor)
                      (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $col) (local.get $m)) (local.get $j)) (i32.const 3))))))
                    (local.set $j (i32.add (local.get $j) (i32.const 1)))
                    (br $bEntry)))))
            (local.set $r (i32.add (local.get $r) (i32.const 1)))
            (br $rows)))
        (local.set $col (i32.add (local.get $col) (i32.const 1)))
        (br $columns)))
    ;; Back substitution, the last row first.
    (local.set $r (i32.sub (local.get $n) (i32.const 1)))
    (block $solved
      (loop $back
        (br_if $solved (i32.lt_s (local.get $r) (i32.const 0)))
        (local.set $j (i32.const 0))
        (block $rowDone
          (loop $entry
            (br_if $rowDone (i32.ge_s (local.get $j) (local.get $m)))
            (local.set $value (f64.load offset=33792 (i32.shl (i32.add (i32.mul (local.get $r) (local.get $m)) (local.get $j)) (i32.const 3))))
            (local.set $c (i32.add (local.get $r) (i32.const 1)))
            (block $summed
              (loop $term
                (br_if $summed (i32.ge_s (local.get $c) (local.get $n)))
                (local.set $value (f64.sub (local.get $value) (f64.mul
                  (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $r) (local.get $n)) (local.get $c)) (i32.const 3)))
                  (f64.load offset=66560 (i32.shl (i32.add (i32.mul (local.get $c) (local.get $m)) (local.get $j)) (i32.const 3))))))
                (local.set $c (i32.add (local.get $c) (i32.const 1)))
                (br $term)))
            (f64.store offset=66560 (i32.shl (i32.add (i32.mul (local.get $r) (local.get $m)) (local.get $j)) (i32.const 3))
              (f64.div (local.get $value)
                (f64.load offset=1024 (i32.shl (i32.add (i32.mul (local.get $r) (local.get $n)) (local.get $r)) (i32.const 3)))))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $entry)))
        (local.set $r (i32.sub (local.get $r) (i32.const 1)))
        (br $back)))
    (i32.const 1))
)
