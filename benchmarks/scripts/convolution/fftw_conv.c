/*
 * FFTW reference timing for Nitid's same-size convolution (benchmarks/scripts/convolution/compare.sh).
 *
 * Does the same work as dev.nitid.fft.Convolver with the REFLECT boundary: extend the image by
 * half-sample symmetry, real-to-complex FFT, multiply by the PSF's transfer function, complex-to-real
 * FFT, crop. Single precision (fftwf), FFTW_MEASURE plans made before timing.
 *   whole: one FFT of the extended image padded to the smallest even 2-3-5-smooth size;
 *          fftw3f_threads with the given thread count.
 *   tiled: overlap-save tiles of T x T (T given), one single-threaded plan executed on per-thread
 *          buffers (new-array execute), tiles split statically over OpenMP threads.
 * Prints: best wall time and smallest process CPU time (all threads) in ms over the repetitions, and a
 * checksum of the output. OpenMP threads may spin while waiting, which adds to the CPU time.
 *
 * Build: gcc -O3 -march=native -fopenmp fftw_conv.c -o fftw_conv -lfftw3f_threads -lfftw3f -lm
 * Usage: fftw_conv WIDTH HEIGHT PSF whole|tiled THREADS REPS [TILE]
 */
#include <fftw3.h>
#include <math.h>
#include <omp.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static int smooth235(int n) {
    while (n % 2 == 0) n /= 2;
    while (n % 3 == 0) n /= 3;
    while (n % 5 == 0) n /= 5;
    return n == 1;
}

static int next_fast(int n) {
    int m = n < 2 ? 2 : n + (n & 1);
    while (!smooth235(m)) m += 2;
    return m;
}

static int reflect(int x, int n) {
    int m = ((x % (2 * n)) + 2 * n) % (2 * n);
    return m < n ? m : 2 * n - 1 - m;
}

static double now_ms(void) {
    struct timespec t;
    clock_gettime(CLOCK_MONOTONIC, &t);
    return t.tv_sec * 1e3 + t.tv_nsec / 1e6;
}

static double cpu_ms(void) {
    struct timespec t;
    clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
    return t.tv_sec * 1e3 + t.tv_nsec / 1e6;
}

/* Transfer function of the PSF (centre floor(p/2)) on an nx x ny grid, scaled by 1/(nx ny). */
static fftwf_complex *make_otf(const float *psf, int p, int nx, int ny) {
    int cw = nx / 2 + 1;
    float *r = fftwf_malloc(sizeof(float) * 2 * cw * ny);
    fftwf_complex *h = (fftwf_complex *) r;
    memset(r, 0, sizeof(float) * 2 * cw * ny);
    fftwf_plan pl = fftwf_plan_dft_r2c_2d(ny, nx, r, h, FFTW_ESTIMATE);
    int c = p / 2;
    for (int j = 0; j < p; j++)
        for (int i = 0; i < p; i++) {
            int yy = ((j - c) % ny + ny) % ny, xx = ((i - c) % nx + nx) % nx;
            r[yy * 2 * cw + xx] = psf[j * p + i];
        }
    fftwf_execute(pl);
    fftwf_destroy_plan(pl);
    float s = 1.0f / ((float) nx * ny);
    for (int k = 0; k < cw * ny; k++) { h[k][0] *= s; h[k][1] *= s; }
    return h;
}

static void multiply(fftwf_complex *a, const fftwf_complex *h, int n) {
    for (int k = 0; k < n; k++) {
        float ar = a[k][0], ai = a[k][1], hr = h[k][0], hi = h[k][1];
        a[k][0] = hr * ar - hi * ai;
        a[k][1] = hr * ai + hi * ar;
    }
}

