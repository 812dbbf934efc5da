# gainsmith.bash - bash completion for the gainsmith command. See LICENSE.
#
# Commands and options are read from the program's own help text
# (`gainsmith help`, `gainsmith help COMMAND`), so they cannot fall out of
# step with it; files complete to *.gsc (and directories), or to any file
# after an option that writes one (--csv, --svg).

_gainsmith_commands()
{
    "$1" help 2>/dev/null \
        | sed -n '/^commands:/,/^$/s/^  \([a-z][a-z0-9_-]*\) .*/\1/p'
}

_gainsmith_options()
{
    "$1" help "$2" 2>/dev/null \
        | grep -o -- '--[a-z][a-z0-9-]*' | sort -u
}

_gainsmith()
{
    local cur prev prog cmd
    COMPREPLY=()
    cur=${COMP_WORDS[COMP_CWORD]}
    prev=${COMP_WORDS[COMP_CWORD-1]}
    prog=${COMP_WORDS[0]}
    if [ "$COMP_CWORD" -eq 1 ]; then
        COMPREPLY=($(compgen -W "$(_gainsmith_commands "$prog") --help \
            --version" -- "$cur"))
        return 0
    fi
    cmd=${COMP_WORDS[1]}
    if [ "$cmd" = help ]; then
        [ "$COMP_CWORD" -eq 2 ] && COMPREPLY=($(compgen -W \
            "$(_gainsmith_commands "$prog")" -- "$cur"))
        return 0
    fi
    case $prev in
    --csv|--svg)
        COMPREPLY=($(compgen -f -- "$cur"))
        return 0
        ;;
    esac
    if [[ $cur == -* ]]; then
        COMPREPLY=($(compgen -W "$(_gainsmith_options "$prog" "$cmd")" \
            -- "$cur"))
        return 0
    fi
    COMPREPLY=($(compgen -f -X '!*.gsc' -- "$cur") $(compgen -d -- "$cur"))
    return 0
}

complete -o filenames -F _gainsmith gainsmith
