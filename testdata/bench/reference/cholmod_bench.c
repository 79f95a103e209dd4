/*
 * cholmod_bench: times SuiteSparse CHOLMOD's analyse, factorise and solve on
 * one matrix exported by Gusset's reference benchmark (cmd/refbench), as a
 * general-purpose reference for engine/sparse. Not part of the tests.
 *
 * Usage: cholmod_bench MATRIX.mtx RHS.txt SOLUTION.out
 *   MATRIX.mtx  Matrix Market, real symmetric, lower triangle
 *   RHS.txt     one number per line
 *   SOLUTION.out  the solution, one number per line (%.17g)
 * Prints one JSON object on stdout.
 */
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
#include <suitesparse/cholmod.h>

static double now(void) {
    struct timespec t;
    clock_gettime(CLOCK_MONOTONIC, &t);
    return t.tv_sec + 1e-9 * t.tv_nsec;
}

/* The peak resident memory of this process so far in KiB: VmHWM, the
 * high-water mark of this address space (new at exec), from
 * /proc/self/status (proc(5)). Not ru_maxrss, which on Linux starts from
 * the parent's peak when the parent forked a large address space. */
static long peak_rss_kib(void) {
    FILE *f = fopen("/proc/self/status", "r");
    char line[256];
    long kib = -1;
    if (!f) return -1;
    while (fgets(line, sizeof line, f)) {
        if (sscanf(line, "VmHWM: %ld kB", &kib) == 1) break;
    }
    fclose(f);
    return kib;
}

static int read_rhs(const char *path, double *b, size_t n) {
    FILE *f = fopen(path, "r");
    if (!f) return 0;
    for (size_t i = 0; i < n; i++) {
        if (fscanf(f, "%lf", &b[i]) != 1) { fclose(f); return 0; }
    }
    fclose(f);
    return 1;
}

int main(int argc, char **argv) {
    if (argc != 4) {
        fprintf(stderr, "usage: cholmod_bench MATRIX.mtx RHS.txt SOLUTION.out\n");
        return 2;
    }
    cholmod_common c;
    cholmod_start(&c);
    FILE *mf = fopen(argv[1], "r");
    if (!mf) { perror(argv[1]); return 1; }
    cholmod_sparse *A = cholmod_read_sparse(mf, &c);
    fclose(mf);
    if (!A) { fprintf(stderr, "cholmod_bench: cannot read %s\n", argv[1]); return 1; }
    long rss_input = peak_rss_kib();
    size_t n = A->nrow;
    cholmod_dense *B = cholmod_zeros(n, 1, CHOLMOD_REAL, &c);
    if (!read_rhs(argv[2], (double *)B->x, n)) { fprintf(stderr, "cholmod_bench: bad rhs\n"); return 1; }

    double t0 = now();
    cholmod_factor *L = cholmod_analyze(A, &c);
    double t1 = now();
    cholmod_factorize(A, L, &c);
    double t2 = now();
    cholmod_dense *X = cholmod_solve(CHOLMOD_A, L, B, &c);
    double t3 = now();
    if (c.status != CHOLMOD_OK || !X) { fprintf(stderr, "cholmod_bench: status %d\n", c.status); return 1; }

    FILE *out = fopen(argv[3], "w");
    if (!out) { perror(argv[3]); return 1; }
    double *x = (double *)X->x;
    for (size_t i = 0; i < n; i++) fprintf(out, "%.17g\n", x[i]);
    fclose(out);

    const char *ordering[] = {"natural", "given", "amd", "metis", "nesdis", "colamd", "postordered"};
    int sel = c.method[c.selected].ordering;
    printf("{\"n\":%zu,\"analyse_s\":%.6f,\"factorise_s\":%.6f,\"solve_s\":%.6f,"
           "\"nnz_l\":%.0f,\"flops\":%.6g,\"ordering\":\"%s\",\"supernodal\":%d,"
           "\"peak_cholmod_bytes\":%zu,\"peak_rss_kib\":%ld,\"rss_after_input_kib\":%ld}\n",
           n, t1 - t0, t2 - t1, t3 - t2, c.lnz, c.fl,
           (sel >= 0 && sel < 7) ? ordering[sel] : "?", L->is_super,
           c.memory_usage, peak_rss_kib(), rss_input);
    cholmod_free_dense(&X, &c);
    cholmod_free_dense(&B, &c);
    cholmod_free_factor(&L, &c);
    cholmod_free_sparse(&A, &c);
    cholmod_finish(&c);
    return 0;
}