int main(int argc, char **argv) {
    if (argc < 7) {
        fprintf(stderr, "usage: %s WIDTH HEIGHT PSF whole|tiled THREADS REPS [TILE]\n", argv[0]);
        return 2;
    }
    int w = atoi(argv[1]), h = atoi(argv[2]), p = atoi(argv[3]);
    int tiled = strcmp(argv[4], "tiled") == 0;
    int threads = atoi(argv[5]), reps = atoi(argv[6]);
    int tile = argc > 7 ? atoi(argv[7]) : 256;
    float *img = malloc(sizeof(float) * w * h), *out = malloc(sizeof(float) * w * h);
    float *psf = malloc(sizeof(float) * p * p);
    srand(1);
    for (long i = 0; i < (long) w * h; i++) img[i] = rand() / (float) RAND_MAX;
    for (int i = 0; i < p * p; i++) psf[i] = 1.0f / (p * p);
    int off = p - 1 - p / 2; /* image column 0 sits at extended column off */
    int extw = w + p - 1, exth = h + p - 1;
    double best = 1e30, bestcpu = 1e30;
    fftwf_init_threads();
    if (!tiled) {
        int nx = next_fast(extw), ny = next_fast(exth), cw = nx / 2 + 1;
        fftwf_complex *hh = make_otf(psf, p, nx, ny);
        float *buf = fftwf_malloc(sizeof(float) * 2 * cw * ny);
        fftwf_plan_with_nthreads(threads);
        fftwf_plan fwd = fftwf_plan_dft_r2c_2d(ny, nx, buf, (fftwf_complex *) buf, FFTW_MEASURE);
        fftwf_plan inv = fftwf_plan_dft_c2r_2d(ny, nx, (fftwf_complex *) buf, buf, FFTW_MEASURE);
        int *mx = malloc(sizeof(int) * extw);
        for (int x = 0; x < extw; x++) mx[x] = reflect(x - off, w);
        for (int r = 0; r < reps; r++) {
            double t0 = now_ms(), c0 = cpu_ms();
            #pragma omp parallel for num_threads(threads) schedule(static)
            for (int y = 0; y < ny; y++) {
                float *row = buf + (long) y * 2 * cw;
                if (y < exth) {
                    const float *src = img + (long) reflect(y - off, h) * w;
                    for (int x = 0; x < extw; x++) row[x] = src[mx[x]];
                    memset(row + extw, 0, sizeof(float) * (2 * cw - extw));
                } else {
                    memset(row, 0, sizeof(float) * 2 * cw);
                }
            }
            fftwf_execute(fwd);
            multiply((fftwf_complex *) buf, hh, cw * ny);
            fftwf_execute(inv);
            #pragma omp parallel for num_threads(threads) schedule(static)
            for (int y = 0; y < h; y++)
                memcpy(out + (long) y * w, buf + (long) (y + off) * 2 * cw + off, sizeof(float) * w);
            double t = now_ms() - t0, c = cpu_ms() - c0;
            if (t < best) best = t;
            if (c < bestcpu) bestcpu = c;
        }
        printf("fftw whole %dx%d fft %dx%d threads %d best_ms %.2f cpu_ms %.2f", w, h, nx, ny, threads, best, bestcpu);
    } else {
        int T = tile, cw = T / 2 + 1, v = T - p + 1;
        int ntx = (w + v - 1) / v, nty = (h + v - 1) / v;
        fftwf_complex *hh = make_otf(psf, p, T, T);
        float **bufs = malloc(sizeof(float *) * threads);
        for (int t = 0; t < threads; t++) bufs[t] = fftwf_malloc(sizeof(float) * 2 * cw * T);
        fftwf_plan fwd = fftwf_plan_dft_r2c_2d(T, T, bufs[0], (fftwf_complex *) bufs[0], FFTW_MEASURE);
        fftwf_plan inv = fftwf_plan_dft_c2r_2d(T, T, (fftwf_complex *) bufs[0], bufs[0], FFTW_MEASURE);
        for (int r = 0; r < reps; r++) {
            double t0 = now_ms(), c0 = cpu_ms();
            #pragma omp parallel for num_threads(threads) schedule(static)
            for (int i = 0; i < ntx * nty; i++) {
                float *b = bufs[omp_get_thread_num()];
                int x0 = (i % ntx) * v, y0 = (i / ntx) * v;
                int nxv = w - x0 < v ? w - x0 : v, nyv = h - y0 < v ? h - y0 : v;
                for (int ry = 0; ry < T; ry++) {
                    float *row = b + (long) ry * 2 * cw;
                    int ye = y0 + ry;
                    if (ye < exth && ry < nyv + p - 1) {
                        const float *src = img + (long) reflect(ye - off, h) * w;
                        for (int c = 0; c < T; c++) {
                            int xe = x0 + c;
                            row[c] = (xe < extw && c < nxv + p - 1) ? src[reflect(xe - off, w)] : 0.0f;
                        }
                    } else {
                        memset(row, 0, sizeof(float) * T);
                    }
                }
                fftwf_execute_dft_r2c(fwd, b, (fftwf_complex *) b);
                multiply((fftwf_complex *) b, hh, cw * T);
                fftwf_execute_dft_c2r(inv, (fftwf_complex *) b, b);
                for (int ry = 0; ry < nyv; ry++)
                    memcpy(out + (long) (y0 + ry) * w + x0, b + (long) (ry + off) * 2 * cw + off, sizeof(float) * nxv);
            }
            double t = now_ms() - t0, c = cpu_ms() - c0;
            if (t < best) best = t;
            if (c < bestcpu) bestcpu = c;
        }
        printf("fftw tiled %dx%d tile %d tiles %d threads %d best_ms %.2f cpu_ms %.2f", w, h, T, ntx * nty, threads, best, bestcpu);
    }
    double sum = 0;
    for (long i = 0; i < (long) w * h; i++) sum += out[i];
    printf(" checksum %.6e\n", sum / ((double) w * h));
    return 0;
}
