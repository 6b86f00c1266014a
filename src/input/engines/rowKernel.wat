;; The row kernel of the byte engine: src/input/engines/rowKernel.ts drives it, byteGrid.ts (kernelRange)
;; holds the meaning of its output, and scanRange there is the JavaScript it must agree with.
;;
;; It reads the simple rows of a plain CSV: the row has exactly `nf` fields; every other byte is
;; plain (no NUL, CR, double quote or non-ASCII); the date field is a stamp of one of the forms
;; scanStamp reads (src/input/values/dateStamps.ts: YYYY-MM-DD with an optional time); every field that
;; `slots` maps to an output is [+-]digits[.digits]. A number of at most 19 digits whose mantissa is
;; below 2^53, with at most 22 fraction digits, is read as scanDecimal reads it (Clinger's fast path:
;; the digits accumulated as a 64-bit integer, exact, then one correctly rounded division by an exact
;; power of ten); any other is left to the caller (NaN, its span recorded, the row flagged 2), which
;; reads it correctly rounded too (the same double). Any other row is flagged 1
;; and read by the caller. Valid stamps get their key (milliseconds since 1970-01-01, H. Hinnant's
;; days_from_civil, exact in 64-bit integers); a well-formed stamp that is not a real date and time,
;; or one of another form than the column's, sets status to 1. The column's form (coded as
;; dateStamps.ts codes it) is the i32 at status + 4: -1 until the first stamp sets it.
;;
;; findLines: where each row of a byte range starts after a line feed, 16 bytes at a time (SIMD), and
;; whether the range holds a byte that is not plain (NUL, CR, double quote, non-ASCII).
;;
;; Memory (imported, laid out by the caller): pow10[k] = 10^k (k = 0..22, f64) at offset 0; starts
;; (i32, count + 1: offsets of the rows in the file, which starts at `base`; the byte before the next
;; start is the row's line feed); slots (i32 per field, -1 for fields not read); out (f64,
;; slot-major: slot * count + k); keys (f64); counts (i32); flags (u8); spans (i32 pairs, slot-major,
;; start and end of a long number); status (i32, then the form, i32). findLines writes whether its
;; range held a byte that is not plain to the i32 the caller names (248, after the powers of ten).
(module
  (import "env" "memory" (memory 1))

  (func $daysInMonth (param $y i32) (param $m i32) (result i32)
    (if (i32.eq (local.get $m) (i32.const 2))
      (then
        (return (i32.add (i32.const 28)
          (i32.and (i32.eqz (i32.rem_u (local.get $y) (i32.const 4)))
                   (i32.or (i32.ne (i32.rem_u (local.get $y) (i32.const 100)) (i32.const 0))
                           (i32.eqz (i32.rem_u (local.get $y) (i32.const 400)))))))))
    (if (result i32) (i32.or (i32.or (i32.eq (local.get $m) (i32.const 4)) (i32.eq (local.get $m) (i32.const 6)))
                             (i32.or (i32.eq (local.get $m) (i32.const 9)) (i32.eq (local.get $m) (i32.const 11))))
      (then (i32.const 30)) (else (i32.const 31))))

  ;; the two digits at $at as a number, or 100 when either is not a digit
  (func $two (param $at i32) (result i32)
    (local $a i32) (local $b i32)
    (local.set $a (i32.sub (i32.load8_u (local.get $at)) (i32.const 48)))
    (local.set $b (i32.sub (i32.load8_u (i32.add (local.get $at) (i32.const 1))) (i32.const 48)))
    (if (result i32) (i32.or (i32.gt_u (local.get $a) (i32.const 9)) (i32.gt_u (local.get $b) (i32.const 9)))
      (then (i32.const 100))
      (else (i32.add (i32.mul (local.get $a) (i32.const 10)) (local.get $b)))))

  ;; days from 1970-01-01 to y-m-d (y >= 1, so every division below is of a non-negative number)
  (func $daysFromCivil (param $y i32) (param $m i32) (param $d i32) (result i32)
    (local $era i32) (local $yoe i32) (local $doy i32)
    (if (i32.le_u (local.get $m) (i32.const 2)) (then (local.set $y (i32.sub (local.get $y) (i32.const 1)))))
    (local.set $era (i32.div_u (local.get $y) (i32.const 400)))
    (local.set $yoe (i32.sub (local.get $y) (i32.mul (local.get $era) (i32.const 400))))
    (local.set $doy (i32.add
      (i32.div_u (i32.add (i32.mul (i32.const 153)
        (i32.add (local.get $m) (select (i32.const -3) (i32.const 9) (i32.gt_u (local.get $m) (i32.const 2))))) (i32.const 2)) (i32.const 5))
      (i32.sub (local.get $d) (i32.const 1))))
    (i32.sub
      (i32.add (i32.mul (local.get $era) (i32.const 146097))
        (i32.add (i32.sub (i32.add (i32.mul (local.get $yoe) (i32.const 365)) (i32.div_u (local.get $yoe) (i32.const 4)))
                          (i32.div_u (local.get $yoe) (i32.const 100)))
                 (local.get $doy)))
      (i32.const 719468)))

  ;; For each line feed at p in [from, to), writes p + 1 - base (an offset into the file) to out;
  ;; returns how many. out must have room for to - from entries. Writes to $odd the i32 1 when some
  ;; byte of the range is NUL, CR, a double quote or non-ASCII (the bytes isPlain looks for), else 0.
  (func (export "findLines") (param $from i32) (param $to i32) (param $base i32) (param $out i32) (param $odd i32) (result i32)
    (local $i i32) (local $n i32) (local $mask i32) (local $lf v128) (local $v v128) (local $seen v128) (local $c i32)
    (local.set $lf (i8x16.splat (i32.const 10)))
    (local.set $i (local.get $from))
    (block $tail
      (loop $blocks
        (br_if $tail (i32.gt_u (i32.add (local.get $i) (i32.const 16)) (local.get $to)))
        (local.set $v (v128.load (local.get $i)))
        ;; the high bit of each lane: a non-ASCII byte, or a match (all ones) for NUL, CR or the quote
        (local.set $seen (v128.or (local.get $seen)
          (v128.or (v128.or (local.get $v) (i8x16.eq (local.get $v) (i8x16.splat (i32.const 0))))
                   (v128.or (i8x16.eq (local.get $v) (i8x16.splat (i32.const 13))) (i8x16.eq (local.get $v) (i8x16.splat (i32.const 34)))))))
        (local.set $mask (i8x16.bitmask (i8x16.eq (local.get $v) (local.get $lf))))
        (block $bits_done (loop $bits
          (br_if $bits_done (i32.eqz (local.get $mask)))
          (i32.store (i32.add (local.get $out) (i32.shl (local.get $n) (i32.const 2)))
            (i32.sub (i32.add (i32.add (local.get $i) (i32.ctz (local.get $mask))) (i32.const 1)) (local.get $base)))
          (local.set $n (i32.add (local.get $n) (i32.const 1)))
          (local.set $mask (i32.and (local.get $mask) (i32.sub (local.get $mask) (i32.const 1))))
          (br $bits)))
        (local.set $i (i32.add (local.get $i) (i32.const 16)))
        (br $blocks)))
    (i32.store (local.get $odd) (i32.ne (i8x16.bitmask (local.get $seen)) (i32.const 0)))
    (block $done (loop $scalar
      (br_if $done (i32.ge_u (local.get $i) (local.get $to)))
      (local.set $c (i32.load8_u (local.get $i)))
      (if (i32.or (i32.or (i32.eqz (local.get $c)) (i32.eq (local.get $c) (i32.const 13)))
                  (i32.or (i32.eq (local.get $c) (i32.const 34)) (i32.ge_u (local.get $c) (i32.const 128))))
        (then (i32.store (local.get $odd) (i32.const 1))))
      (if (i32.eq (local.get $c) (i32.const 10))
        (then
          (i32.store (i32.add (local.get $out) (i32.shl (local.get $n) (i32.const 2)))
            (i32.sub (i32.add (local.get $i) (i32.const 1)) (local.get $base)))
          (local.set $n (i32.add (local.get $n) (i32.const 1)))))
      (local.set $i (i32.add (local.get $i) (i32.const 1)))
      (br $scalar)))
    (local.get $n))

  ;; Reads rows k = 0 .. count - 1; returns how many were flagged.
  (func (export "readRows")
    (param $starts i32) (param $count i32) (param $base i32) (param $d i32) (param $slots i32) (param $nf i32)
    (param $dateIndex i32) (param $out i32) (param $keys i32) (param $counts i32) (param $flags i32)
    (param $spans i32) (param $status i32)
    (result i32)
    (local $k i32) (local $start i32) (local $end i32) (local $i i32) (local $f i32) (local $slot i32)
    (local $c i32) (local $neg i32) (local $mant i64) (local $nd i32) (local $fs i32) (local $frac i32)
    (local $v f64) (local $flagged i32) (local $flag i32) (local $dated i32) (local $p i32)
    (local $ymd i32) (local $y i32) (local $m i32) (local $day i32) (local $t i32) (local $field i32) (local $at i32)
    (local $q i32) (local $form i32) (local $ms i32) (local $hh i32) (local $mm i32) (local $ss i32)
    (local $lastDate i64) (local $lastDay i32) (local $lastValid i32) (local $lastDays i32)
    (i32.store (local.get $status) (i32.const 0))
    ;; the bytes of the last YYYY-MM-DD whose digits were read (none yet: zeros, which have no "-"),
    ;; whether it is in the calendar and its days from 1970-01-01: rows of one day (intraday stamps)
    ;; read and work them out once
    (block $rows_done
      (loop $rows
        (br_if $rows_done (i32.ge_u (local.get $k) (local.get $count)))
        (local.set $start (i32.add (local.get $base) (i32.load (i32.add (local.get $starts) (i32.shl (local.get $k) (i32.const 2))))))
        (local.set $end (i32.sub (i32.add (local.get $base)
          (i32.load (i32.add (local.get $starts) (i32.shl (i32.add (local.get $k) (i32.const 1)) (i32.const 2))))) (i32.const 1)))
        (if (i32.and (i32.gt_u (local.get $end) (local.get $start))
                     (i32.eq (i32.load8_u (i32.sub (local.get $end) (i32.const 1))) (i32.const 13)))
          (then (local.set $end (i32.sub (local.get $end) (i32.const 1)))))
        (local.set $i (local.get $start))
        (local.set $f (i32.const 0))
        (local.set $flag (i32.const 0))
        (local.set $dated (i32.const 0))
        (f64.store (i32.add (local.get $keys) (i32.shl (local.get $k) (i32.const 3))) (f64.const 0))
        (block $row_done
          (loop $fields
            (local.set $slot (i32.const -1))
            (if (i32.lt_u (local.get $f) (local.get $nf))
              (then (local.set $slot (i32.load (i32.add (local.get $slots) (i32.shl (local.get $f) (i32.const 2)))))))
            (if (i32.ge_s (local.get $slot) (i32.const 0))
              (then
                ;; a number: [+-]? digits [. digits], then the delimiter or the row end
                (local.set $field (local.get $i))
                (local.set $c (i32.load8_u (local.get $i)))
                (local.set $neg (i32.eq (local.get $c) (i32.const 45)))
                (if (i32.or (local.get $neg) (i32.eq (local.get $c) (i32.const 43)))
                  (then (local.set $i (i32.add (local.get $i) (i32.const 1)))))
                (local.set $mant (i64.const 0))
                (local.set $fs (local.get $i))
                (block $int_done (loop $int
                  (br_if $int_done (i32.ge_u (local.get $i) (local.get $end)))
                  (local.set $t (i32.sub (i32.load8_u (local.get $i)) (i32.const 48)))
                  (br_if $int_done (i32.gt_u (local.get $t) (i32.const 9)))
                  (local.set $mant (i64.add (i64.mul (local.get $mant) (i64.const 10)) (i64.extend_i32_u (local.get $t))))
                  (local.set $i (i32.add (local.get $i) (i32.const 1)))
                  (br $int)))
                (local.set $nd (i32.sub (local.get $i) (local.get $fs)))
                (local.set $frac (i32.const 0))
                (if (i32.and (i32.lt_u (local.get $i) (local.get $end)) (i32.eq (i32.load8_u (local.get $i)) (i32.const 46)))
                  (then
                    (local.set $i (i32.add (local.get $i) (i32.const 1)))
                    (local.set $fs (local.get $i))
                    (block $fr_done (loop $fr
                      (br_if $fr_done (i32.ge_u (local.get $i) (local.get $end)))
                      (local.set $t (i32.sub (i32.load8_u (local.get $i)) (i32.const 48)))
                      (br_if $fr_done (i32.gt_u (local.get $t) (i32.const 9)))
                      (local.set $mant (i64.add (i64.mul (local.get $mant) (i64.const 10)) (i64.extend_i32_u (local.get $t))))
                      (local.set $i (i32.add (local.get $i) (i32.const 1)))
                      (br $fr)))
                    (local.set $frac (i32.sub (local.get $i) (local.get $fs)))
                    (local.set $nd (i32.add (local.get $nd) (local.get $frac)))))
                ;; anything else in the field (spaces, exponents, text) or no digit: the caller reads the row
                (if (i32.or (i32.eqz (local.get $nd))
                            (i32.and (i32.lt_u (local.get $i) (local.get $end)) (i32.ne (i32.load8_u (local.get $i)) (local.get $d))))
                  (then (local.set $flag (i32.const 1)) (br $row_done)))
                (local.set $at (i32.add (i32.mul (local.get $slot) (local.get $count)) (local.get $k)))
                ;; the digits as an integer: 19 digits stay below 2^64, so the comparison with 2^53 is exact;
                ;; more digits may have wrapped round, and are left to the caller whatever their value
                (if (i32.or (i32.or (i64.ge_u (local.get $mant) (i64.const 9007199254740992)) (i32.gt_u (local.get $nd) (i32.const 19)))
                            (i32.gt_u (local.get $frac) (i32.const 22)))
                  (then
                    ;; too long for the fast path: NaN here, the caller parses the span [field, i)
                    (f64.store (i32.add (local.get $out) (i32.shl (local.get $at) (i32.const 3))) (f64.const nan))
                    (i32.store (i32.add (local.get $spans) (i32.shl (local.get $at) (i32.const 3))) (local.get $field))
                    (i32.store (i32.add (local.get $spans) (i32.add (i32.shl (local.get $at) (i32.const 3)) (i32.const 4))) (local.get $i))
                    (local.set $flag (i32.const 2)))
                  (else
                    (local.set $v (f64.convert_i64_u (local.get $mant)))
                    (if (local.get $frac)
                      (then (local.set $v (f64.div (local.get $v) (f64.load (i32.shl (local.get $frac) (i32.const 3)))))))
                    (if (local.get $neg) (then (local.set $v (f64.neg (local.get $v)))))
                    (f64.store (i32.add (local.get $out) (i32.shl (local.get $at) (i32.const 3))) (local.get $v)))))
              (else
                (if (i32.eq (local.get $f) (local.get $dateIndex))
                  (then
                    ;; a stamp as scanStamp (dateStamps.ts) reads it: YYYY-MM-DD, then the delimiter or the row end,
                    ;; or a time [ T]HH:MM[:SS[.f]][Z] (one to three fraction digits) and then one of them
                    (local.set $p (local.get $i))
                    (if (i32.or (i32.gt_u (i32.add (local.get $p) (i32.const 10)) (local.get $end))
                                (i32.or (i32.ne (i32.load8_u (i32.add (local.get $p) (i32.const 4))) (i32.const 45))
                                        (i32.ne (i32.load8_u (i32.add (local.get $p) (i32.const 7))) (i32.const 45))))
                      (then (local.set $flag (i32.const 1)) (br $row_done)))
                    (if (i32.or (i64.ne (i64.load (local.get $p)) (local.get $lastDate))
                                (i32.ne (i32.load16_u (i32.add (local.get $p) (i32.const 8))) (local.get $lastDay)))
                      (then
                        ;; the eight digits at offsets 0 1 2 3 5 6 8 9, as yyyymmdd
                        (local.set $ymd (i32.const 0))
                        (local.set $t (i32.const 0))
                        (block $digits_done
                          (loop $digits
                            (local.set $c (i32.sub (i32.load8_u (i32.add (local.get $p)
                              (i32.add (local.get $t) (i32.add (i32.gt_u (local.get $t) (i32.const 3)) (i32.gt_u (local.get $t) (i32.const 5)))))) (i32.const 48)))
                            (if (i32.gt_u (local.get $c) (i32.const 9)) (then (local.set $flag (i32.const 1)) (br $row_done)))
                            (local.set $ymd (i32.add (i32.mul (local.get $ymd) (i32.const 10)) (local.get $c)))
                            (local.set $t (i32.add (local.get $t) (i32.const 1)))
                            (br_if $digits (i32.lt_u (local.get $t) (i32.const 8)))))
                        (local.set $lastDate (i64.load (local.get $p)))
                        (local.set $lastDay (i32.load16_u (i32.add (local.get $p) (i32.const 8))))
                        (local.set $y (i32.div_u (local.get $ymd) (i32.const 10000)))
                        (local.set $m (i32.rem_u (i32.div_u (local.get $ymd) (i32.const 100)) (i32.const 100)))
                        (local.set $day (i32.rem_u (local.get $ymd) (i32.const 100)))
                        (local.set $lastValid (i32.and
                          (i32.and (i32.ge_u (local.get $y) (i32.const 1))
                                   (i32.and (i32.ge_u (local.get $m) (i32.const 1)) (i32.le_u (local.get $m) (i32.const 12))))
                          (i32.and (i32.ge_u (local.get $day) (i32.const 1))
                                   (i32.le_u (local.get $day) (call $daysInMonth (local.get $y) (local.get $m))))))
                        (if (local.get $lastValid)
                          (then (local.set $lastDays (call $daysFromCivil (local.get $y) (local.get $m) (local.get $day)))))))
                    (local.set $q (i32.add (local.get $p) (i32.const 10)))
                    (local.set $form (i32.const 0))
                    (local.set $ms (i32.const 0))
                    (if (i32.and (i32.lt_u (local.get $q) (local.get $end)) (i32.ne (i32.load8_u (local.get $q)) (local.get $d)))
                      (then
                        ;; a separator other than a space or T, a delimiter that a time could hold, no room
                        ;; for HH:MM: the caller reads the row
                        (local.set $c (i32.load8_u (local.get $q)))
                        (if (i32.or
                              (i32.or (i32.and (i32.ne (local.get $c) (i32.const 32)) (i32.ne (local.get $c) (i32.const 84)))
                                      (i32.or (i32.or (i32.eq (local.get $d) (i32.const 32)) (i32.eq (local.get $d) (i32.const 84)))
                                              (i32.or (i32.eq (local.get $d) (i32.const 58)) (i32.eq (local.get $d) (i32.const 90)))))
                              (i32.or (i32.gt_u (i32.add (local.get $q) (i32.const 6)) (local.get $end))
                                      (i32.ne (i32.load8_u (i32.add (local.get $q) (i32.const 3))) (i32.const 58))))
                          (then (local.set $flag (i32.const 1)) (br $row_done)))
                        (local.set $form (i32.or (i32.const 1) (i32.shl (i32.eq (local.get $c) (i32.const 84)) (i32.const 1))))
                        (local.set $hh (call $two (i32.add (local.get $q) (i32.const 1))))
                        (local.set $mm (call $two (i32.add (local.get $q) (i32.const 4))))
                        (local.set $ss (i32.const 0))
                        (local.set $q (i32.add (local.get $q) (i32.const 6)))
                        (if (i32.and (i32.lt_u (local.get $q) (local.get $end)) (i32.eq (i32.load8_u (local.get $q)) (i32.const 58)))
                          (then
                            (if (i32.gt_u (i32.add (local.get $q) (i32.const 3)) (local.get $end))
                              (then (local.set $flag (i32.const 1)) (br $row_done)))
                            (local.set $ss (call $two (i32.add (local.get $q) (i32.const 1))))
                            (local.set $form (i32.or (local.get $form) (i32.const 4)))
                            (local.set $q (i32.add (local.get $q) (i32.const 3)))
                            (if (i32.and (i32.lt_u (local.get $q) (local.get $end)) (i32.eq (i32.load8_u (local.get $q)) (i32.const 46)))
                              (then
                                ;; up to four digits are taken, so that a fourth is seen (and left to the caller)
                                (local.set $q (i32.add (local.get $q) (i32.const 1)))
                                (local.set $t (i32.const 0))
                                (block $frac_done (loop $frac
                                  (br_if $frac_done (i32.or (i32.ge_u (local.get $q) (local.get $end)) (i32.ge_u (local.get $t) (i32.const 4))))
                                  (local.set $c (i32.sub (i32.load8_u (local.get $q)) (i32.const 48)))
                                  (br_if $frac_done (i32.gt_u (local.get $c) (i32.const 9)))
                                  (local.set $ms (i32.add (i32.mul (local.get $ms) (i32.const 10)) (local.get $c)))
                                  (local.set $t (i32.add (local.get $t) (i32.const 1)))
                                  (local.set $q (i32.add (local.get $q) (i32.const 1)))
                                  (br $frac)))
                                (if (i32.or (i32.eqz (local.get $t)) (i32.gt_u (local.get $t) (i32.const 3)))
                                  (then (local.set $flag (i32.const 1)) (br $row_done)))
                                ;; milliseconds: .5 is 500, .05 is 50
                                (if (i32.eq (local.get $t) (i32.const 1)) (then (local.set $ms (i32.mul (local.get $ms) (i32.const 100)))))
                                (if (i32.eq (local.get $t) (i32.const 2)) (then (local.set $ms (i32.mul (local.get $ms) (i32.const 10)))))
                                (local.set $form (i32.or (local.get $form) (i32.shl (local.get $t) (i32.const 3))))))))
                        (if (i32.and (i32.lt_u (local.get $q) (local.get $end)) (i32.eq (i32.load8_u (local.get $q)) (i32.const 90)))
                          (then
                            (local.set $form (i32.or (local.get $form) (i32.const 32)))
                            (local.set $q (i32.add (local.get $q) (i32.const 1)))))
                        ;; more in the field, or a part that is not two digits: the caller reads the row
                        (if (i32.or (i32.and (i32.lt_u (local.get $q) (local.get $end)) (i32.ne (i32.load8_u (local.get $q)) (local.get $d)))
                                    (i32.or (i32.gt_u (local.get $hh) (i32.const 99))
                                            (i32.or (i32.gt_u (local.get $mm) (i32.const 99)) (i32.gt_u (local.get $ss) (i32.const 99)))))
                          (then (local.set $flag (i32.const 1)) (br $row_done)))
                        ;; an hour, minute or second out of range is not a time, as a date not in the calendar
                        (if (i32.or (i32.gt_u (local.get $hh) (i32.const 23))
                                    (i32.or (i32.gt_u (local.get $mm) (i32.const 59)) (i32.gt_u (local.get $ss) (i32.const 59))))
                          (then (i32.store (local.get $status) (i32.const 1))))
                        (local.set $ms (i32.add (local.get $ms)
                          (i32.mul (i32.add (i32.mul (i32.add (i32.mul (local.get $hh) (i32.const 60)) (local.get $mm)) (i32.const 60)) (local.get $ss))
                                   (i32.const 1000))))))
                    ;; the column's form (status + 4): set by its first stamp; a stamp of another form is left
                    ;; to the text path, as a date not in the calendar
                    (local.set $t (i32.load (i32.add (local.get $status) (i32.const 4))))
                    (if (i32.eq (local.get $t) (i32.const -1))
                      (then (i32.store (i32.add (local.get $status) (i32.const 4)) (local.get $form)))
                      (else (if (i32.ne (local.get $t) (local.get $form)) (then (i32.store (local.get $status) (i32.const 1))))))
                    (if (local.get $lastValid)
                      (then
                        (f64.store (i32.add (local.get $keys) (i32.shl (local.get $k) (i32.const 3)))
                          (f64.convert_i64_s (i64.add
                            (i64.mul (i64.extend_i32_s (local.get $lastDays)) (i64.const 86400000))
                            (i64.extend_i32_u (local.get $ms))))))
                      (else (i32.store (local.get $status) (i32.const 1))))
                    (local.set $dated (i32.const 1))
                    (local.set $i (local.get $q))))
                ;; the rest of the field: any NUL, CR, double quote or non-ASCII byte flags the row
                (block $skip_done (loop $skip
                  (br_if $skip_done (i32.ge_u (local.get $i) (local.get $end)))
                  (local.set $c (i32.load8_u (local.get $i)))
                  (br_if $skip_done (i32.eq (local.get $c) (local.get $d)))
                  (if (i32.or (i32.or (i32.eqz (local.get $c)) (i32.eq (local.get $c) (i32.const 13)))
                              (i32.or (i32.eq (local.get $c) (i32.const 34)) (i32.ge_u (local.get $c) (i32.const 128))))
                    (then (local.set $flag (i32.const 1)) (br $row_done)))
                  (local.set $i (i32.add (local.get $i) (i32.const 1)))
                  (br $skip)))))
            (local.set $f (i32.add (local.get $f) (i32.const 1)))
            (br_if $row_done (i32.ge_u (local.get $i) (local.get $end)))
            (local.set $i (i32.add (local.get $i) (i32.const 1)))
            (br $fields)))
        (if (i32.or (i32.eqz (local.get $dated)) (i32.ne (local.get $f) (local.get $nf))) (then (local.set $flag (i32.const 1))))
        (i32.store (i32.add (local.get $counts) (i32.shl (local.get $k) (i32.const 2))) (local.get $f))
        (i32.store8 (i32.add (local.get $flags) (local.get $k)) (local.get $flag))
        (local.set $flagged (i32.add (local.get $flagged) (i32.ne (local.get $flag) (i32.const 0))))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (br $rows)))
    (local.get $flagged))
)
