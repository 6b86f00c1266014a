;; Scans of a column that the input layer runs on every file (seriesKernel.ts, scanKernel): the first value
;; beyond a limit, the first key that does not increase, and the counts a median test needs. Comparisons
;; only, each as its JavaScript twin makes it (NaN compares false, as there). On short files V8 would run
;; those loops in its interpreter (a 10,000-row file of 11 columns: about 10 ms).
;;
;; Memory: as seriesKernel.wat's (seriesKernel.ts lays out the kernels); the scans read the column from
;; 512 (up to 4 x 32,768 doubles) and write counts to the state at 0.
(module
  (memory (export "memory") 17 17)

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
)
