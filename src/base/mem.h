/* mem.h - allocation that never returns NULL. See LICENSE. */
#ifndef GS_MEM_H
#define GS_MEM_H

#include <stdarg.h>
#include <stddef.h>

/* These behave like malloc, calloc, realloc and strdup, except that on
   exhaustion they print one message to stderr and exit with status 1
   (the single place where the library stops the process, STYLE.md), or,
   under a guard (gs_mem_run below), unwind to it.  A zero size returns a
   valid unique pointer.  Free with gs_free(). */
void *gs_malloc(size_t size);
void *gs_calloc(size_t count, size_t size);
void *gs_realloc(void *ptr, size_t size);
/* realloc to count*size bytes, failing cleanly if the product overflows */
void *gs_reallocarray(void *ptr, size_t count, size_t size);
char *gs_strdup(const char *s);
char *gs_strndup(const char *s, size_t n);
/* printf into a fresh string the caller frees */
char *gs_asprintf(const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 1, 2)))
#endif
    ;
/* The same from a va_list, which it consumes (va_end is the caller's);
   the one place that sizes a formatted string. */
char *gs_vasprintf(const char *fmt, va_list ap)
#if defined(__GNUC__)
    __attribute__((format(printf, 1, 0)))
#endif
    ;
/* An array v of *alloc items of size `size`, grown (doubling) if need be
   to hold n + 1 items; returns the array, *alloc updated. */
void *gs_grow(void *v, size_t n, size_t *alloc, size_t size);

/* --- Recovering from exhaustion -------------------------------------
 *
 * Outside a guard the functions above exit on exhaustion, as said.
 * gs_mem_run(fn, arg, ...) calls fn(arg) under a guard on the calling
 * thread: every block the gs_ functions allocate in it is recorded, each
 * gs_free forgets it again, and when an allocation fails (or the hook
 * refuses it) the allocator longjmps back into gs_mem_run, which runs the
 * deferred clean-ups, frees every block still recorded and returns
 * GS_ENOMEM.  When fn returns, the blocks it left are simply no longer
 * recorded: they are the caller's, to free with gs_free() or gs_free.  So
 * that nothing is freed twice, code that may run under a guard frees
 * with gs_free, never gs_free() (a block gs_free does not know, such as
 * one from libc, is simply freed).
 *
 * The guard lives on the caller's stack and is found through a
 * thread-local pointer, so guards on different threads never meet; a
 * guard inside a guard works (its blocks pass to the outer one when fn
 * returns).  fn must not keep, in memory that outlives a failed run,
 * pointers to blocks allocated during it, and must not hold other
 * resources (open files) across an allocation unless it registered
 * their clean-up with gs_mem_defer.  An unwinding does not return
 * through fn's frames: nothing in them runs, which is why every block
 * must be known to the guard.
 */

/* Asked before each allocation under the guard, with the bytes wanted;
   nonzero makes that allocation fail as if memory had run out. */
typedef int (*gs_mem_hook)(void *arg, size_t bytes);

/* fn(arg) under a guard; hook (NULL: the enclosing guard's, if any) with
   hook_arg.  Returns what fn returns, or GS_ENOMEM after a failed
   allocation, with *failed_bytes (if not NULL) set to its size. */
int gs_mem_run(int (*fn)(void *arg), void *arg, gs_mem_hook hook,
               void *hook_arg, size_t *failed_bytes);

/* Frees p, and forgets it if a guard recorded it; NULL is fine. */
void gs_free(void *p);

/* Fail as an allocation of `bytes` would: longjmp to the guard, or exit
   outside one.  For resources from libc that cannot be had. */
#if defined(__GNUC__)
__attribute__((noreturn))
#endif
void gs_mem_exhausted(size_t bytes);

/* A clean-up run if the guard unwinds: fn(arg), for a resource that is
   not a gs_ block (an open FILE).  arg must outlive the call's frames,
   which an unwinding skips: a heap block, never a local.  Returns a
   handle for gs_mem_undefer, which forgets it once the resource is
   released; NULL (and nothing to undo) outside a guard. */
typedef struct gs_mem_cleanup gs_mem_cleanup;
gs_mem_cleanup *gs_mem_defer(void (*fn)(void *arg), void *arg);
void gs_mem_undefer(gs_mem_cleanup *c);   /* NULL is fine */

#endif
