#!/bin/sh
# check_layers.sh - every #include in src/ points at its own layer or one
# below it.  See LICENSE and DEVELOPERS.md ("Layers").
#
# usage: tests/check_layers.sh [SRCDIR]
# The table below is the one statement of the layering: lowest first, a
# file in src/LAYER/ (src/api.c is the layer "api") may include
# "OTHER/name.h" only when OTHER comes no later in the list.  The public
# header "gainsmith.h" sits under every layer.  An include written without
# its folder fails too, so that an upward include cannot hide.
LAYERS="base algebra circuit numeric analysis output api cli"

src=${1:-src}
rank() {
    i=0
    for l in $LAYERS; do
        if [ "$l" = "$1" ]; then
            echo $i
            return
        fi
        i=$((i + 1))
    done
    echo -1
}

passed=0
failed=0
for f in $(find "$src" -name '*.c' -o -name '*.h' | sort); do
    rel=${f#"$src"/}
    case $rel in
        */*) layer=${rel%%/*} ;;
        api.c) layer=api ;;
        *) layer=none ;;
    esac
    own=$(rank "$layer")
    if [ "$own" -lt 0 ]; then
        echo "$f: error: not in a layer's folder (one of: $LAYERS)"
        failed=$((failed + 1))
        continue
    fi
    ok=1
    for inc in $(sed -n 's/^[[:space:]]*#[[:space:]]*include[[:space:]]*"\([^"]*\)".*/\1/p' "$f"); do
        [ "$inc" = gainsmith.h ] && continue
        case $inc in
            */*) target=${inc%%/*} ;;
            *)
                # a .c pulled into a test of its own module is fine; in
                # src/ every include names its folder
                echo "$f: error: #include \"$inc\" without its layer folder"
                ok=0
                continue ;;
        esac
        tr=$(rank "$target")
        if [ "$tr" -lt 0 ]; then
            echo "$f: error: #include \"$inc\": no layer '$target'"
            ok=0
        elif [ "$tr" -gt "$own" ]; then
            echo "$f: error: layer '$layer' includes \"$inc\" from the" \
                 "layer above it, '$target'"
            ok=0
        fi
    done
    if [ $ok -eq 1 ]; then
        passed=$((passed + 1))
    else
        failed=$((failed + 1))
    fi
done
echo "layers: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
