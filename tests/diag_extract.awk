# diag_extract.awk - the message formats the sources can report.
# See LICENSE.
#
# usage: awk -f tests/diag_extract.awk src/*.c src/*/*.c
# Prints "FILE<TAB>FORMAT" for every string literal that is the message
# argument of a reporting call (the argument position is in `argpos`
# below), C escapes read, "%%" as "%", and cut at an embedded "\n" (the
# hint line some fprintf calls print with the message).  For fprintf only
# the calls on err or stderr whose format holds "error: " or "warning: "
# count (and fputs alike), and the "gainsmith CMD: error: " prefix is
# dropped.  When a
# format is only conversions ("%s"), the string literals with a space in
# the later arguments are the messages (cond ? "one text" : "another").
# Hints are not messages: they are never a reporting call's format.
# Comments are skipped; a message built elsewhere and passed as a
# variable is found only where it is built by one of the `msg = ...`
# forms below.
BEGIN {
    # the argument that holds the format, per reporting function
    argpos["gs_diag_add"] = 7       # base/diag.h
    argpos["gs_cur_error"] = 4      # circuit/lex.h
    argpos["gs_lex_report"] = 6     # circuit/lex.h
    argpos["lex_error"] = 3         # circuit/lex.c
    argpos["fail"] = 5              # circuit/device.c and circuit/eval.c
    argpos["failf"] = 3             # circuit/eval.c
    argpos["warn"] = 4              # circuit/device.c
    argpos["usage"] = 3             # cli/cmd_extract.c
    argpos["bad"] = 2               # cli/cmd_noise.c
    argpos["fprintf"] = 2           # cli/*.c
    argpos["fputs"] = 1
    stream["fprintf"] = 1           # the FILE argument of these two
    stream["fputs"] = 2
    # messages built in a variable before they are reported
    argpos["msg[ \t\n]*=[ \t\n]*gs_asprintf"] = 1
    argpos["msg[ \t\n]*=[ \t\n]*gs_strdup"] = 1
    argpos["snprintf"] = 3          # into msg or fmt only
}

FNR == 1 && NR > 1 { scan(file, buf) }
FNR == 1 { file = FILENAME; buf = "" }
{ buf = buf $0 "\n" }
END { if (NR > 0) scan(file, buf) }

# Index of the closing quote of the literal opened at s[i] (q: the quote).
function close_quote(s, i, q,    n, c) {
    n = length(s)
    for (i++; i <= n; i++) {
        c = substr(s, i, 1)
        if (c == "\\")
            i++
        else if (c == q)
            return i
    }
    return n
}

# s without comments; character literals become 'x' (a '"' or ',' in one
# would otherwise upset the argument split).
function strip(s,    out, n, i, j, c, t) {
    out = ""
    n = length(s)
    i = 1
    while (i <= n) {
        t = substr(s, i, 2)
        c = substr(s, i, 1)
        if (c == "\"") {
            j = close_quote(s, i, "\"")
            out = out substr(s, i, j - i + 1)
            i = j + 1
        } else if (c == "'") {
            out = out "'x'"
            i = close_quote(s, i, "'") + 1
        } else if (t == "/*") {
            j = index(substr(s, i + 2), "*/")
            i = j ? i + j + 3 : n + 1
            out = out " "
        } else if (t == "//") {
            j = index(substr(s, i), "\n")
            i = j ? i + j - 1 : n + 1
        } else {
            j = i
            while (j <= n && substr(s, j, 1) !~ /["'\/]/)
                j++
            if (j == i)
                j++
            out = out substr(s, i, j - i)
            i = j
        }
    }
    return out
}

# The text of a C string literal (between its quotes).
function unescape(v) {
    gsub(/\\"/, "\"", v)
    gsub(/\\\\/, "\\", v)
    gsub(/%%/, "%", v)
    return v
}

# The value of an argument made only of adjacent string literals, or
# "\001" when it is anything else.
function literal(t,    v) {
    gsub(/^[ \t\n]+|[ \t\n]+$/, "", t)
    if (t !~ /^"/)
        return "\001"
    v = ""
    while (t != "") {
        if (!match(t, /^"([^"\\]|\\.)*"/))
            return "\001"
        v = v substr(t, 2, RLENGTH - 2)
        t = substr(t, RLENGTH + 1)
        sub(/^[ \t\n]+/, "", t)
    }
    return v
}

function emit(f, v) {
    v = unescape(v)
    sub(/\\n.*/, "", v)
    printf "%s\t%s\n", f, v
}

# Split the call whose "(" ends at s[st - 1] into arg[1 .. return value].
function split_args(s, st,    n, i, j, c, a, depth) {
    n = length(s)
    a = 1
    arg[1] = ""
    depth = 0
    for (i = st; i <= n; i++) {
        c = substr(s, i, 1)
        if (c == "\"") {
            j = close_quote(s, i, "\"")
            arg[a] = arg[a] substr(s, i, j - i + 1)
            i = j
            continue
        }
        if (c == "(" || c == "[" || c == "{")
            depth++
        else if (c == ")" || c == "]" || c == "}") {
            if (depth == 0)
                break
            depth--
        } else if (c == ";" && depth == 0)
            break
        if (c == "," && depth == 0)
            arg[++a] = ""
        else
            arg[a] = arg[a] c
    }
    return a
}

function scan(f, text,    s, name, k, st, na, v, first, t, b, w) {
    s = strip(text)
    for (name in argpos) {
        k = 1
        while (match(substr(s, k), "(^|[^A-Za-z0-9_])" name "[ \t\n]*\\(")) {
            st = k + RSTART - 1 + RLENGTH
            k = st
            na = split_args(s, st)
            if (na < argpos[name])
                continue
            v = literal(arg[argpos[name]])
            if (v == "\001")
                continue
            first = arg[1]
            gsub(/[ \t\n]/, "", first)
            if (name == "snprintf" && first != "msg" && first != "fmt")
                continue
            if (name in stream) {
                first = arg[stream[name]]
                gsub(/[ \t\n]/, "", first)
                if (first != "err" && first != "stderr")
                    continue
                if (v !~ /: (error|warning): /)
                    continue
                sub(/^.*: (error|warning): /, "", v)
            }
            emit(f, v)
            t = v
            gsub(/%[-+ #0-9.*]*[hlLzjt]*[a-zA-Z]/, "", t)
            gsub(/[^A-Za-z]/, "", t)
            if (length(t) >= 3)
                continue
            for (b = argpos[name] + 1; b <= na; b++) {
                w = arg[b]
                while (match(w, /"([^"\\]|\\.)*"/)) {
                    t = substr(w, RSTART + 1, RLENGTH - 2)
                    w = substr(w, RSTART + RLENGTH)
                    if (t ~ / /)
                        emit(f, t)
                }
            }
        }
    }
}
