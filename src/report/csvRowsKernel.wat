;; roll's CSV rows in WebAssembly (csvRowsKernel.ts): the numbers of a block of windows written as
;; bytes, each the very text String(x) gives (ECMAScript's Number::toString, as numberBytes.ts
;; writeNumber writes it in JavaScript). Integers within 32 bits are written digit by digit; other
;; numbers from 1e-6 to 2^53 by Ryu (Adams 2018), whose digits are the shortest that read back as x and
;; the closest such, as Number::toString's; any other number (an exponent in its text, 2^53 and
;; beyond, an infinity) is handed back to the caller, which writes String(x) and resumes after it. The
;; tests compare the rows with String(x) on a million random doubles and the edges.
;;
;; Memory (laid out by the caller, grown as a block needs): the state at 0 (i32 row, column, position
;; of a number handed back, then the end), the digit pairs "00" .. "99" at 512 and Ryu's multipliers
;; at 1024, both written by the caller; then the rows' prefix, each row's head (an i32 length and its
;; bytes: dates and observations, written by the caller), the numbers column by column, and the rows
;; written.
(module
  (memory (export "memory") 1 65536)

  ;; include: ryu.wat ($digits, $digits8, $digits64 and $shortest: Ryu, and the digits laid out)

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
    (call $shortest (local.get $m) (local.get $i)))

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
