/* status.c - names of the status codes. See LICENSE. */
#include "gainsmith.h"

const char *gs_strerror(int code)
{
    switch (code) {
    case GS_OK:        return "success";
    case GS_ESYNTAX:   return "syntax error";
    case GS_EINEXACT:  return "division is not exact";
    case GS_EDIVZERO:  return "division by zero";
    case GS_ERANGE:    return "value out of range";
    case GS_EBUDGET:   return "work budget exceeded";
    case GS_ESINGULAR: return "singular system";
    case GS_EIO:       return "input/output error";
    case GS_EINVAL:    return "invalid argument";
    case GS_EUNBOUND:  return "symbol has no value";
    case GS_ENOMEM:    return "out of memory";
    default:           return "unknown error";
    }
}
