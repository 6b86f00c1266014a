;; The uncertainty's influence passes (seriesKernel.ts, influenceKernel): the Bartlett window sums, the
;; bounds' and the pricing assessment's influence series and the Sharpe ratio's standardised series, in
;; WebAssembly for the reason and with the rule given in seriesKernel.wat (the JavaScript twin's
;; arithmetic in its order, so the same bits).
;;
;; Memory: as seriesKernel.wat's (seriesKernel.ts lays out both): a state of up to 32 doubles at 0, up
;; to 32 parameters at 256, then four columns of 32,768 doubles from 512.
(module
  (import "env" "memory" (memory 17 17))

  ;; bartlettWindows.ts windowSquaresOfTwo over the windows t = $from .. $to - 1 of a series of n rows
  ;; (all of them: $from = 1 - width, $to = n), x in column 0 and y in column 1 from row $offset on (the
  ;; rows those windows reach: from $from - 1 to $to + width - 2), by blocks of 1,024 from $from (a
  ;; caller going chunk by chunk starts each call at a block's start), each window's sums hx + lx and
  ;; hy + ly kept with TwoSum as rows enter and leave, the block's sums of squares added to the totals
  ;; at its end.
  ;; x and y go together in the two lanes of f64x2 values (lane 0 x, lane 1 y): a lane's operation is
  ;; the scalar one, so each lane does its series' pass exactly (the same bits), at half the instructions;
  ;; xy is lane 0 of w times w with its lanes swapped (wx wy = wy wx exactly).
  ;; State: hx lx hy ly, then the totals xx xy - yy (all from 0 before the first call, continued by each).
  ;; With $both, the same for width - 1 in the same loop (state 8..15): its window t + 1 takes the same
  ;; entering row as the wider window t and leaves row t, and its blocks hold the same window counts, so
  ;; each width's operations are those of a pass of its own (the same bits), while the two independent
  ;; chains of additions overlap.
  (func (export "windowsOfTwo") (param $from i32) (param $to i32) (param $offset i32) (param $n i32) (param $width i32) (param $both i32)
    (local $t i32) (local $stop i32) (local $entering i32) (local $leaving i32) (local $narrow i32)
    (local $in v128) (local $u v128) (local $sum v128) (local $virtual v128) (local $w v128)
    (local $h v128) (local $l v128) (local $squares v128) (local $cross v128)
    (local $h2 v128) (local $l2 v128) (local $squares2 v128) (local $cross2 v128)
    (local.set $h (call $loadPair (i32.const 0)))
    (local.set $l (call $loadPair (i32.const 8)))
    (local.set $h2 (call $loadPair (i32.const 64)))
    (local.set $l2 (call $loadPair (i32.const 72)))
    (local.set $t (local.get $from))
    (block $done
      (loop $block
        (br_if $done (i32.ge_s (local.get $t) (local.get $to)))
        (local.set $stop (i32.add (local.get $t) (i32.const 1024)))
        (if (i32.gt_s (local.get $stop) (local.get $to)) (then (local.set $stop (local.get $to))))
        (local.set $squares (v128.const i64x2 0 0))
        (local.set $cross (v128.const i64x2 0 0))
        (local.set $squares2 (v128.const i64x2 0 0))
        (local.set $cross2 (v128.const i64x2 0 0))
        (loop $window
          (local.set $entering (i32.sub (i32.add (local.get $t) (local.get $width)) (i32.const 1)))
          (if (i32.lt_s (local.get $entering) (local.get $n))
            (then
              (local.set $in (v128.load64_lane offset=262656 1 (i32.shl (i32.sub (local.get $entering) (local.get $offset)) (i32.const 3)) (v128.load64_zero offset=512 (i32.shl (i32.sub (local.get $entering) (local.get $offset)) (i32.const 3)))))
              (local.set $u (local.get $in))
              (local.set $sum (f64x2.add (local.get $h) (local.get $u)))
              (local.set $virtual (f64x2.sub (local.get $sum) (local.get $h)))
              (local.set $l (f64x2.add (local.get $l) (f64x2.add
                (f64x2.sub (local.get $h) (f64x2.sub (local.get $sum) (local.get $virtual)))
                (f64x2.sub (local.get $u) (local.get $virtual)))))
              (local.set $h (local.get $sum))))
          (if (i32.gt_s (local.get $t) (i32.const 0))
            (then
              (local.set $leaving (i32.sub (local.get $t) (i32.const 1)))
              (local.set $u (f64x2.neg (v128.load64_lane offset=262656 1 (i32.shl (i32.sub (local.get $leaving) (local.get $offset)) (i32.const 3)) (v128.load64_zero offset=512 (i32.shl (i32.sub (local.get $leaving) (local.get $offset)) (i32.const 3))))))
              (local.set $sum (f64x2.add (local.get $h) (local.get $u)))
              (local.set $virtual (f64x2.sub (local.get $sum) (local.get $h)))
              (local.set $l (f64x2.add (local.get $l) (f64x2.add
                (f64x2.sub (local.get $h) (f64x2.sub (local.get $sum) (local.get $virtual)))
                (f64x2.sub (local.get $u) (local.get $virtual)))))
              (local.set $h (local.get $sum))))
          (local.set $w (f64x2.add (local.get $h) (local.get $l)))
          (local.set $squares (f64x2.add (local.get $squares) (f64x2.mul (local.get $w) (local.get $w))))
          (local.set $cross (f64x2.add (local.get $cross) (f64x2.mul (local.get $w) (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $w) (local.get $w)))))
          ;; The narrower window t + 1 (none after the last row).
          (local.set $narrow (i32.and (local.get $both) (i32.lt_s (i32.add (local.get $t) (i32.const 1)) (local.get $n))))
          (if (local.get $narrow)
            (then
              (if (i32.lt_s (local.get $entering) (local.get $n))
                (then
                  (local.set $u (local.get $in))
                  (local.set $sum (f64x2.add (local.get $h2) (local.get $u)))
                  (local.set $virtual (f64x2.sub (local.get $sum) (local.get $h2)))
                  (local.set $l2 (f64x2.add (local.get $l2) (f64x2.add
                    (f64x2.sub (local.get $h2) (f64x2.sub (local.get $sum) (local.get $virtual)))
                    (f64x2.sub (local.get $u) (local.get $virtual)))))
                  (local.set $h2 (local.get $sum))))
              (if (i32.ge_s (local.get $t) (i32.const 0))
                (then
                  (local.set $u (f64x2.neg (v128.load64_lane offset=262656 1 (i32.shl (i32.sub (local.get $t) (local.get $offset)) (i32.const 3)) (v128.load64_zero offset=512 (i32.shl (i32.sub (local.get $t) (local.get $offset)) (i32.const 3))))))
                  (local.set $sum (f64x2.add (local.get $h2) (local.get $u)))
                  (local.set $virtual (f64x2.sub (local.get $sum) (local.get $h2)))
                  (local.set $l2 (f64x2.add (local.get $l2) (f64x2.add
                    (f64x2.sub (local.get $h2) (f64x2.sub (local.get $sum) (local.get $virtual)))
                    (f64x2.sub (local.get $u) (local.get $virtual)))))
                  (local.set $h2 (local.get $sum))))
              (local.set $w (f64x2.add (local.get $h2) (local.get $l2)))
              (local.set $squares2 (f64x2.add (local.get $squares2) (f64x2.mul (local.get $w) (local.get $w))))
              (local.set $cross2 (f64x2.add (local.get $cross2) (f64x2.mul (local.get $w) (i8x16.shuffle 8 9 10 11 12 13 14 15 0 1 2 3 4 5 6 7 (local.get $w) (local.get $w)))))))
          (local.set $t (i32.add (local.get $t) (i32.const 1)))
          (br_if $window (i32.lt_s (local.get $t) (local.get $stop))))
        (call $addTotals (i32.const 32) (local.get $squares) (local.get $cross))
        (if (local.get $both) (then (call $addTotals (i32.const 96) (local.get $squares2) (local.get $cross2))))
        (br $block)))
    (call $storePair (i32.const 0) (local.get $h) (local.get $l))
    (call $storePair (i32.const 64) (local.get $h2) (local.get $l2)))

  ;; A block's sums into the totals at `at`: xx (lane 0 of squares) at at, xy (lane 0 of cross) at
  ;; at + 8, yy (lane 1 of squares) at at + 24.
  (func $addTotals (param $at i32) (param $squares v128) (param $cross v128)
    (f64.store (local.get $at) (f64.add (f64.load (local.get $at)) (f64x2.extract_lane 0 (local.get $squares))))
    (f64.store offset=8 (local.get $at) (f64.add (f64.load offset=8 (local.get $at)) (f64x2.extract_lane 0 (local.get $cross))))
    (f64.store offset=24 (local.get $at) (f64.add (f64.load offset=24 (local.get $at)) (f64x2.extract_lane 1 (local.get $squares)))))

  ;; A running pair's x part at `at` and its y part at `at` + 16 (as storePair leaves them) as one value.
  (func $loadPair (param $at i32) (result v128)
    (v128.load64_lane offset=16 1 (local.get $at) (v128.load64_zero (local.get $at))))

  ;; The running pairs at `at`: hx lx hy ly.
  (func $storePair (param $at i32) (param $h v128) (param $l v128)
    (f64.store (local.get $at) (f64x2.extract_lane 0 (local.get $h)))
    (f64.store offset=8 (local.get $at) (f64x2.extract_lane 0 (local.get $l)))
    (f64.store offset=16 (local.get $at) (f64x2.extract_lane 1 (local.get $h)))
    (f64.store offset=24 (local.get $at) (f64x2.extract_lane 1 (local.get $l))))

  ;; boundsLongRun.ts boundInfluenceSeries, chunk by chunk (x in column 0, y in column 1, `count` rows
  ;; each): three passes over the whole series, each call continuing the sums in the state. First the
  ;; plain sums of x and y (state 0, 1), then the centred sums xx yy xy about the means (state 2..4),
  ;; then each bound's series f_t = sum of g_a (term_a - m_a) over the nonzero g_a, with the gradients
  ;; at 256 (lower g0 g1 g2, upper g0 g1 g2): lower into column 2, upper into column 3.
  (func (export "plainSumsOfTwo") (param $count i32)
    (local $p i32) (local $stop i32) (local $sx f64) (local $sy f64)
    (local.set $sx (f64.load (i32.const 0)))
    (local.set $sy (f64.load (i32.const 8)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $sx (f64.add (local.get $sx) (f64.load offset=512 (local.get $p))))
        (local.set $sy (f64.add (local.get $sy) (f64.load offset=262656 (local.get $p))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $sx))
    (f64.store (i32.const 8) (local.get $sy)))

  (func (export "centredSumsOfTwo") (param $count i32) (param $mx f64) (param $my f64)
    (local $p i32) (local $stop i32) (local $dx f64) (local $dy f64)
    (local $sxx f64) (local $syy f64) (local $sxy f64)
    (local.set $sxx (f64.load (i32.const 16)))
    (local.set $syy (f64.load (i32.const 24)))
    (local.set $sxy (f64.load (i32.const 32)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $dx (f64.sub (f64.load offset=512 (local.get $p)) (local.get $mx)))
        (local.set $dy (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $my)))
        (local.set $sxx (f64.add (local.get $sxx) (f64.mul (local.get $dx) (local.get $dx))))
        (local.set $syy (f64.add (local.get $syy) (f64.mul (local.get $dy) (local.get $dy))))
        (local.set $sxy (f64.add (local.get $sxy) (f64.mul (local.get $dx) (local.get $dy))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (f64.store (i32.const 16) (local.get $sxx))
    (f64.store (i32.const 24) (local.get $syy))
    (f64.store (i32.const 32) (local.get $sxy)))

  (func (export "influenceOfTwo") (param $count i32) (param $mx f64) (param $my f64) (param $m0 f64) (param $m1 f64) (param $m2 f64)
    (call $influence (local.get $count) (local.get $mx) (local.get $my) (f64.load (i32.const 256)) (f64.load (i32.const 264))
      (f64.load (i32.const 272)) (local.get $m0) (local.get $m1) (local.get $m2) (i32.const 524800))
    (call $influence (local.get $count) (local.get $mx) (local.get $my) (f64.load (i32.const 280)) (f64.load (i32.const 288))
      (f64.load (i32.const 296)) (local.get $m0) (local.get $m1) (local.get $m2) (i32.const 786944)))

  ;; boundsLongRun.ts influenceChunk over rows 0..n-1 into the column at byte address `out`.
  (func $influence (param $n i32) (param $mx f64) (param $my f64) (param $g0 f64) (param $g1 f64) (param $g2 f64)
    (param $m0 f64) (param $m1 f64) (param $m2 f64) (param $out i32)
    (local $t i32) (local $p i32) (local $dx f64) (local $dy f64) (local $v f64)
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $t) (local.get $n)))
        (local.set $p (i32.shl (local.get $t) (i32.const 3)))
        (local.set $dx (f64.sub (f64.load offset=512 (local.get $p)) (local.get $mx)))
        (local.set $dy (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $my)))
        (local.set $v (f64.const 0))
        (if (f64.ne (local.get $g0) (f64.const 0)) (then (local.set $v (f64.add (local.get $v)
          (f64.mul (local.get $g0) (f64.sub (f64.mul (local.get $dx) (local.get $dx)) (local.get $m0)))))))
        (if (f64.ne (local.get $g1) (f64.const 0)) (then (local.set $v (f64.add (local.get $v)
          (f64.mul (local.get $g1) (f64.sub (f64.mul (local.get $dy) (local.get $dy)) (local.get $m1)))))))
        (if (f64.ne (local.get $g2) (f64.const 0)) (then (local.set $v (f64.add (local.get $v)
          (f64.mul (local.get $g2) (f64.sub (f64.mul (local.get $dx) (local.get $dy)) (local.get $m2)))))))
        (f64.store (i32.add (local.get $out) (local.get $p)) (local.get $v))
        (local.set $t (i32.add (local.get $t) (i32.const 1)))
        (br $row))))

  ;; sharpe.ts standardise, chunk by chunk (`count` rows of the series in column 0 each), three passes
  ;; over the whole series, each call continuing its sums in the state: the plain sum (state 0), the
  ;; squared deviations about the mean mu (state 1), then z = (x - mu) / sigma into column 1 and
  ;; z^2 - 1 into column 2 with the sums of z^2, z^3, z^4, z and z^2 - 1 (state 3..7).
  (func (export "sumOfOne") (param $count i32)
    (local $p i32) (local $stop i32) (local $sum f64)
    (local.set $sum (f64.load (i32.const 0)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $sum (f64.add (local.get $sum) (f64.load offset=512 (local.get $p))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (f64.store (i32.const 0) (local.get $sum)))

  (func (export "squaredDeviations") (param $count i32) (param $mu f64)
    (local $p i32) (local $stop i32) (local $d f64) (local $ss f64)
    (local.set $ss (f64.load (i32.const 8)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $d (f64.sub (f64.load offset=512 (local.get $p)) (local.get $mu)))
        (local.set $ss (f64.add (local.get $ss) (f64.mul (local.get $d) (local.get $d))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (f64.store (i32.const 8) (local.get $ss)))

  (func (export "standardiseChunk") (param $count i32) (param $mu f64) (param $sigma f64)
    (local $p i32) (local $stop i32) (local $z f64) (local $zz f64) (local $m2 f64) (local $m3 f64)
    (local $m4 f64) (local $sumFirst f64) (local $sumSecond f64)
    (local.set $m2 (f64.load (i32.const 24)))
    (local.set $m3 (f64.load (i32.const 32)))
    (local.set $m4 (f64.load (i32.const 40)))
    (local.set $sumFirst (f64.load (i32.const 48)))
    (local.set $sumSecond (f64.load (i32.const 56)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $z (f64.div (f64.sub (f64.load offset=512 (local.get $p)) (local.get $mu)) (local.get $sigma)))
        (local.set $zz (f64.sub (f64.mul (local.get $z) (local.get $z)) (f64.const 1)))
        (f64.store offset=262656 (local.get $p) (local.get $z))
        (f64.store offset=524800 (local.get $p) (local.get $zz))
        (local.set $sumFirst (f64.add (local.get $sumFirst) (local.get $z)))
        (local.set $sumSecond (f64.add (local.get $sumSecond) (local.get $zz)))
        (local.set $m2 (f64.add (local.get $m2) (f64.mul (local.get $z) (local.get $z))))
        (local.set $m3 (f64.add (local.get $m3) (f64.mul (f64.mul (local.get $z) (local.get $z)) (local.get $z))))
        (local.set $m4 (f64.add (local.get $m4)
          (f64.mul (f64.mul (f64.mul (local.get $z) (local.get $z)) (local.get $z)) (local.get $z))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row)))
    (f64.store (i32.const 24) (local.get $m2))
    (f64.store (i32.const 32) (local.get $m3))
    (f64.store (i32.const 40) (local.get $m4))
    (f64.store (i32.const 48) (local.get $sumFirst))
    (f64.store (i32.const 56) (local.get $sumSecond)))

  ;; The rate of row p (a byte offset): column 3's when hasRates, else `rate`.
  (func $rateAt (param $p i32) (param $hasRates i32) (param $rate f64) (result f64)
    (if (result f64) (local.get $hasRates)
      (then (f64.load offset=786944 (local.get $p))) (else (local.get $rate))))


  ;; assessPricing.ts influenceChunk over `count` <= 4,096 rows (low, high and the rates in columns 0, 1
  ;; and 3): the six influence series into column 2, 4,096 rows apart (fa fb fd1 fd2 fe1 fe2). Parameters
  ;; at 256: scale w v mx my vx vy c lower upper lambda beta varM gl1 gl2 gu0 gu2.
  (func (export "pricingInfluence") (param $count i32) (param $hasRates i32) (param $rate f64)
    (local $p i32) (local $stop i32) (local $r f64)
    (local $scale f64) (local $w f64) (local $v f64) (local $mx f64) (local $my f64) (local $vx f64) (local $vy f64)
    (local $c f64) (local $lower f64) (local $upper f64) (local $lambda f64) (local $beta f64) (local $varM f64)
    (local $gl1 f64) (local $gl2 f64) (local $gu0 f64) (local $gu2 f64)
    (local $dx f64) (local $dy f64) (local $zx f64) (local $zy f64) (local $zc f64) (local $ib f64)
    (local $iL f64) (local $iU f64) (local $iBeta f64)
    (local.set $scale (f64.load (i32.const 256)))
    (local.set $w (f64.load (i32.const 264)))
    (local.set $v (f64.load (i32.const 272)))
    (local.set $mx (f64.load (i32.const 280)))
    (local.set $my (f64.load (i32.const 288)))
    (local.set $vx (f64.load (i32.const 296)))
    (local.set $vy (f64.load (i32.const 304)))
    (local.set $c (f64.load (i32.const 312)))
    (local.set $lower (f64.load (i32.const 320)))
    (local.set $upper (f64.load (i32.const 328)))
    (local.set $lambda (f64.load (i32.const 336)))
    (local.set $beta (f64.load (i32.const 344)))
    (local.set $varM (f64.load (i32.const 352)))
    (local.set $gl1 (f64.load (i32.const 360)))
    (local.set $gl2 (f64.load (i32.const 368)))
    (local.set $gu0 (f64.load (i32.const 376)))
    (local.set $gu2 (f64.load (i32.const 384)))
    (local.set $stop (i32.shl (local.get $count) (i32.const 3)))
    (block $done
      (loop $row
        (br_if $done (i32.ge_u (local.get $p) (local.get $stop)))
        (local.set $r (call $rateAt (local.get $p) (local.get $hasRates) (local.get $rate)))
        (local.set $dx (f64.sub (f64.mul (f64.sub (f64.load offset=512 (local.get $p)) (local.get $r)) (local.get $scale)) (local.get $mx)))
        (local.set $dy (f64.sub (f64.mul (f64.sub (f64.load offset=262656 (local.get $p)) (local.get $r)) (local.get $scale)) (local.get $my)))
        (local.set $zx (f64.sub (f64.mul (local.get $dx) (local.get $dx)) (local.get $vx)))
        (local.set $zy (f64.sub (f64.mul (local.get $dy) (local.get $dy)) (local.get $vy)))
        (local.set $zc (f64.sub (f64.mul (local.get $dx) (local.get $dy)) (local.get $c)))
        (local.set $ib (f64.add (f64.mul (local.get $w) (local.get $dx)) (f64.mul (local.get $v) (local.get $dy))))
        (local.set $iL (f64.add (f64.mul (local.get $gl1) (local.get $zy)) (f64.mul (local.get $gl2) (local.get $zc))))
        (local.set $iU (f64.add (f64.mul (local.get $gu0) (local.get $zx)) (f64.mul (local.get $gu2) (local.get $zc))))
        (local.set $iBeta (f64.div
          (f64.sub
            (f64.add (f64.mul (local.get $w) (local.get $zx)) (f64.mul (local.get $v) (local.get $zc)))
            (f64.mul (local.get $beta)
              (f64.add
                (f64.add
                  (f64.mul (f64.mul (local.get $w) (local.get $w)) (local.get $zx))
                  (f64.mul (f64.mul (f64.mul (f64.const 2) (local.get $w)) (local.get $v)) (local.get $zc)))
                (f64.mul (f64.mul (local.get $v) (local.get $v)) (local.get $zy)))))
          (local.get $varM)))
        (f64.store offset=524800 (local.get $p) (local.get $dx))
        (f64.store offset=557568 (local.get $p) (local.get $ib))
        (f64.store offset=590336 (local.get $p)
          (f64.sub (f64.sub (local.get $dx) (f64.mul (local.get $lower) (local.get $ib))) (f64.mul (local.get $lambda) (local.get $iL))))
        (f64.store offset=623104 (local.get $p)
          (f64.sub (f64.add (f64.mul (local.get $upper) (local.get $ib)) (f64.mul (local.get $lambda) (local.get $iU))) (local.get $dx)))
        (f64.store offset=655872 (local.get $p)
          (f64.add (f64.mul (local.get $lambda) (f64.sub (local.get $iL) (local.get $iBeta)))
            (f64.mul (f64.sub (local.get $lower) (local.get $beta)) (local.get $ib))))
        (f64.store offset=688640 (local.get $p)
          (f64.add (f64.mul (local.get $lambda) (f64.sub (local.get $iU) (local.get $iBeta)))
            (f64.mul (f64.sub (local.get $upper) (local.get $beta)) (local.get $ib))))
        (local.set $p (i32.add (local.get $p) (i32.const 8)))
        (br $row))))
)
