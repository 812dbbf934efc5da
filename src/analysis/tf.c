/* tf.c - a derived transfer function: lifetime and naming. See LICENSE. */
#include "analysis/tf.h"
#include "base/mem.h"

#include <stdlib.h>

void gs_tf_init(gs_tf *tf, const gs_polyctx *ctx, int s_var)
{
    tf->name = NULL;
    tf->kind = GS_TF_TRANSFER;
    gs_poly_init(&tf->num);
    gs_poly_init(&tf->den);
    tf->ctx = ctx;
    tf->s_var = s_var;
    tf->description = NULL;
}

void gs_tf_clear(gs_tf *tf)
{
    gs_free(tf->name);
    gs_free(tf->description);
    gs_poly_clear(&tf->num);
    gs_poly_clear(&tf->den);
    tf->name = NULL;
    tf->description = NULL;
}

void gs_tf_set_name(gs_tf *tf, const char *name)
{
    char *copy = name != NULL ? gs_strdup(name) : NULL;
    gs_free(tf->name);
    tf->name = copy;
}

void gs_tf_set_description(gs_tf *tf, const char *description)
{
    char *copy = description != NULL ? gs_strdup(description) : NULL;
    gs_free(tf->description);
    tf->description = copy;
}

const char *gs_tf_name(const gs_tf *tf)
{
    return tf->name != NULL && tf->name[0] != '\0' ? tf->name : "H";
}
