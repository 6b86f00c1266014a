;; roll's CSV rows in WebAssembly (csvRowsKernel.ts): the numbers of a block of windows written as
;; bytes, each the very text numberBytes.ts writeNumber gives (String(x)), by the same arithmetic in the
;; same order (doubles, Dekker's product, Knuth's two-sum), so the same bytes. A number the fast path
;; cannot settle is handed back to the caller, which writes String(x) and resumes after it.
;;
;; Memory (laid out by the caller, grown as a block needs): the state at 0 (i32 row, column, position
;; of a number handed back, then the end), the decades (26 doubles) at 64, the powers of ten (23
;; doubles) at 272 and the digit pairs "00" .. "99" at 512, all written by the caller; then from 1024
;; the rows' prefix, each row's head (an i32 length
;; and its bytes: dates and observations, written by the caller), the numbers column by column, and
;; the rows written.
(module
  (memory (export "memory") 1 65536)

  ;; numberBytes.ts compareDifference: -1, 0 or 1 as the exact difference a - b compares with h.
  (func $compare (param $a f64) (param $b f64) (param $h f64) (result i32)
    (local $s f64) (local $bb f64) (local $low f64)
    (local.set $s (f64.sub (local.get $a) (local.get $b)))
    (local.set $bb (f64.sub (local.get $s) (local.get $a)))
    (local.set $low (f64.sub
      (f64.sub (local.get $a) (f64.sub (local.get $s) (local.get $bb)))
      (f64.add (local.get $b) (local.get $bb))))
    (if (f64.ne (local.get $s) (local.get $h))
      (then (return (select (i32.const -1) (i32.const 1) (f64.lt (local.get $s) (local.get $h))))))
    (select (i32.const -1)
      (select (i32.const 1) (i32.const 0) (f64.gt (local.get $low) (f64.const 0)))
      (f64.lt (local.get $low) (f64.const 0))))

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

    ;; numberBytes.ts writePositive: positive x's text at `at`, and its end, or -1 when it cannot be sure.
  (func $positive (param $x f64) (param $at i32) (result i32)
    (local $bits i64) (local $high i32) (local $biased i32) (local $e i32) (local $p i32)
    (local $b f64) (local $big f64) (local $t f64) (local $xh f64) (local $xl f64) (local $bh f64)
    (local $bl f64) (local $small f64) (local $h f64) (local $upper f64) (local $lower f64)
    (local $unit f64) (local $below f64) (local $quotient i32) (local $remainder f64) (local $next f64)
    (local $q i32) (local $r f64) (local $k f64) (local $down i32) (local $up i32) (local $middle f64)
    (local $low f64) (local $carry f64) (local $count i32) (local $n i32) (local $z i32)
    (local $head i32) (local $tail i32)
    (if (i32.eqz (i32.and (f64.ge (local.get $x) (f64.const 1e-6)) (f64.lt (local.get $x) (f64.const 1e17))))
      (then (return (i32.const -1))))
    (local.set $bits (i64.reinterpret_f64 (local.get $x)))
    (local.set $high (i32.wrap_i64 (i64.shr_u (local.get $bits) (i64.const 32))))
    ;; a power of two
    (if (i32.and (i32.eqz (i32.and (local.get $high) (i32.const 0xfffff))) (i32.eqz (i32.wrap_i64 (local.get $bits))))
      (then (return (i32.const -1))))
    (local.set $biased (i32.shr_u (local.get $high) (i32.const 20)))
    ;; The decade: floor((biased - 1023) log10 2), or one more.
    (local.set $e (i32.trunc_f64_s (f64.floor (f64.mul
      (f64.convert_i32_s (i32.sub (local.get $biased) (i32.const 1023)))
      (f64.const 0.3010299956639812)))))
    (if (f64.ge (local.get $x) (f64.load offset=64 (i32.shl (i32.add (local.get $e) (i32.const 8)) (i32.const 3))))
      (then (local.set $e (i32.add (local.get $e) (i32.const 1)))))
    ;; X = x 10^p in [1e16, 1e17) exactly as big + small (Dekker's product), checked.
    (local.set $p (i32.sub (i32.const 16) (local.get $e)))
    (if (i32.gt_u (local.get $p) (i32.const 22)) (then (return (i32.const -1))))
    (local.set $b (f64.load offset=272 (i32.shl (local.get $p) (i32.const 3))))
    (local.set $big (f64.mul (local.get $x) (local.get $b)))
    (local.set $t (f64.mul (f64.const 134217729) (local.get $x)))
    (local.set $xh (f64.sub (local.get $t) (f64.sub (local.get $t) (local.get $x))))
    (local.set $xl (f64.sub (local.get $x) (local.get $xh)))
    (local.set $t (f64.mul (f64.const 134217729) (local.get $b)))
    (local.set $bh (f64.sub (local.get $t) (f64.sub (local.get $t) (local.get $b))))
    (local.set $bl (f64.sub (local.get $b) (local.get $bh)))
    (local.set $small (f64.add (f64.add (f64.add
      (f64.sub (f64.mul (local.get $xh) (local.get $bh)) (local.get $big))
      (f64.mul (local.get $xh) (local.get $bl)))
      (f64.mul (local.get $xl) (local.get $bh)))
      (f64.mul (local.get $xl) (local.get $bl))))
    (if (f64.lt (local.get $big) (f64.const 1e16)) (then (return (i32.const -1))))
    (if (i32.and (f64.eq (local.get $big) (f64.const 1e16)) (f64.lt (local.get $small) (f64.const 0)))
      (then (return (i32.const -1))))
    (if (f64.ge (local.get $big) (f64.const 1e17)) (then (return (i32.const -1))))
    ;; Half an ulp of x, 2^(biased - 1076), on X's scale.
    (local.set $h (f64.mul
      (f64.reinterpret_i64 (i64.shl
        (i64.extend_i32_u (i32.shl (i32.sub (local.get $biased) (i32.const 53)) (i32.const 20)))
        (i64.const 32)))
      (local.get $b)))
    ;; big = upper 1e8 + lower, exactly.
    (local.set $upper (f64.floor (f64.div (local.get $big) (f64.const 1e8))))
    (local.set $lower (f64.sub (local.get $big) (f64.mul (local.get $upper) (f64.const 1e8))))
    (if (f64.lt (local.get $lower) (f64.const 0))
      (then
        (local.set $upper (f64.sub (local.get $upper) (f64.const 1)))
        (local.set $lower (f64.add (local.get $lower) (f64.const 1e8))))
      (else
        (if (f64.ge (local.get $lower) (f64.const 1e8))
          (then
            (local.set $upper (f64.add (local.get $upper) (f64.const 1)))
            (local.set $lower (f64.sub (local.get $lower) (f64.const 1e8)))))))
    ;; The largest power of ten (below 1e7) with a multiple strictly within h of X.
    (local.set $unit (f64.const 1))
    (local.set $count (i32.const 17))
    (local.set $below (f64.floor (local.get $small)))
    (local.set $quotient (i32.trunc_f64_s (local.get $lower)))
    (local.set $remainder (f64.const 0))
    (block $found
      (loop $widen
        (local.set $next (f64.mul (local.get $unit) (f64.const 10)))
        (if (f64.gt (local.get $next) (f64.const 1e7)) (then (return (i32.const -1))))
        (local.set $q (i32.div_s (local.get $quotient) (i32.const 10)))
        (local.set $r (f64.add (local.get $remainder) (f64.mul
          (f64.convert_i32_s (i32.sub (local.get $quotient) (i32.mul (local.get $q) (i32.const 10))))
          (local.get $unit))))
        (local.set $k (f64.sub (f64.const 0) (local.get $r)))
        (if (f64.lt (local.get $small) (local.get $k))
          (then (local.set $k (f64.sub (local.get $k) (local.get $next))))
          (else
            (if (f64.ge (local.get $small) (f64.add (local.get $k) (local.get $next)))
              (then (local.set $k (f64.add (local.get $k) (local.get $next)))))))
        (local.set $down (call $compare (local.get $small) (local.get $k) (local.get $h)))
        (local.set $up (call $compare (f64.add (local.get $k) (local.get $next)) (local.get $small) (local.get $h)))
        (if (i32.or (i32.eqz (local.get $down)) (i32.eqz (local.get $up))) (then (return (i32.const -1))))
        (br_if $found (i32.and (i32.gt_s (local.get $down) (i32.const 0)) (i32.gt_s (local.get $up) (i32.const 0))))
        (local.set $unit (local.get $next))
        (local.set $count (i32.sub (local.get $count) (i32.const 1)))
        (local.set $below (local.get $k))
        (local.set $quotient (local.get $q))
        (local.set $remainder (local.get $r))
        (br $widen)))
    ;; The closest multiple of it to X (a tie is handed back).
    (local.set $middle (f64.add (local.get $below) (f64.mul (local.get $unit) (f64.const 0.5))))
    (if (f64.eq (local.get $small) (local.get $middle)) (then (return (i32.const -1))))
    (local.set $low (f64.add (local.get $lower)
      (select (local.get $below) (f64.add (local.get $below) (local.get $unit)) (f64.lt (local.get $small) (local.get $middle)))))
    ;; floor(low / 1e8), low being within (-1e8, 2e8): -1, 0 or 1.
    (local.set $carry (select (f64.const -1)
      (select (f64.const 1) (f64.const 0) (f64.ge (local.get $low) (f64.const 1e8)))
      (f64.lt (local.get $low) (f64.const 0))))
    (local.set $low (f64.sub (local.get $low) (f64.mul (local.get $carry) (f64.const 1e8))))
    (local.set $upper (f64.add (local.get $upper) (local.get $carry)))
    (if (i32.or (f64.lt (local.get $upper) (f64.const 1e8)) (f64.ge (local.get $upper) (f64.const 1e9)))
      (then (return (i32.const -1))))
    ;; numberBytes.ts layOut of the digits (9 of head, count - 9 of tail) times 10^(n - count).
    (local.set $head (i32.trunc_f64_s (local.get $upper)))
    (local.set $tail (i32.trunc_f64_s (f64.div (local.get $low) (local.get $unit))))
    (local.set $n (i32.add (local.get $e) (i32.const 1)))
    (if (i32.le_s (local.get $n) (i32.const 0))
      (then
        (i32.store8 (local.get $at) (i32.const 48))
        (i32.store8 offset=1 (local.get $at) (i32.const 46))
        (local.set $at (i32.add (local.get $at) (i32.const 2)))
        (local.set $z (local.get $n))
        (block $zeros
          (loop $zero
            (br_if $zeros (i32.ge_s (local.get $z) (i32.const 0)))
            (i32.store8 (local.get $at) (i32.const 48))
            (local.set $at (i32.add (local.get $at) (i32.const 1)))
            (local.set $z (i32.add (local.get $z) (i32.const 1)))
            (br $zero)))
        (call $digits (local.get $tail) (i32.sub (local.get $count) (i32.const 9)) (i32.add (local.get $at) (local.get $count)))
        (call $digits (local.get $head) (i32.const 9) (i32.add (local.get $at) (i32.const 9)))
        (return (i32.add (local.get $at) (local.get $count)))))
    (if (i32.lt_s (local.get $n) (local.get $count))
      (then
        ;; The digits one place right, then the first n back left with the point after them.
        (call $digits (local.get $tail) (i32.sub (local.get $count) (i32.const 9))
          (i32.add (local.get $at) (i32.add (local.get $count) (i32.const 1))))
        (call $digits (local.get $head) (i32.const 9) (i32.add (local.get $at) (i32.const 10)))
        (local.set $z (i32.const 0))
        (block $moved
          (loop $move
            (br_if $moved (i32.ge_s (local.get $z) (local.get $n)))
            (i32.store8 (i32.add (local.get $at) (local.get $z)) (i32.load8_u offset=1 (i32.add (local.get $at) (local.get $z))))
            (local.set $z (i32.add (local.get $z) (i32.const 1)))
            (br $move)))
        (i32.store8 (i32.add (local.get $at) (local.get $n)) (i32.const 46))
        (return (i32.add (local.get $at) (i32.add (local.get $count) (i32.const 1))))))
    (call $digits (local.get $tail) (i32.sub (local.get $count) (i32.const 9)) (i32.add (local.get $at) (local.get $count)))
    (call $digits (local.get $head) (i32.const 9) (i32.add (local.get $at) (i32.const 9)))
    (local.set $z (local.get $count))
    (block $filled
      (loop $fill
        (br_if $filled (i32.ge_s (local.get $z) (local.get $n)))
        (i32.store8 (i32.add (local.get $at) (local.get $z)) (i32.const 48))
        (local.set $z (i32.add (local.get $z) (i32.const 1)))
        (br $fill)))
    (i32.add (local.get $at) (select (local.get $n) (local.get $count) (i32.gt_s (local.get $n) (local.get $count)))))

  ;; numberBytes.ts writeNumber for x not NaN: its end, or -1 (String(x) to be written at `at`).
  (func $number (param $x f64) (param $at i32) (result i32)
    (local $i i32) (local $m f64) (local $v i32) (local $end i32) (local $t i32)
    (local.set $i (local.get $at))
    (local.set $m (local.get $x))
    (if (f64.lt (local.get $x) (f64.const 0))
      (then
        (i32.store8 (local.get $i) (i32.const 45))
        (local.set $i (i32.add (local.get $i) (i32.const 1)))
        (local.set $m (f64.neg (local.get $x)))))
    ;; Integers (and -0, whose text is "0") within 32 bits, digit by digit.
    (if (f64.lt (local.get $m) (f64.const 2147483648))
      (then
        (local.set $v (i32.trunc_f64_s (local.get $m)))
        (if (f64.eq (f64.convert_i32_s (local.get $v)) (local.get $m))
          (then
            (if (i32.eqz (local.get $v))
              (then
                (i32.store8 (local.get $at) (i32.const 48))
                (return (i32.add (local.get $at) (i32.const 1)))))
            (local.set $end (local.get $i))
            (local.set $t (local.get $v))
            (block $counted
              (loop $more
                (br_if $counted (i32.eqz (local.get $t)))
                (local.set $end (i32.add (local.get $end) (i32.const 1)))
                (local.set $t (i32.div_u (local.get $t) (i32.const 10)))
                (br $more)))
            (call $digits (local.get $v) (i32.sub (local.get $end) (local.get $i)) (local.get $end))
            (return (local.get $end))))))
    (call $positive (local.get $m) (local.get $i)))

  ;; rollCsv.ts formatPackedBlock's rows k = $k .. count - 1 from the field $c of row $k on ($c = -1: the
  ;; row's start): the prefix, the row's head, then for each of the `columns` series a comma and its
  ;; number (nothing for NaN), and a line feed. The series' numbers are column by column from
  ;; $numbers (count each). Returns 0 when done (state 12: the end), or 1 with state 0, 4, 8 the row,
  ;; the column and the position of a number to be written by the caller (which then resumes from the
  ;; next column, after what it wrote).
  (func (export "rows") (param $count i32) (param $columns i32) (param $k i32) (param $c i32) (param $at i32)
    (param $prefix i32) (param $prefixLength i32) (param $heads i32) (param $stride i32) (param $numbers i32)
    (result i32)
    (local $x f64) (local $end i32) (local $head i32)
    (block $done
      (loop $row
        (br_if $done (i32.ge_s (local.get $k) (local.get $count)))
        (if (i32.lt_s (local.get $c) (i32.const 0))
          (then
            (memory.copy (local.get $at) (local.get $prefix) (local.get $prefixLength))
            (local.set $at (i32.add (local.get $at) (local.get $prefixLength)))
            (local.set $head (i32.add (local.get $heads) (i32.mul (local.get $k) (local.get $stride))))
            (memory.copy (local.get $at) (i32.add (local.get $head) (i32.const 4)) (i32.load (local.get $head)))
            (local.set $at (i32.add (local.get $at) (i32.load (local.get $head))))
            (local.set $c (i32.const 0))))
        (block $fields
          (loop $field
            (br_if $fields (i32.ge_s (local.get $c) (local.get $columns)))
            (i32.store8 (local.get $at) (i32.const 44))
            (local.set $at (i32.add (local.get $at) (i32.const 1)))
            (local.set $x (f64.load (i32.add (local.get $numbers)
              (i32.shl (i32.add (i32.mul (local.get $c) (local.get $count)) (local.get $k)) (i32.const 3)))))
            (if (f64.eq (local.get $x) (local.get $x))
              (then
                (local.set $end (call $number (local.get $x) (local.get $at)))
                (if (i32.lt_s (local.get $end) (i32.const 0))
                  (then
                    (i32.store (i32.const 0) (local.get $k))
                    (i32.store (i32.const 4) (local.get $c))
                    (i32.store (i32.const 8) (local.get $at))
                    (return (i32.const 1))))
                (local.set $at (local.get $end))))
            (local.set $c (i32.add (local.get $c) (i32.const 1)))
            (br $field)))
        (i32.store8 (local.get $at) (i32.const 10))
        (local.set $at (i32.add (local.get $at) (i32.const 1)))
        (local.set $k (i32.add (local.get $k) (i32.const 1)))
        (local.set $c (i32.const -1))
        (br $row)))
    (i32.store (i32.const 12) (local.get $at))
    (i32.const 0))
)
