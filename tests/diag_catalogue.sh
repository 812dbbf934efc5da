#!/bin/sh
# diag_catalogue.sh - docs/diagnostics.md against the goldens and the
# sources.  See LICENSE.
#
# Both ways:
# 1. every table row's golden (the last column) exists, one line of its
#    .err holds the row's message, and its exit status is the row's; the
#    message is matched by its fixed text: the pieces between the words
#    in capitals (the placeholders, and the capitals the message itself
#    holds), found in order on one line;
# 2. every message format the sources can report (tests/diag_extract.awk)
#    has a row: each piece of the format between conversions (%s, %d,
#    ...) that holds three characters or more is found, in order, in one
#    row's message.  Formats made only of conversions pass messages on
#    and are skipped; the formats no input can make are listed below.
# Ends with "diag_catalogue.sh: N passed, N failed".
doc=docs/diagnostics.md
tmp=${TMPDIR:-/tmp}/diag_catalogue.$$
trap 'rm -f "$tmp".*' EXIT

# Formats that no input of the command can reach, one a line, exactly as
# tests/diag_extract.awk prints them; docs/diagnostics.md ends with the
# same list and why.  A format listed here that the sources no longer
# hold fails, so the list cannot go stale.
cat > "$tmp.excluded" <<'EOF'
options: no method %d
options: nlimits is %zu but limits is NULL
gs_result_eval: nbind is %zu but names or values is NULL
gs_result_eval: the circuit has no symbol '%s'
%s: the denominator is zero at s = %Lg%+Lgj
%s: the adjoint system is singular at s = %Lg%+Lgj
%s: the circuit's equations have no unique solution at s = %Lg%+Lgj
%s: the numeric solve cannot compute this output (%s)
%s: a value is not a finite number, so the numeric solve cannot run
no bias line %zu
bias line names no device
%s is given twice
the current of '%s' is controlled by itself through a loop of current-controlled sources
%s: the root search did not converge; the roots shown are the best found
%s: the tolerance could not be met; the best form reached is shown
%s: the short form is not within the tolerance; the best one reached is shown
EOF
# (the first four: arguments of the C library's calls, which the command
# checks first; the adjoint solve: a library call the command does not
# make; the bias lines: the resolver ties each to a device first; "given
# twice": the parser refuses a repeated key first; the current loop: the
# structural check reports it first; the root search: a safeguard no
# circuit is known to reach; the tolerance: the command gives approx
# every term, so its last form is exact and always meets it.)

awk -f tests/diag_extract.awk src/*.c src/*/*.c > "$tmp.formats"

# the status a golden expects (as tests/run_cli.sh reads it)
status_of() {
    if [ -f "tests/cli/$1.status" ]; then
        cat "tests/cli/$1.status"
    elif [ -f "tests/cli/$1.err" ] && [ ! -f "tests/cli/$1.out" ]; then
        echo 2
    else
        echo 0
    fi
}

# rows: message, status, golden, tab-separated
tab=$(printf '\t')
grep '^| `' "$doc" \
    | sed "s/^| \`\([^\`]*\)\`.*| \([0-9]*\) | \`\([^\`]*\)\` |\$/\1$tab\2$tab\3/" \
    > "$tmp.rows"
while IFS="$tab" read -r msg status golden; do
    err=tests/cli/$golden.err
    if [ ! -f "$err" ]; then
        echo "diag_catalogue.sh: '$msg': no golden $err"
        echo fail
        continue
    fi
    want=$(status_of "$golden")
    if [ "$want" != "$status" ]; then
        echo "diag_catalogue.sh: '$msg': status $status, but $golden exits $want"
        echo fail
        continue
    fi
    printf '%s\n' "$msg" | awk -v err="$err" '
        { msg = $0 }
        END {
            n = split(msg, piece, /[A-Z][A-Z0-9_]*/)
            found = 0
            while (!found && (getline line < err) > 0) {
                ok = 1
                rest = line
                for (i = 1; i <= n && ok; i++) {
                    if (piece[i] == "")
                        continue
                    k = index(rest, piece[i])
                    if (k == 0)
                        ok = 0
                    else
                        rest = substr(rest, k + length(piece[i]))
                }
                found = ok
            }
            if (found)
                print "pass"
            else {
                printf "diag_catalogue.sh: %s does not show \"%s\"\n", err, msg
                print "fail"
            }
        }'
done < "$tmp.rows" > "$tmp.forward"

# the other way: a row for every format of the sources
awk -F '\t' -v rows="$tmp.rows" -v excluded="$tmp.excluded" '
    BEGIN {
        while ((getline line < rows) > 0) {
            split(line, f, "\t")
            row[++nrows] = f[1]
        }
        while ((getline line < excluded) > 0)
            skip[line] = 1
    }
    # is every piece of the format found, in order, in message m?
    function covers(m, npieces,    i, k) {
        for (i = 1; i <= npieces; i++) {
            k = index(m, p[i])
            if (k == 0)
                return 0
            m = substr(m, k + length(p[i]))
        }
        return 1
    }
    {
        fmt = $2
        if (fmt in skip) {
            seen_skip[fmt] = 1
            next
        }
        if (fmt in done)
            next
        done[fmt] = 1
        n = split(fmt, raw, /%[-+ #0-9.*]*[hlLzjt]*[a-zA-Z]/)
        np = 0
        for (i = 1; i <= n; i++) {
            t = raw[i]
            gsub(/^ +| +$/, "", t)
            if (length(t) >= 3)
                p[++np] = t
        }
        if (np == 0)
            next
        ok = 0
        for (r = 1; r <= nrows && !ok; r++)
            ok = covers(row[r], np)
        if (ok)
            print "pass"
        else {
            printf "diag_catalogue.sh: no row for \"%s\" (%s)\n", fmt, $1
            print "fail"
        }
    }
    END {
        for (fmt in skip)
            if (!(fmt in seen_skip)) {
                printf "diag_catalogue.sh: excluded \"%s\" is in no source\n", fmt
                print "fail"
            }
    }' "$tmp.formats" > "$tmp.backward"

cat "$tmp.forward" "$tmp.backward" | grep -v '^pass$' | grep -v '^fail$'
passed=$(cat "$tmp.forward" "$tmp.backward" | grep -c '^pass$')
failed=$(cat "$tmp.forward" "$tmp.backward" | grep -c '^fail$')
echo "diag_catalogue.sh: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
