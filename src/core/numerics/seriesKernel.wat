;; Passes over the returns that would otherwise run in V8's interpreter on short samples (seriesKernel.ts):
;; the moments, the magnitudes, the residual sums, the CAPM fits and the elementwise passes. WebAssembly is
;; compiled before its first call, so a 2,520-row sample runs at compiled speed from the first row and
;; makes no garbage. Each function does the arithmetic of its JavaScript twin in the same order, one
;; rounded operation at a time (no fused multiply-add), so the results are the same bits.
;;
;; Memory: 17 pages, imported: the one memory this kernel shares with influenceKernel.wat and
;; columnKernel.wat (seriesKernel.ts), laid out there: a state of up to 32 doubles at 0, up to 32
;; parameters at 256, then four columns of 32,768 doubles from 512 (a series or a chunk of it, copied in
;; by the caller). A pass keeps nothing there between the calls of other kernels.
(module
  (import "env" "memory" (memory 17 17))

  ;; Neumaier's compensated update, written out at each use in the loop below:
  ;;   next = s + t; c += |s| >= |t| ? (s - next) + t : (t - next) + s; s = next.

  ;; The three-series Welford pass of moments.ts (welfordChunk) over `count` rows whose first is row
  ;; `from` of the series: column 0 holds x, 1 holds y, 2 holds z (when hasZ), 3 the risk-free returns
  ;; (when hasRates; else `rate`). Parameters at 256: kx ky kz scale. State at 0: mx my mz ex ey ez,
  ;; sxx sxy sxz syy syz szz, cxx cxy cxz cyy cyz czz, read and written back.
  (func (export "welford") (param $from i32) (param $count i32) (param $hasZ i32) (param $hasRates i32)
    (param $rate f64) (param $weight f64)
    (local $other f64) (local $kx f64) (local $ky f64) (local $kz f64) (local $scale f64)
    (local $mx f64) (local $my f64) (local $mz f64) (local $ex f64) (local $ey f64) (local $ez f64)
    (local $sxx f64) (local $sxy f64) (local $sxz f64) (local $syy f64) (local $syz f64) (local $szz f64)
    (local $cxx f64) (local $cxy f64) (local $cxz f64) (local $cyy f64) (local $cyz f64) (local $czz f64)
    (local $i i32) (local $p i32) (local $inverseCount f64) (local $r f64) (local $lt f64) (local $ht f64)
    (local $vx f64) (local $vy f64) (local $vz f64) (local $dx f64) (local $dy f64) (local $dz f64)
    (local $ax f64) (local $ay f64) (local $az f64) (local $inc f64) (local $next f64) (local $term f64)
    (local.set $other (f64.sub (f64.const 1) (local.get $weight)))
    (local.set $kx (f64.load (i32.const 256)))
    (local.set $ky (f64.load (i32.const 264)))
    (local.set $kz (f64.load (i32.const 272)))
    (local.set $scale (f64.load (i32.const 280)))
    (local.set $mx (f64.load (i32.const 0)))
    (local.set $my (f64.load (i32.const 8)))
    (local.set $mz (f64.load (i32.const 16)))
    (local.set $ex (f64.load (i32.const 24)))
    (local.set $ey (f64.load (i32.const 32)))
    (local.set $ez (f64.load (i32.const 40)))
    (local.set $sxx (f64.load (i32.const 48)))
    (local.set $sxy (f64.load (i32.const 56)))
    (local.set $sxz (f64.load (i32.const 64)))
    (local.set $syy (f64.load (i32.const 72)))
    (local.set $syz (f64.load (i32.const 80)))
    (local.set $szz (f64.load (i32.const 88)))
    (local.set $cxx (f64.load (i32.const 96)))
    (local.set $cxy (f64.load (i32.const 104)))
    (local.set $cxz (f64.load (i32.const 112)))
    (local.set $cyy (f64.load (i32.const 120)))
    (local.set $cyz (f64.load (i32.const 128)))
    (local.set $czz (f64.load (i32.const 136)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $count)))
        (local.set $p (i32.shl (local.get $i) (i32.const 3)))
        (local.set $inverseCount
          (f64.div (f64.const 1) (f64.convert_i32_s (i32.add (i32.add (local.get $from) (local.get $i)) (i32.const 1)))))
        (local.set $r (if (result f64) (local.get $hasRates)
          (then (f64.load offset=786944 (local.get $p))) (else (local.get $rate))))
        (local.set $lt (f64.mul (f64.sub (f64.load offset=512 (local.get $p)) (local.get $r)) (local.get $scale)))
        (local.set $ht (f64.mul (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $r)) (local.get $scale)))
        (local.set $vx (f64.sub (local.get $lt) (local.get $kx)))
        (local.set $vy (f64.sub (local.get $ht) (local.get $ky)))
        (local.set $vz (f64.sub
          (if (result f64) (local.get $hasZ)
            (then (f64.load offset=524800 (local.get $p)))
            (else (f64.add (f64.mul (local.get $weight) (local.get $lt)) (f64.mul (local.get $other) (local.get $ht)))))
          (local.get $kz)))
        (local.set $dx (f64.sub (local.get $vx) (f64.add (local.get $mx) (local.get $ex))))
        (local.set $dy (f64.sub (local.get $vy) (f64.add (local.get $my) (local.get $ey))))
        (local.set $dz (f64.sub (local.get $vz) (f64.add (local.get $mz) (local.get $ez))))

        (local.set $inc (f64.mul (local.get $dx) (local.get $inverseCount)))
        (local.set $next (f64.add (local.get $mx) (local.get $inc)))
        (local.set $ex (f64.add (local.get $ex) (select
          (f64.add (f64.sub (local.get $mx) (local.get $next)) (local.get $inc))
          (f64.add (f64.sub (local.get $inc) (local.get $next)) (local.get $mx))
          (f64.ge (f64.abs (local.get $mx)) (f64.abs (local.get $inc))))))
        (local.set $mx (local.get $next))
        (local.set $inc (f64.mul (local.get $dy) (local.get $inverseCount)))
        (local.set $next (f64.add (local.get $my) (local.get $inc)))
        (local.set $ey (f64.add (local.get $ey) (select
          (f64.add (f64.sub (local.get $my) (local.get $next)) (local.get $inc))
          (f64.add (f64.sub (local.get $inc) (local.get $next)) (local.get $my))
          (f64.ge (f64.abs (local.get $my)) (f64.abs (local.get $inc))))))
        (local.set $my (local.get $next))
        (local.set $inc (f64.mul (local.get $dz) (local.get $inverseCount)))
        (local.set $next (f64.add (local.get $mz) (local.get $inc)))
        (local.set $ez (f64.add (local.get $ez) (select
          (f64.add (f64.sub (local.get $mz) (local.get $next)) (local.get $inc))
          (f64.add (f64.sub (local.get $inc) (local.get $next)) (local.get $mz))
          (f64.ge (f64.abs (local.get $mz)) (f64.abs (local.get $inc))))))
        (local.set $mz (local.get $next))

        (local.set $ax (f64.sub (local.get $vx) (f64.add (local.get $mx) (local.get $ex))))
        (local.set $ay (f64.sub (local.get $vy) (f64.add (local.get $my) (local.get $ey))))
        (local.set $az (f64.sub (local.get $vz) (f64.add (local.get $mz) (local.get $ez))))

        (local.set $term (f64.mul (local.get $dx) (local.get $ax)))
        (local.set $next (f64.add (local.get $sxx) (local.get $term)))
        (local.set $cxx (f64.add (local.get $cxx) (select
          (f64.add (f64.sub (local.get $sxx) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $sxx))
          (f64.ge (f64.abs (local.get $sxx)) (f64.abs (local.get $term))))))
        (local.set $sxx (local.get $next))
        (local.set $term (f64.mul (local.get $dx) (local.get $ay)))
        (local.set $next (f64.add (local.get $sxy) (local.get $term)))
        (local.set $cxy (f64.add (local.get $cxy) (select
          (f64.add (f64.sub (local.get $sxy) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $sxy))
          (f64.ge (f64.abs (local.get $sxy)) (f64.abs (local.get $term))))))
        (local.set $sxy (local.get $next))
        (local.set $term (f64.mul (local.get $dx) (local.get $az)))
        (local.set $next (f64.add (local.get $sxz) (local.get $term)))
        (local.set $cxz (f64.add (local.get $cxz) (select
          (f64.add (f64.sub (local.get $sxz) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $sxz))
          (f64.ge (f64.abs (local.get $sxz)) (f64.abs (local.get $term))))))
        (local.set $sxz (local.get $next))
        (local.set $term (f64.mul (local.get $dy) (local.get $ay)))
        (local.set $next (f64.add (local.get $syy) (local.get $term)))
        (local.set $cyy (f64.add (local.get $cyy) (select
          (f64.add (f64.sub (local.get $syy) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $syy))
          (f64.ge (f64.abs (local.get $syy)) (f64.abs (local.get $term))))))
        (local.set $syy (local.get $next))
        (local.set $term (f64.mul (local.get $dy) (local.get $az)))
        (local.set $next (f64.add (local.get $syz) (local.get $term)))
        (local.set $cyz (f64.add (local.get $cyz) (select
          (f64.add (f64.sub (local.get $syz) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $syz))
          (f64.ge (f64.abs (local.get $syz)) (f64.abs (local.get $term))))))
        (local.set $syz (local.get $next))
        (local.set $term (f64.mul (local.get $dz) (local.get $az)))
        (local.set $next (f64.add (local.get $szz) (local.get $term)))
        (local.set $czz (f64.add (local.get $czz) (select
          (f64.add (f64.sub (local.get $szz) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $szz))
          (f64.ge (f64.abs (local.get $szz)) (f64.abs (local.get $term))))))
        (local.set $szz (local.get $next))

        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $mx))
    (f64.store (i32.const 8) (local.get $my))
    (f64.store (i32.const 16) (local.get $mz))
    (f64.store (i32.const 24) (local.get $ex))
    (f64.store (i32.const 32) (local.get $ey))
    (f64.store (i32.const 40) (local.get $ez))
    (f64.store (i32.const 48) (local.get $sxx))
    (f64.store (i32.const 56) (local.get $sxy))
    (f64.store (i32.const 64) (local.get $sxz))
    (f64.store (i32.const 72) (local.get $syy))
    (f64.store (i32.const 80) (local.get $syz))
    (f64.store (i32.const 88) (local.get $szz))
    (f64.store (i32.const 96) (local.get $cxx))
    (f64.store (i32.const 104) (local.get $cxy))
    (f64.store (i32.const 112) (local.get $cxz))
    (f64.store (i32.const 120) (local.get $cyy))
    (f64.store (i32.const 128) (local.get $cyz))
    (f64.store (i32.const 136) (local.get $czz)))

  ;; cancellation.ts largestChunk over `count` rows: low in column 0, high in column 1, the risk-free
  ;; returns in column 3 (when hasRates; else `rate`). State 0..2: the largest |low - r|, |high - r|, |r|.
  (func (export "largest") (param $count i32) (param $hasRates i32) (param $rate f64)
    (local $i i32) (local $p i32) (local $at f64) (local $l f64) (local $h f64) (local $r f64)
    (local.set $l (f64.load (i32.const 0)))
    (local.set $h (f64.load (i32.const 8)))
    (local.set $r (f64.load (i32.const 16)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $count)))
        (local.set $p (i32.shl (local.get $i) (i32.const 3)))
        (local.set $at (if (result f64) (local.get $hasRates)
          (then (f64.load offset=786944 (local.get $p))) (else (local.get $rate))))
        (local.set $l (f64.max (local.get $l) (f64.abs (f64.sub (f64.load offset=512 (local.get $p)) (local.get $at)))))
        (local.set $h (f64.max (local.get $h) (f64.abs (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $at)))))
        (local.set $r (f64.max (local.get $r) (f64.abs (local.get $at))))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $l))
    (f64.store (i32.const 8) (local.get $h))
    (f64.store (i32.const 16) (local.get $r)))

  ;; regression.ts residualChunk over `count` rows (columns as for `largest`). Parameters at 256: weight
  ;; xbar lowBar lowBeta highBar highBeta scale. State 0..3: lowSum lowCompensation highSum highCompensation.
  (func (export "residuals") (param $count i32) (param $hasRates i32) (param $rate f64)
    (local $i i32) (local $p i32) (local $weight f64) (local $other f64) (local $xbar f64)
    (local $lowBar f64) (local $lowBeta f64) (local $highBar f64) (local $highBeta f64) (local $scale f64)
    (local $lowSum f64) (local $lowC f64) (local $highSum f64) (local $highC f64)
    (local $r f64) (local $l f64) (local $h f64) (local $m f64) (local $e f64) (local $term f64) (local $next f64)
    (local.set $weight (f64.load (i32.const 256)))
    (local.set $xbar (f64.load (i32.const 264)))
    (local.set $lowBar (f64.load (i32.const 272)))
    (local.set $lowBeta (f64.load (i32.const 280)))
    (local.set $highBar (f64.load (i32.const 288)))
    (local.set $highBeta (f64.load (i32.const 296)))
    (local.set $scale (f64.load (i32.const 304)))
    (local.set $other (f64.sub (f64.const 1) (local.get $weight)))
    (local.set $lowSum (f64.load (i32.const 0)))
    (local.set $lowC (f64.load (i32.const 8)))
    (local.set $highSum (f64.load (i32.const 16)))
    (local.set $highC (f64.load (i32.const 24)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $i) (local.get $count)))
        (local.set $p (i32.shl (local.get $i) (i32.const 3)))
        (local.set $r (if (result f64) (local.get $hasRates)
          (then (f64.load offset=786944 (local.get $p))) (else (local.get $rate))))
        (local.set $l (f64.mul (f64.sub (f64.load offset=512 (local.get $p)) (local.get $r)) (local.get $scale)))
        (local.set $h (f64.mul (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $r)) (local.get $scale)))
        (local.set $m (f64.add (f64.mul (local.get $weight) (local.get $l)) (f64.mul (local.get $other) (local.get $h))))
        (local.set $e (f64.sub (f64.sub (local.get $l) (local.get $lowBar))
          (f64.mul (local.get $lowBeta) (f64.sub (local.get $m) (local.get $xbar)))))
        (local.set $term (f64.mul (local.get $e) (local.get $e)))
        (local.set $next (f64.add (local.get $lowSum) (local.get $term)))
        (local.set $lowC (f64.add (local.get $lowC) (select
          (f64.add (f64.sub (local.get $lowSum) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $lowSum))
          (f64.ge (local.get $lowSum) (local.get $term)))))
        (local.set $lowSum (local.get $next))
        (local.set $e (f64.sub (f64.sub (local.get $h) (local.get $highBar))
          (f64.mul (local.get $highBeta) (f64.sub (local.get $m) (local.get $xbar)))))
        (local.set $term (f64.mul (local.get $e) (local.get $e)))
        (local.set $next (f64.add (local.get $highSum) (local.get $term)))
        (local.set $highC (f64.add (local.get $highC) (select
          (f64.add (f64.sub (local.get $highSum) (local.get $next)) (local.get $term))
          (f64.add (f64.sub (local.get $term) (local.get $next)) (local.get $highSum))
          (f64.ge (local.get $highSum) (local.get $term)))))
        (local.set $highSum (local.get $next))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $lowSum))
    (f64.store (i32.const 8) (local.get $lowC))
    (f64.store (i32.const 16) (local.get $highSum))
    (f64.store (i32.const 24) (local.get $highC)))

  ;; The rate of row p (a byte offset): column 3's when hasRates, else `rate`.
  (func $rateAt (param $p i32) (param $hasRates i32) (param $rate f64) (result f64)
    (if (result f64) (local.get $hasRates)
      (then (f64.load offset=786944 (local.get $p))) (else (local.get $rate))))

  ;; Column 0 minus `mean`, row by row, in place (longRun.ts, centring a column).
  (func $centre (export "centre") (param $count i32) (param $mean f64)
    (local $p i32) (local $stop i32)
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (f64.store offset=512 (local.get $p) (f64.sub (f64.load offset=512 (local.get $p)) (local.get $mean)))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row))))

  ;; longRun.ts's centring of a whole column of `count` rows (column 0) on its own mean: the plain sum
  ;; in row order from 0 (seriesLoops.ts plainSum) over count, then each row minus it, in place.
  (func (export "centreOnMean") (param $count i32)
    (local $p i32) (local $stop i32) (local $sum f64)
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $summed
      (loop $row
        (br_if $summed (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $sum (f64.add (local.get $sum) (f64.load offset=512 (local.get $p))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (call $centre (local.get $count) (f64.div (local.get $sum) (f64.convert_i32_s (local.get $count)))))

  ;; seriesLoops.ts productChunk: column 2 = column 0 x column 1 over `count` rows.
  (func (export "product") (param $count i32)
    (local $p i32) (local $stop i32)
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (f64.store offset=524800 (local.get $p)
          (f64.mul (f64.load offset=512 (local.get $p)) (f64.load offset=262656 (local.get $p))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row))))

  ;; seriesLoops.ts blendChunk: column 2 = w column 0 + v column 1 over `count` rows.
  (func (export "blend") (param $count i32) (param $w f64) (param $v f64)
    (local $p i32) (local $stop i32)
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (f64.store offset=524800 (local.get $p)
          (f64.add (f64.mul (local.get $w) (f64.load offset=512 (local.get $p)))
            (f64.mul (local.get $v) (f64.load offset=262656 (local.get $p)))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row))))

  ;; replicates.ts scaledExcessChunk: columns 0 and 1 become (x - r) scale in place over `count` rows.
  (func (export "scaledExcess") (param $count i32) (param $hasRates i32) (param $rate f64) (param $scale f64)
    (local $p i32) (local $stop i32) (local $r f64)
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $r (call $rateAt (local.get $p) (local.get $hasRates) (local.get $rate)))
        (f64.store offset=512 (local.get $p)
          (f64.mul (f64.sub (f64.load offset=512 (local.get $p)) (local.get $r)) (local.get $scale)))
        (f64.store offset=262656 (local.get $p)
          (f64.mul (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $r)) (local.get $scale)))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row))))

  ;; leastSquares.ts crossChunk over `count` rows, x in column 0 and y in column 1. State 0..3: sx sxx sy
  ;; sxy, read and written back.
  (func (export "crossSums") (param $count i32)
    (local $p i32) (local $stop i32) (local $xt f64) (local $yt f64)
    (local $sx f64) (local $sxx f64) (local $sy f64) (local $sxy f64)
    (local.set $sx (f64.load (i32.const 0)))
    (local.set $sxx (f64.load (i32.const 8)))
    (local.set $sy (f64.load (i32.const 16)))
    (local.set $sxy (f64.load (i32.const 24)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $xt (f64.load offset=512 (local.get $p)))
        (local.set $yt (f64.load offset=262656 (local.get $p)))
        (local.set $sx (f64.add (local.get $sx) (local.get $xt)))
        (local.set $sxx (f64.add (local.get $sxx) (f64.mul (local.get $xt) (local.get $xt))))
        (local.set $sy (f64.add (local.get $sy) (local.get $yt)))
        (local.set $sxy (f64.add (local.get $sxy) (f64.mul (local.get $xt) (local.get $yt))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $sx))
    (f64.store (i32.const 8) (local.get $sxx))
    (f64.store (i32.const 16) (local.get $sy))
    (f64.store (i32.const 24) (local.get $sxy)))

  ;; leastSquares.ts interceptResidualChunk: column 2 = y - ((0 + a) + x b) over `count` rows.
  (func (export "interceptResiduals") (param $count i32) (param $a f64) (param $b f64)
    (local $p i32) (local $stop i32)
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (f64.store offset=524800 (local.get $p)
          (f64.sub (f64.load offset=262656 (local.get $p))
            (f64.add (f64.add (f64.const 0) (local.get $a)) (f64.mul (f64.load offset=512 (local.get $p)) (local.get $b)))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row))))
)
