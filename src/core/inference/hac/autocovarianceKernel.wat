;; The Newey-West pre-lag autocovariances of one block of rows (bandwidth.ts, autocovarianceBlock), eight
;; lags at a time in four two-lane accumulators. Lane k of the group at lag j adds f[u] f[u + j + k] over
;; u in order from 0, exactly as the lag-by-lag loop does (a multiply, then an add, each rounded), so
;; every sum is the same bits as the JavaScript pass; a lane past `lags` reads bytes after the block
;; (the caller leaves 8 doubles of room) and is never stored.
;;
;; Memory: imported, the 17 pages the series kernels share (seriesKernel.ts); this kernel uses the first
;; sixteen, laid out by autocovarianceKernel.ts: the sums, then the block's rows; the second page stages a
;; column's rows for `weigh`; from the third, `weightedSums`'s weights, columns and series.
(module
  (import "env" "memory" (memory 17 17))

  ;; s + f[u] f[u + lag] for u in [from, to), in order of u (s when the range is empty).
  (func $tail (param $f i32) (param $from i32) (param $to i32) (param $lag i32) (param $s f64) (result f64)
    (local $p i32) (local $q i32) (local $stop i32)
    (if (i32.ge_s (local.get $from) (local.get $to)) (then (return (local.get $s))))
    (local.set $p (i32.add (local.get $f) (i32.shl (local.get $from) (i32.const 3))))
    (local.set $q (i32.add (local.get $p) (i32.shl (local.get $lag) (i32.const 3))))
    (local.set $stop (i32.add (local.get $f) (i32.shl (local.get $to) (i32.const 3))))
    (loop $next
      (local.set $s (f64.add (local.get $s) (f64.mul (f64.load (local.get $p)) (f64.load (local.get $q)))))
      (local.set $p (i32.add (local.get $p) (i32.const 8)))
      (local.set $q (i32.add (local.get $q) (i32.const 8)))
      (br_if $next (i32.lt_u (local.get $p) (local.get $stop))))
    (local.get $s))

  (func $min (param $a i32) (param $b i32) (result i32)
    (select (local.get $a) (local.get $b) (i32.lt_s (local.get $a) (local.get $b))))

  ;; Lag `lag` when it is wanted (lag <= lags): its lane's sum s over rows before `from`, then the rows
  ;; [from, min(end, rows - lag)) only this lag reaches, added to sums[lag].
  (func $finish (param $f i32) (param $from i32) (param $end i32) (param $rows i32) (param $lags i32) (param $sums i32)
    (param $lag i32) (param $s f64)
    (local $at i32)
    (if (i32.gt_s (local.get $lag) (local.get $lags)) (then (return)))
    (local.set $at (i32.add (local.get $sums) (i32.shl (local.get $lag) (i32.const 3))))
    (f64.store (local.get $at)
      (f64.add (f64.load (local.get $at))
        (call $tail (local.get $f) (local.get $from)
          (call $min (local.get $end) (i32.sub (local.get $rows) (local.get $lag)))
          (local.get $lag) (local.get $s)))))

  ;; sums[j] += sum of f[u] f[u + j] over u in [begin, min(end, rows - j)), j = 0..lags; f and sums are
  ;; byte addresses of doubles.
  (func $block (export "block") (param $f i32) (param $begin i32) (param $end i32) (param $rows i32) (param $lags i32)
    (param $sums i32)
    (local $j i32) (local $last i32) (local $from i32) (local $p i32) (local $q i32) (local $stop i32)
    (local $x v128) (local $a0 v128) (local $a1 v128) (local $a2 v128) (local $a3 v128)
    (block $done
      (loop $group
        (br_if $done (i32.gt_s (local.get $j) (local.get $lags)))
        ;; The rows every wanted lag of the group reaches.
        (local.set $last (call $min (local.get $end)
          (i32.sub (local.get $rows) (call $min (i32.add (local.get $j) (i32.const 7)) (local.get $lags)))))
        (local.set $a0 (v128.const i64x2 0 0))
        (local.set $a1 (v128.const i64x2 0 0))
        (local.set $a2 (v128.const i64x2 0 0))
        (local.set $a3 (v128.const i64x2 0 0))
        (local.set $from (local.get $begin))
        (if (i32.lt_s (local.get $begin) (local.get $last))
          (then
            (local.set $p (i32.add (local.get $f) (i32.shl (local.get $begin) (i32.const 3))))
            (local.set $q (i32.add (local.get $p) (i32.shl (local.get $j) (i32.const 3))))
            (local.set $stop (i32.add (local.get $f) (i32.shl (local.get $last) (i32.const 3))))
            (loop $row
              (local.set $x (v128.load64_splat (local.get $p)))
              (local.set $a0 (f64x2.add (local.get $a0) (f64x2.mul (local.get $x) (v128.load offset=0 (local.get $q)))))
              (local.set $a1 (f64x2.add (local.get $a1) (f64x2.mul (local.get $x) (v128.load offset=16 (local.get $q)))))
              (local.set $a2 (f64x2.add (local.get $a2) (f64x2.mul (local.get $x) (v128.load offset=32 (local.get $q)))))
              (local.set $a3 (f64x2.add (local.get $a3) (f64x2.mul (local.get $x) (v128.load offset=48 (local.get $q)))))
              (local.set $p (i32.add (local.get $p) (i32.const 8)))
              (local.set $q (i32.add (local.get $q) (i32.const 8)))
              (br_if $row (i32.lt_u (local.get $p) (local.get $stop))))
            (local.set $from (local.get $last))))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (local.get $j) (f64x2.extract_lane 0 (local.get $a0)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 1)) (f64x2.extract_lane 1 (local.get $a0)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 2)) (f64x2.extract_lane 0 (local.get $a1)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 3)) (f64x2.extract_lane 1 (local.get $a1)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 4)) (f64x2.extract_lane 0 (local.get $a2)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 5)) (f64x2.extract_lane 1 (local.get $a2)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 6)) (f64x2.extract_lane 0 (local.get $a3)))
        (call $finish (local.get $f) (local.get $from) (local.get $end) (local.get $rows) (local.get $lags) (local.get $sums)
          (i32.add (local.get $j) (i32.const 7)) (f64x2.extract_lane 1 (local.get $a3)))
        (local.set $j (i32.add (local.get $j) (i32.const 8)))
        (br $group))))
  ;; bandwidth.ts weightedAutocovarianceSums in one call: the k weights at $at, then the k columns of n
  ;; rows each, then room for f = sum_a w_a column_a (n doubles and 8 more). f is formed whole, each row
  ;; as weigh forms it (the first column with a nonzero weight as 0 + w x, the others added in order;
  ;; zeros if every weight is 0), then its sums over blocks of `blockRows` rows, each block's as `block`
  ;; gives them (the same rows in the same order: the same bits as a block formed and summed at a time).
  (func (export "weightedSums") (param $at i32) (param $k i32) (param $n i32) (param $lags i32) (param $blockRows i32)
    (param $sums i32)
    (local $a i32) (local $w f64) (local $column i32) (local $f i32) (local $p i32) (local $q i32) (local $stop i32)
    (local $started i32) (local $start i32) (local $j i32)
    (local.set $column (i32.add (local.get $at) (i32.shl (local.get $k) (i32.const 3))))
    (local.set $f (i32.add (local.get $column) (i32.shl (i32.mul (local.get $k) (local.get $n)) (i32.const 3))))
    (local.set $stop (i32.add (local.get $f) (i32.shl (local.get $n) (i32.const 3))))
    (block $formed
      (loop $next
        (br_if $formed (i32.ge_s (local.get $a) (local.get $k)))
        (local.set $w (f64.load (i32.add (local.get $at) (i32.shl (local.get $a) (i32.const 3)))))
        (if (f64.ne (local.get $w) (f64.const 0))
          (then
            (call $weighRows (local.get $f) (local.get $column) (local.get $n) (local.get $w) (local.get $started))
            (local.set $started (i32.const 1))))
        (local.set $column (i32.add (local.get $column) (i32.shl (local.get $n) (i32.const 3))))
        (local.set $a (i32.add (local.get $a) (i32.const 1)))
        (br $next)))
    (if (i32.eqz (local.get $started))
      (then (memory.fill (local.get $f) (i32.const 0) (i32.shl (local.get $n) (i32.const 3)))))
    (loop $zero
      (if (i32.le_s (local.get $j) (local.get $lags))
        (then
          (f64.store (i32.add (local.get $sums) (i32.shl (local.get $j) (i32.const 3))) (f64.const 0))
          (local.set $j (i32.add (local.get $j) (i32.const 1)))
          (br $zero))))
    (block $done
      (loop $each
        (br_if $done (i32.ge_s (local.get $start) (local.get $n)))
        (call $block (i32.add (local.get $f) (i32.shl (local.get $start) (i32.const 3))) (i32.const 0)
          (i32.sub (call $min (local.get $n) (i32.add (local.get $start) (local.get $blockRows))) (local.get $start))
          (i32.sub (local.get $n) (local.get $start)) (local.get $lags) (local.get $sums))
        (local.set $start (i32.add (local.get $start) (local.get $blockRows)))
        (br $each))))

  ;; bandwidth.ts weightedRows on `count` rows: f[i] = 0 + w g[i] (the first column) or f[i] + w g[i]
  ;; (the others), with g the column's rows staged by the caller; f and g are byte addresses of doubles.
  (func $weighRows (export "weigh") (param $f i32) (param $g i32) (param $count i32) (param $w f64) (param $add i32)
    (local $stop i32)
    (local.set $stop (i32.add (local.get $f) (i32.shl (local.get $count) (i32.const 3))))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $f) (local.get $stop)))
        (f64.store (local.get $f)
          (f64.add (select (f64.load (local.get $f)) (f64.const 0) (local.get $add))
            (f64.mul (local.get $w) (f64.load (local.get $g)))))
        (local.set $f (i32.add (local.get $f) (i32.const 8)))
        (local.set $g (i32.add (local.get $g) (i32.const 8)))
        (br $row))))
)
