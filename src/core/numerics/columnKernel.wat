;; Passes over whole columns held together from 512 (seriesKernel.ts, columnKernel): the input layer's
;; scans of a column that it runs on every file (the first value beyond a limit, the first key that does
;; not increase, the counts a median test needs, the histogram of whole-day gaps: comparisons and one
;; division, each as its JavaScript twin makes it; NaN compares false, as there), and the factor model's
;; sample covariance of k series (its twin's arithmetic in its order, so the same bits). On short files
;; V8 would run those loops in its interpreter (a 10,000-row file of 11 columns: about 10 ms).
;;
;; Memory: as seriesKernel.wat's (seriesKernel.ts lays out the kernels); the passes read the columns from
;; 512 (up to 4 x 32,768 doubles) and write counts to the state at 0 or results after the columns.
(module
  (import "env" "memory" (memory 17 17))

  ;; The first i < count with |x[i]| > limit, or -1 (convert.ts nextExtreme).
  (func (export "firstBeyond") (param $count i32) (param $limit f64) (result i32)
    (local $p i32) (local $stop i32)
    (local.set $p (i32.const 512))
    (local.set $stop (i32.add (i32.const 512) (i32.shl (local.get $count) (i32.const 3))))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (if (f64.gt (f64.abs (f64.load (local.get $p))) (local.get $limit))
          (then (return (i32.shr_u (i32.sub (local.get $p) (i32.const 512)) (i32.const 3)))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (i32.const -1))

  ;; The first i in [1, count) with !(x[i] - x[i - 1] > 0), or count (finish.ts firstNotIncreasing).
  (func (export "firstNotIncreasing") (param $count i32) (result i32)
    (local $i i32)
    (local.set $i (i32.const 1))
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $count)))
        (if (i32.eqz (f64.gt
              (f64.sub (f64.load offset=512 (i32.shl (local.get $i) (i32.const 3)))
                (f64.load offset=504 (i32.shl (local.get $i) (i32.const 3))))
              (f64.const 0)))
          (then (return (local.get $i))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (local.get $count))

  ;; Over x[i step], i < size (warnings.ts medianMayPass): how many |x| are beyond `threshold` (below it
  ;; when `below`, else above it) into state[0], and how many of the others are NaN into state[1].
  (func (export "sampleCounts") (param $size i32) (param $step i32) (param $threshold f64) (param $below i32)
    (local $i i32) (local $x f64) (local $count f64) (local $nan f64)
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $size)))
        (local.set $x (f64.abs (f64.load offset=512 (i32.shl (i32.mul (local.get $i) (local.get $step)) (i32.const 3)))))
        (if (select (f64.lt (local.get $x) (local.get $threshold)) (f64.gt (local.get $x) (local.get $threshold)) (local.get $below))
          (then (local.set $count (f64.add (local.get $count) (f64.const 1))))
          (else (if (f64.ne (local.get $x) (local.get $x)) (then (local.set $nan (f64.add (local.get $nan) (f64.const 1)))))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $count))
    (f64.store (i32.const 8) (local.get $nan)))

  ;; frequency.ts medianWholeDayGap's counts: over the `count` keys from 512, each gap g = (key - previous)
  ;; / dayMs must be a whole number in [0, days); counts[g] += 1 into the i32 array at `counts` (zeroed
  ;; here). 1 when every gap was, 0 at the first that was not (the counts are then incomplete).
  (func (export "dayGaps") (param $count i32) (param $dayMs f64) (param $days i32) (param $counts i32) (result i32)
    (local $i i32) (local $previous f64) (local $key f64) (local $gap f64) (local $at i32)
    (memory.fill (local.get $counts) (i32.const 0) (i32.shl (local.get $days) (i32.const 2)))
    (local.set $previous (f64.load (i32.const 512)))
    (local.set $i (i32.const 1))
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $count)))
        (local.set $key (f64.load offset=512 (i32.shl (local.get $i) (i32.const 3))))
        (local.set $gap (f64.div (f64.sub (local.get $key) (local.get $previous)) (local.get $dayMs)))
        (if (i32.eqz (i32.and
              (i32.and (f64.ge (local.get $gap) (f64.const 0)) (f64.lt (local.get $gap) (f64.convert_i32_s (local.get $days))))
              (f64.eq (f64.floor (local.get $gap)) (local.get $gap))))
          (then (return (i32.const 0))))
        (local.set $at (i32.add (local.get $counts) (i32.shl (i32.trunc_f64_s (local.get $gap)) (i32.const 2))))
        (i32.store (local.get $at) (i32.add (i32.load (local.get $at)) (i32.const 1)))
        (local.set $previous (local.get $key))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (i32.const 1))

  ;; factorModel.ts sampleCovariance of k series of n rows stacked from 512 (series i at 512 + 8 i n), the
  ;; risk-free returns after them (when hasRates; else `rate`): each series less the rate in place, less
  ;; its first row, less the mean of that (summed in order), then S_ij = sum x_i x_j / (n - 1), each
  ;; product once, into the k x k matrix (row-major) after the rates.
  (func (export "covariance") (param $k i32) (param $n i32) (param $hasRates i32) (param $rate f64)
    (local $i i32) (local $j i32) (local $base i32) (local $other i32) (local $stride i32) (local $p i32)
    (local $stop i32) (local $rates i32) (local $out i32) (local $first f64) (local $sum f64) (local $v f64)
    (local $count f64)
    (local.set $stride (i32.shl (local.get $n) (i32.const 3)))
    (local.set $rates (i32.add (i32.const 512) (i32.mul (local.get $k) (local.get $stride))))
    (local.set $out (i32.add (local.get $rates) (local.get $stride)))
    (local.set $count (f64.convert_i32_s (local.get $n)))
    (block $centred
      (loop $series
        (br_if $centred (i32.ge_s (local.get $i) (local.get $k)))
        (local.set $base (i32.add (i32.const 512) (i32.mul (local.get $i) (local.get $stride))))
        (local.set $stop (i32.add (local.get $base) (local.get $stride)))
        ;; Less the rate.
        (local.set $p (local.get $base))
        (block $done
          (loop $row
            (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
            (f64.store (local.get $p) (f64.sub (f64.load (local.get $p))
              (if (result f64) (local.get $hasRates)
                (then (f64.load (i32.add (local.get $rates) (i32.sub (local.get $p) (local.get $base)))))
                (else (local.get $rate)))))
            (local.set $p (i32.add (local.get $p) (i32.const 8)))
            (br $row)))
        ;; Less the first row, summing; then less the mean.
        (local.set $first (if (result f64) (i32.gt_s (local.get $n) (i32.const 0))
          (then (f64.load (local.get $base))) (else (f64.const 0))))
        (local.set $sum (f64.const 0))
        (local.set $p (local.get $base))
        (block $done
          (loop $row
            (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
            (local.set $v (f64.sub (f64.load (local.get $p)) (local.get $first)))
            (f64.store (local.get $p) (local.get $v))
            (local.set $sum (f64.add (local.get $sum) (local.get $v)))
            (local.set $p (i32.add (local.get $p) (i32.const 8)))
            (br $row)))
        (local.set $sum (f64.div (local.get $sum) (local.get $count)))
        (local.set $p (local.get $base))
        (block $done
          (loop $row
            (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
            (f64.store (local.get $p) (f64.sub (f64.load (local.get $p)) (local.get $sum)))
            (local.set $p (i32.add (local.get $p) (i32.const 8)))
            (br $row)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $series)))
    (local.set $i (i32.const 0))
    (block $rowsDone
      (loop $matrixRow
        (br_if $rowsDone (i32.ge_s (local.get $i) (local.get $k)))
        (local.set $j (local.get $i))
        (block $columnsDone
          (loop $matrixColumn
            (br_if $columnsDone (i32.ge_s (local.get $j) (local.get $k)))
            (local.set $base (i32.add (i32.const 512) (i32.mul (local.get $i) (local.get $stride))))
            (local.set $other (i32.add (i32.const 512) (i32.mul (local.get $j) (local.get $stride))))
            (local.set $stop (i32.add (local.get $base) (local.get $stride)))
            (local.set $sum (f64.const 0))
            (block $done
              (loop $row
                (br_if $done (i32.ge_u (local.get $base) (local.get $stop)))
                (local.set $sum (f64.add (local.get $sum) (f64.mul (f64.load (local.get $base)) (f64.load (local.get $other)))))
                (local.set $base (i32.add (local.get $base) (i32.const 8)))
                (local.set $other (i32.add (local.get $other) (i32.const 8)))
                (br $row)))
            (local.set $v (f64.div (local.get $sum) (f64.convert_i32_s (i32.sub (local.get $n) (i32.const 1)))))
            (f64.store (i32.add (local.get $out) (i32.shl (i32.add (i32.mul (local.get $i) (local.get $k)) (local.get $j)) (i32.const 3)))
              (local.get $v))
            (f64.store (i32.add (local.get $out) (i32.shl (i32.add (i32.mul (local.get $j) (local.get $k)) (local.get $i)) (i32.const 3)))
              (local.get $v))
            (local.set $j (i32.add (local.get $j) (i32.const 1)))
            (br $matrixColumn)))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $matrixRow))))
)
