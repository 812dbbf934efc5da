/* timer.c - runs a command several times; reports median wall time, peak RSS.
 * See LICENSE.
 *
 * usage: timer [-n RUNS] [-l LIMIT] [-s SLOW] [-m MIB] [-o OUT] [-e ERR]
 *              -- PROG ARG...
 *
 * Each run forks and execs PROG as a whole process, with standard input
 * from /dev/null, standard output to OUT and standard error to ERR (both
 * /dev/null unless given; each run overwrites them, so they hold the last
 * run's output).  Wall time is taken with clock_gettime(CLOCK_MONOTONIC)
 * around fork and wait4; peak memory is wait4's ru_maxrss (KiB on Linux).
 * A run still going after LIMIT seconds is killed with its process group.
 * When the first run takes longer than SLOW seconds the rest are skipped.
 * With -m, each run's address space is capped at MIB MiB (setrlimit), so
 * a run that grows without bound fails instead of exhausting the machine.
 * Prints one line:
 *
 *     runs=R seconds=MEDIAN min=S max=S peak_kib=K status=ok
 *
 * where status is ok, exit:N, signal:N or timeout; the exit status is 0
 * when every run exited 0, 1 when one did not (timing stops there), 2 on
 * bad usage.
 */
#define _DEFAULT_SOURCE /* wait4 is a BSD interface, not in POSIX */

#include <errno.h>
#include <fcntl.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <sys/time.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>
#include "benchlib.h"

#define MAX_RUNS 101

typedef struct options {
    int runs;
    double limit;       /* seconds, 0 = none */
    double slow;        /* seconds, 0 = never cut short */
    double mib;         /* address-space cap, 0 = none */
    const char *out;
    const char *err;
    char **argv;
} options;

typedef struct outcome {
    double seconds;
    long peak_kib;
    int status;         /* wait status */
    int timed_out;
} outcome;

/* SIGALRM only has to interrupt wait4; the handler itself does nothing. */
static void on_alarm(int sig)
{
    (void)sig;
}

static void redirect(int fd, const char *path, int flags)
{
    int f = open(path, flags, 0644);
    if (f < 0) {
        perror(path);
        _exit(127);
    }
    if (f != fd) {
        dup2(f, fd);
        close(f);
    }
}

static void exec_child(const options *o)
{
    struct rlimit rl;
    setpgid(0, 0);
    if (o->mib > 0) {
        rl.rlim_cur = rl.rlim_max = (rlim_t)(o->mib * 1024 * 1024);
        setrlimit(RLIMIT_AS, &rl);
    }
    redirect(0, "/dev/null", O_RDONLY);
    redirect(1, o->out, O_WRONLY | O_CREAT | O_TRUNC);
    redirect(2, o->err, O_WRONLY | O_CREAT | O_TRUNC);
    execvp(o->argv[0], o->argv);
    perror(o->argv[0]);
    _exit(127);
}

/* Waits for pid; on the alarm, kills its process group and waits again. */
static pid_t reap(pid_t pid, outcome *r)
{
    struct rusage ru;
    pid_t got;
    memset(&ru, 0, sizeof ru);
    for (;;) {
        got = wait4(pid, &r->status, 0, &ru);
        if (got == pid)
            break;
        if (got < 0 && errno != EINTR)
            return -1;
        if (got < 0 && !r->timed_out) {
            r->timed_out = 1;
            kill(-pid, SIGKILL);
            kill(pid, SIGKILL);
        }
    }
    r->peak_kib = ru.ru_maxrss;
    return got;
}

static int run_once(const options *o, outcome *r)
{
    pid_t pid;
    double t0;
    memset(r, 0, sizeof *r);
    fflush(NULL);
    t0 = bench_now();
    pid = fork();
    if (pid < 0) {
        perror("fork");
        return -1;
    }
    if (pid == 0)
        exec_child(o);
    setpgid(pid, pid); /* also here, so the group exists before any kill */
    if (o->limit > 0)
        alarm((unsigned)(o->limit + 0.999));
    if (reap(pid, r) < 0) {
        perror("wait4");
        return -1;
    }
    r->seconds = bench_now() - t0;
    alarm(0);
    return 0;
}

