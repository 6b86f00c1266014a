;; Ryu's shortest digits and their layout (Adams 2018), the part of csvRowsKernel.wat that finds and writes a
;; number's text: scripts/buildKernels.mjs puts these functions where csvRowsKernel.wat says
;; `;; include: ryu.wat`, and assembles the whole. Not a module of its own: it uses the kernel's memory
;; (the digit pairs at 512, the multipliers at 1024) as csvRowsKernel.wat lays it out.

  ;; The `count` digits of v (zero-padded) ending just before `end`, two at a time from the pairs
  ;; "00" .. "99" at 512.
  (func $digits (param $v i32) (param $count i32) (param $end i32)
    (local $q i32)
    (block $done
      (loop $next
        (br_if $done (i32.lt_s (local.get $count) (i32.const 2)))
        (local.set $end (i32.sub (local.get $end) (i32.const 2)))
        (local.set $q (i32.div_u (local.get $v) (i32.const 100)))
        (i32.store16 (local.get $end)
          (i32.load16_u offset=512 (i32.shl (i32.sub (local.get $v) (i32.mul (local.get $q) (i32.const 100))) (i32.const 1))))
        (local.set $v (local.get $q))
        (local.set $count (i32.sub (local.get $count) (i32.const 2)))
        (br $next)))
    (if (i32.eq (local.get $count) (i32.const 1))
      (then (i32.store8 (i32.sub (local.get $end) (i32.const 1)) (i32.add (i32.const 48) (local.get $v))))))

  ;; The 8 digits of v (< 10^8, zero-padded) ending just before `end`: four pairs from two
  ;; independent halves.
  (func $digits8 (param $v i32) (param $end i32)
    (local $a i32) (local $b i32) (local $a1 i32) (local $b1 i32)
    (local.set $a (i32.div_u (local.get $v) (i32.const 10000)))
    (local.set $b (i32.sub (local.get $v) (i32.mul (local.get $a) (i32.const 10000))))
    (local.set $a1 (i32.div_u (local.get $a) (i32.const 100)))
    (local.set $b1 (i32.div_u (local.get $b) (i32.const 100)))
    (i32.store16 (i32.sub (local.get $end) (i32.const 8)) (i32.load16_u offset=512 (i32.shl (local.get $a1) (i32.const 1))))
    (i32.store16 (i32.sub (local.get $end) (i32.const 6))
      (i32.load16_u offset=512 (i32.shl (i32.sub (local.get $a) (i32.mul (local.get $a1) (i32.const 100))) (i32.const 1))))
    (i32.store16 (i32.sub (local.get $end) (i32.const 4)) (i32.load16_u offset=512 (i32.shl (local.get $b1) (i32.const 1))))
    (i32.store16 (i32.sub (local.get $end) (i32.const 2))
      (i32.load16_u offset=512 (i32.shl (i32.sub (local.get $b) (i32.mul (local.get $b1) (i32.const 100))) (i32.const 1)))))

  ;; The `count` digits of v (up to 17, zero-padded) ending just before `end`: eight at a time from the
  ;; right, the rest two at a time.
  (func $digits64 (param $v i64) (param $count i32) (param $end i32)
    (local $upper i64)
    (block $short
      (loop $eight
        (br_if $short (i32.lt_s (local.get $count) (i32.const 8)))
        (local.set $upper (i64.div_u (local.get $v) (i64.const 100000000)))
        (call $digits8 (i32.wrap_i64 (i64.sub (local.get $v) (i64.mul (local.get $upper) (i64.const 100000000)))) (local.get $end))
        (local.set $v (local.get $upper))
        (local.set $end (i32.sub (local.get $end) (i32.const 8)))
        (local.set $count (i32.sub (local.get $count) (i32.const 8)))
        (br $eight)))
    (call $digits (i32.wrap_i64 (local.get $v)) (local.get $count) (local.get $end)))

  ;; String(x)'s text of positive x in [1e-6, 2^53), and its end; -1 for any other x (the caller then
  ;; writes String(x)). The digits are Ryu's (Adams 2018: the shortest decimal that reads back as x, the
  ;; closest such; for these x it is unique, as ECMAScript's Number::toString wants it), laid out as
  ;; Number::toString lays out numbers from 1e-6 to 1e21. Only Ryu's branch for binary exponents below 0
  ;; is needed (x < 2^53). The 128-bit multipliers (5^i scaled to 125 bits) are at 1024, 16 bytes each
  ;; for i = 0 .. 79, written by the caller.
  (func $shortest (param $x f64) (param $at i32) (result i32)
    (local $bits i64) (local $mantissa i64) (local $e2 i32) (local $m2 i64) (local $even i32) (local $mv i64)
    (local $mmShift i32) (local $q i32) (local $e10 i32) (local $i i32) (local $j i32) (local $table i32)
    (local $vr i64) (local $vp i64) (local $vm i64) (local $vmZeros i32) (local $vrZeros i32) (local $removed i32)
    (local $last i32) (local $vpDiv i64) (local $vmDiv i64) (local $vrDiv i64) (local $roundUp i32) (local $output i64)
    (local $length i32) (local $n i32) (local $z i32)
    (local $m i64) (local $mul0 i64) (local $mul1 i64) (local $lo i64) (local $tmp i64) (local $mid i64) (local $hi i64) (local $p i64)
    (local $lo2 i64) (local $mid2 i64) (local $hi2 i64) (local $lo3 i64) (local $mid3 i64) (local $hi3 i64)
    (local $paLo i64) (local $paHi i64) (local $pbLo i64) (local $pbHi i64) (local $pb00 i64) (local $pmid1 i64) (local $pmid2 i64)
    (if (i32.eqz (i32.and (f64.ge (local.get $x) (f64.const 1e-6)) (f64.lt (local.get $x) (f64.const 9007199254740992))))
      (then (return (i32.const -1))))
    (local.set $bits (i64.reinterpret_f64 (local.get $x)))
    (local.set $mantissa (i64.and (local.get $bits) (i64.const 0xfffffffffffff)))
    (local.set $e2 (i32.sub (i32.wrap_i64 (i64.shr_u (local.get $bits) (i64.const 52))) (i32.const 1077)))
    (local.set $m2 (i64.or (local.get $mantissa) (i64.const 0x10000000000000)))
    (local.set $even (i64.eqz (i64.and (local.get $m2) (i64.const 1))))
    (local.set $mv (i64.shl (local.get $m2) (i64.const 2)))
    (local.set $mmShift (i64.ne (local.get $mantissa) (i64.const 0)))
    ;; q = max(0, log10(5^-e2) - 1), e10 = q + e2, i = -e2 - q, j = q - (pow5bits(i) - 125).
    (local.set $q (i32.sub
      (i32.shr_u (i32.mul (i32.sub (i32.const 0) (local.get $e2)) (i32.const 732923)) (i32.const 20))
      (i32.gt_s (i32.sub (i32.const 0) (local.get $e2)) (i32.const 1))))
    (local.set $e10 (i32.add (local.get $q) (local.get $e2)))
    (local.set $i (i32.sub (i32.sub (i32.const 0) (local.get $e2)) (local.get $q)))
    (local.set $j (i32.sub (local.get $q)
      (i32.sub (i32.add (i32.shr_u (i32.mul (local.get $i) (i32.const 1217359)) (i32.const 19)) (i32.const 1)) (i32.const 125))))
    (local.set $table (i32.add (i32.const 1024) (i32.shl (local.get $i) (i32.const 4))))
    ;; Ryu's mulShiftAll64 in its form for 64-bit products, inline: vr, vp and vm are the multiplier
    ;; at $table times 4 m2, 4 m2 + 2 and 4 m2 - 1 - mmShift, shifted right by j (two products, not six;
    ;; the 128-bit products from 32-bit halves; each shift (hi:mid) >> dist, 0 <= dist < 64).
    (local.set $m (i64.shl (local.get $m2) (i64.const 1)))
    (local.set $mul0 (i64.load (local.get $table)))
    (local.set $mul1 (i64.load offset=8 (local.get $table)))
    (local.set $paLo (i64.and (local.get $m) (i64.const 0xffffffff)))
    (local.set $paHi (i64.shr_u (local.get $m) (i64.const 32)))
    (local.set $pbLo (i64.and (local.get $mul0) (i64.const 0xffffffff)))
    (local.set $pbHi (i64.shr_u (local.get $mul0) (i64.const 32)))
    (local.set $pb00 (i64.mul (local.get $paLo) (local.get $pbLo)))
    (local.set $pmid1 (i64.add (i64.mul (local.get $paHi) (local.get $pbLo)) (i64.shr_u (local.get $pb00) (i64.const 32))))
    (local.set $pmid2 (i64.add (i64.mul (local.get $paLo) (local.get $pbHi)) (i64.and (local.get $pmid1) (i64.const 0xffffffff))))
    (local.set $lo (i64.or (i64.shl (local.get $pmid2) (i64.const 32)) (i64.and (local.get $pb00) (i64.const 0xffffffff))))
    (local.set $tmp (i64.add (i64.add (i64.mul (local.get $paHi) (local.get $pbHi)) (i64.shr_u (local.get $pmid1) (i64.const 32)))
      (i64.shr_u (local.get $pmid2) (i64.const 32))))
    (local.set $paLo (i64.and (local.get $m) (i64.const 0xffffffff)))
    (local.set $paHi (i64.shr_u (local.get $m) (i64.const 32)))
    (local.set $pbLo (i64.and (local.get $mul1) (i64.const 0xffffffff)))
    (local.set $pbHi (i64.shr_u (local.get $mul1) (i64.const 32)))
    (local.set $pb00 (i64.mul (local.get $paLo) (local.get $pbLo)))
    (local.set $pmid1 (i64.add (i64.mul (local.get $paHi) (local.get $pbLo)) (i64.shr_u (local.get $pb00) (i64.const 32))))
    (local.set $pmid2 (i64.add (i64.mul (local.get $paLo) (local.get $pbHi)) (i64.and (local.get $pmid1) (i64.const 0xffffffff))))
    (local.set $p (i64.or (i64.shl (local.get $pmid2) (i64.const 32)) (i64.and (local.get $pb00) (i64.const 0xffffffff))))
    (local.set $hi (i64.add (i64.add (i64.mul (local.get $paHi) (local.get $pbHi)) (i64.shr_u (local.get $pmid1) (i64.const 32)))
      (i64.shr_u (local.get $pmid2) (i64.const 32))))
    (local.set $mid (i64.add (local.get $tmp) (local.get $p)))
    (local.set $hi (i64.add (local.get $hi) (i64.extend_i32_u (i64.lt_u (local.get $mid) (local.get $tmp)))))
    (local.set $lo2 (i64.add (local.get $lo) (local.get $mul0)))
    (local.set $mid2 (i64.add (i64.add (local.get $mid) (local.get $mul1)) (i64.extend_i32_u (i64.lt_u (local.get $lo2) (local.get $lo)))))
    (local.set $hi2 (i64.add (local.get $hi) (i64.extend_i32_u (i64.lt_u (local.get $mid2) (local.get $mid)))))
    (if (local.get $mmShift)
      (then
        (local.set $lo3 (i64.sub (local.get $lo) (local.get $mul0)))
        (local.set $mid3 (i64.sub (i64.sub (local.get $mid) (local.get $mul1)) (i64.extend_i32_u (i64.gt_u (local.get $lo3) (local.get $lo)))))
        (local.set $hi3 (i64.sub (local.get $hi) (i64.extend_i32_u (i64.gt_u (local.get $mid3) (local.get $mid)))))
        (local.set $vm (select (local.get $mid3)
      (i64.or (i64.shl (local.get $hi3) (i64.extend_i32_u (i32.sub (i32.const 64) (i32.sub (local.get $j) (i32.const 65)))))
        (i64.shr_u (local.get $mid3) (i64.extend_i32_u (i32.sub (local.get $j) (i32.const 65)))))
      (i32.eqz (i32.sub (local.get $j) (i32.const 65))))))
      (else
        (local.set $lo3 (i64.add (local.get $lo) (local.get $lo)))
        (local.set $mid3 (i64.add (i64.add (local.get $mid) (local.get $mid)) (i64.extend_i32_u (i64.lt_u (local.get $lo3) (local.get $lo)))))
        (local.set $hi3 (i64.add (i64.add (local.get $hi) (local.get $hi)) (i64.extend_i32_u (i64.lt_u (local.get $mid3) (local.get $mid)))))
        (local.set $lo (i64.sub (local.get $lo3) (local.get $mul0)))
        (local.set $tmp (i64.sub (i64.sub (local.get $mid3) (local.get $mul1)) (i64.extend_i32_u (i64.gt_u (local.get $lo) (local.get $lo3)))))
        (local.set $p (i64.sub (local.get $hi3) (i64.extend_i32_u (i64.gt_u (local.get $tmp) (local.get $mid3)))))
        (local.set $vm (select (local.get $tmp)
      (i64.or (i64.shl (local.get $p) (i64.extend_i32_u (i32.sub (i32.const 64) (i32.sub (local.get $j) (i32.const 64)))))
        (i64.shr_u (local.get $tmp) (i64.extend_i32_u (i32.sub (local.get $j) (i32.const 64)))))
      (i32.eqz (i32.sub (local.get $j) (i32.const 64)))))))
    (local.set $vr (select (local.get $mid)
      (i64.or (i64.shl (local.get $hi) (i64.extend_i32_u (i32.sub (i32.const 64) (i32.sub (local.get $j) (i32.const 65)))))
        (i64.shr_u (local.get $mid) (i64.extend_i32_u (i32.sub (local.get $j) (i32.const 65)))))
      (i32.eqz (i32.sub (local.get $j) (i32.const 65)))))
    (local.set $vp (select (local.get $mid2)
      (i64.or (i64.shl (local.get $hi2) (i64.extend_i32_u (i32.sub (i32.const 64) (i32.sub (local.get $j) (i32.const 65)))))
        (i64.shr_u (local.get $mid2) (i64.extend_i32_u (i32.sub (local.get $j) (i32.const 65)))))
      (i32.eqz (i32.sub (local.get $j) (i32.const 65)))))
    (if (i32.le_u (local.get $q) (i32.const 1))
      (then
        (local.set $vrZeros (i32.const 1))
        (if (local.get $even)
          (then (local.set $vmZeros (local.get $mmShift)))
          (else (local.set $vp (i64.sub (local.get $vp) (i64.const 1))))))
      (else
        (if (i32.lt_u (local.get $q) (i32.const 63))
          (then
            (local.set $vrZeros (i64.eqz (i64.and (local.get $mv)
              (i64.sub (i64.shl (i64.const 1) (i64.extend_i32_u (local.get $q))) (i64.const 1)))))))))
    ;; The shortest: digits removed while the interval (vm, vp) still holds a shorter decimal.
    (if (i32.or (local.get $vmZeros) (local.get $vrZeros))
      (then
        (block $shortened
          (loop $fewer
            (local.set $vpDiv (i64.div_u (local.get $vp) (i64.const 10)))
            (local.set $vmDiv (i64.div_u (local.get $vm) (i64.const 10)))
            (br_if $shortened (i64.le_u (local.get $vpDiv) (local.get $vmDiv)))
            (local.set $vmZeros (i32.and (local.get $vmZeros)
              (i64.eqz (i64.sub (local.get $vm) (i64.mul (local.get $vmDiv) (i64.const 10))))))
            (local.set $vrZeros (i32.and (local.get $vrZeros) (i32.eqz (local.get $last))))
            (local.set $vrDiv (i64.div_u (local.get $vr) (i64.const 10)))
            (local.set $last (i32.wrap_i64 (i64.sub (local.get $vr) (i64.mul (local.get $vrDiv) (i64.const 10)))))
            (local.set $vr (local.get $vrDiv))
            (local.set $vp (local.get $vpDiv))
            (local.set $vm (local.get $vmDiv))
            (local.set $removed (i32.add (local.get $removed) (i32.const 1)))
            (br $fewer)))
        (if (local.get $vmZeros)
          (then
            (block $stopped
              (loop $zeros
                (local.set $vmDiv (i64.div_u (local.get $vm) (i64.const 10)))
                (br_if $stopped (i64.ne (i64.sub (local.get $vm) (i64.mul (local.get $vmDiv) (i64.const 10))) (i64.const 0)))
                (local.set $vrZeros (i32.and (local.get $vrZeros) (i32.eqz (local.get $last))))
                (local.set $vrDiv (i64.div_u (local.get $vr) (i64.const 10)))
                (local.set $last (i32.wrap_i64 (i64.sub (local.get $vr) (i64.mul (local.get $vrDiv) (i64.const 10)))))
                (local.set $vr (local.get $vrDiv))
                (local.set $vp (i64.div_u (local.get $vp) (i64.const 10)))
                (local.set $vm (local.get $vmDiv))
                (local.set $removed (i32.add (local.get $removed) (i32.const 1)))
                (br $zeros)))))
        ;; A tie, exactly: round half to even.
        (if (i32.and (i32.and (local.get $vrZeros) (i32.eq (local.get $last) (i32.const 5)))
              (i64.eqz (i64.and (local.get $vr) (i64.const 1))))
          (then (local.set $last (i32.const 4))))
        (local.set $output (i64.add (local.get $vr) (i64.extend_i32_u (i32.or
          (i32.and (i64.eq (local.get $vr) (local.get $vm)) (i32.or (i32.eqz (local.get $even)) (i32.eqz (local.get $vmZeros))))
          (i32.ge_u (local.get $last) (i32.const 5)))))))
      (else
        (local.set $vpDiv (i64.div_u (local.get $vp) (i64.const 100)))
        (local.set $vmDiv (i64.div_u (local.get $vm) (i64.const 100)))
        (if (i64.gt_u (local.get $vpDiv) (local.get $vmDiv))
          (then
            (local.set $vrDiv (i64.div_u (local.get $vr) (i64.const 100)))
            (local.set $roundUp (i64.ge_u (i64.sub (local.get $vr) (i64.mul (local.get $vrDiv) (i64.const 100))) (i64.const 50)))
            (local.set $vr (local.get $vrDiv))
            (local.set $vp (local.get $vpDiv))
            (local.set $vm (local.get $vmDiv))
            (local.set $removed (i32.const 2))))
        (block $shortened
          (loop $fewer
            (local.set $vpDiv (i64.div_u (local.get $vp) (i64.const 10)))
            (local.set $vmDiv (i64.div_u (local.get $vm) (i64.const 10)))
            (br_if $shortened (i64.le_u (local.get $vpDiv) (local.get $vmDiv)))
            (local.set $vrDiv (i64.div_u (local.get $vr) (i64.const 10)))
            (local.set $roundUp (i64.ge_u (i64.sub (local.get $vr) (i64.mul (local.get $vrDiv) (i64.const 10))) (i64.const 5)))
            (local.set $vr (local.get $vrDiv))
            (local.set $vp (local.get $vpDiv))
            (local.set $vm (local.get $vmDiv))
            (local.set $removed (i32.add (local.get $removed) (i32.const 1)))
            (br $fewer)))
        (local.set $output (i64.add (local.get $vr)
          (i64.extend_i32_u (i32.or (i64.eq (local.get $vr) (local.get $vm)) (local.get $roundUp)))))))
    ;; output x 10^(e10 + removed): its length, and n, the decimal point's place (Number::toString's n).
    (local.set $length (i32.const 1))
    (block $counted
      (if (i64.ge_u (local.get $output) (i64.const 10000000000000000)) (then (local.set $length (i32.const 17)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 1000000000000000)) (then (local.set $length (i32.const 16)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 100000000000000)) (then (local.set $length (i32.const 15)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 10000000000000)) (then (local.set $length (i32.const 14)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 1000000000000)) (then (local.set $length (i32.const 13)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 100000000000)) (then (local.set $length (i32.const 12)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 10000000000)) (then (local.set $length (i32.const 11)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 1000000000)) (then (local.set $length (i32.const 10)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 100000000)) (then (local.set $length (i32.const 9)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 10000000)) (then (local.set $length (i32.const 8)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 1000000)) (then (local.set $length (i32.const 7)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 100000)) (then (local.set $length (i32.const 6)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 10000)) (then (local.set $length (i32.const 5)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 1000)) (then (local.set $length (i32.const 4)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 100)) (then (local.set $length (i32.const 3)) (br $counted)))
      (if (i64.ge_u (local.get $output) (i64.const 10)) (then (local.set $length (i32.const 2)) (br $counted)))
    )
    (local.set $n (i32.add (i32.add (local.get $e10) (local.get $removed)) (local.get $length)))
    (if (i32.le_s (local.get $n) (i32.const 0))
      (then
        (i32.store16 (local.get $at) (i32.const 0x2e30)) ;; "0."
        (local.set $at (i32.add (local.get $at) (i32.const 2)))
        (local.set $z (local.get $n))
        (block $zeros
          (loop $zero
            (br_if $zeros (i32.ge_s (local.get $z) (i32.const 0)))
            (i32.store8 (local.get $at) (i32.const 48))
            (local.set $at (i32.add (local.get $at) (i32.const 1)))
            (local.set $z (i32.add (local.get $z) (i32.const 1)))
            (br $zero)))
        (call $digits64 (local.get $output) (local.get $length) (i32.add (local.get $at) (local.get $length)))
        (return (i32.add (local.get $at) (local.get $length)))))
    (if (i32.lt_s (local.get $n) (local.get $length))
      (then
        ;; The digits one place right, then the first n back left with the point after them.
        (call $digits64 (local.get $output) (local.get $length) (i32.add (local.get $at) (i32.add (local.get $length) (i32.const 1))))
        (local.set $z (i32.const 0))
        (block $moved
          (loop $move
            (br_if $moved (i32.ge_s (local.get $z) (local.get $n)))
            (i32.store8 (i32.add (local.get $at) (local.get $z)) (i32.load8_u offset=1 (i32.add (local.get $at) (local.get $z))))
            (local.set $z (i32.add (local.get $z) (i32.const 1)))
            (br $move)))
        (i32.store8 (i32.add (local.get $at) (local.get $n)) (i32.const 46))
        (return (i32.add (local.get $at) (i32.add (local.get $length) (i32.const 1))))))
    (call $digits64 (local.get $output) (local.get $length) (i32.add (local.get $at) (local.get $length)))
    (local.set $z (local.get $length))
    (block $filled
      (loop $fill
        (br_if $filled (i32.ge_s (local.get $z) (local.get $n)))
        (i32.store8 (i32.add (local.get $at) (local.get $z)) (i32.const 48))
        (local.set $z (i32.add (local.get $z) (i32.const 1)))
        (br $fill)))
    (i32.add (local.get $at) (select (local.get $n) (local.get $length) (i32.gt_s (local.get $n) (local.get $length)))))