static void status_text(char *buf, size_t n, const outcome *r)
{
    if (r->timed_out)
        snprintf(buf, n, "timeout");
    else if (WIFEXITED(r->status) && WEXITSTATUS(r->status) == 0)
        snprintf(buf, n, "ok");
    else if (WIFEXITED(r->status))
        snprintf(buf, n, "exit:%d", WEXITSTATUS(r->status));
    else if (WIFSIGNALED(r->status))
        snprintf(buf, n, "signal:%d", WTERMSIG(r->status));
    else
        snprintf(buf, n, "unknown");
}

static int usage(void)
{
    fputs("usage: timer [-n RUNS] [-l LIMIT] [-s SLOW] [-m MIB] [-o OUT]"
          " [-e ERR] -- PROG ARG...\n", stderr);
    return 2;
}

static int parse_number(double *x, const char *s)
{
    char *end;
    errno = 0;
    *x = strtod(s, &end);
    return errno == 0 && end != s && *end == '\0' && *x >= 0;
}

static int parse_option(options *o, char flag, const char *arg)
{
    double x;
    if (flag == 'o' || flag == 'e') {
        *(flag == 'o' ? &o->out : &o->err) = arg;
        return 1;
    }
    if (!parse_number(&x, arg))
        return 0;
    if (flag == 'n' && x >= 1 && x <= MAX_RUNS && x == (int)x)
        o->runs = (int)x;
    else if (flag == 'l')
        o->limit = x;
    else if (flag == 's')
        o->slow = x;
    else if (flag == 'm')
        o->mib = x;
    else
        return 0;
    return 1;
}

static int parse_args(options *o, int argc, char **argv)
{
    int i;
    o->runs = 5;
    o->limit = 0;
    o->slow = 0;
    o->mib = 0;
    o->out = "/dev/null";
    o->err = "/dev/null";
    for (i = 1; i < argc; i += 2) {
        if (strcmp(argv[i], "--") == 0)
            break;
        if (argv[i][0] != '-' || argv[i][1] == '\0' || argv[i][2] != '\0'
            || i + 1 >= argc || !parse_option(o, argv[i][1], argv[i + 1]))
            return 0;
    }
    if (i + 1 >= argc)
        return 0;
    o->argv = argv + i + 1;
    return 1;
}

static void install_alarm(void)
{
    struct sigaction sa;
    memset(&sa, 0, sizeof sa);
    sa.sa_handler = on_alarm;
    sigemptyset(&sa.sa_mask);
    sa.sa_flags = 0; /* no SA_RESTART: the alarm must interrupt wait4 */
    sigaction(SIGALRM, &sa, NULL);
}

int main(int argc, char **argv)
{
    options o;
    outcome r;
    double secs[MAX_RUNS];
    long peak = 0;
    int n = 0, failed = 0;
    char status[32];
    if (!parse_args(&o, argc, argv))
        return usage();
    install_alarm();
    while (n < o.runs) {
        if (run_once(&o, &r) != 0)
            return 1;
        secs[n++] = r.seconds;
        if (r.peak_kib > peak)
            peak = r.peak_kib;
        status_text(status, sizeof status, &r);
        failed = strcmp(status, "ok") != 0;
        if (failed || (n == 1 && o.slow > 0 && r.seconds > o.slow))
            break;
    }
    printf("runs=%d seconds=%.6f", n, bench_median(secs, n));
    printf(" min=%.6f max=%.6f", secs[0], secs[n - 1]);
    printf(" peak_kib=%ld status=%s\n", peak, status);
    return failed ? 1 : 0;
}
