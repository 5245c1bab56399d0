#!/usr/bin/env python3
"""Reference eigen solves for `npm run bench`, on the Matrix Market files the bench wrote.

usage: reference.py kernel sparse K.mtx M.mtx k runs   -> scipy.sparse.linalg.eigsh(K, k, M, sigma=0)
       reference.py kernel dense  K.mtx M.mtx 0 runs   -> scipy.linalg.eigh(K, M), every mode
       reference.py process sparse|dense K.mtx M.mtx k -> one whole solve as a user runs it: read
                                                          both files, solve, print the eigenvalues

Both return eigenvectors, as our engine does (a mode is a frequency and its shape): eigsh runs its
default ARPACK shift-invert and `eigh(K, M)` its default driver with vectors.

`kernel` prints one JSON object: tool versions, the median and every run's seconds (the solve only,
not the file read), the eigenvalues (ascending), and the process's peak resident memory in MB.
`process` is timed from outside (the bench times the whole process, interpreter start included)
and prints the eigenvalues as JSON, as our command line does.
"""
import json
import resource
import sys
import time

import numpy
import scipy
import scipy.io
import scipy.linalg
import scipy.sparse.linalg


def solve(mode, K, M, k):
    if mode == 'sparse':
        w, _ = scipy.sparse.linalg.eigsh(K, k=k, M=M, sigma=0, which='LM')
    else:
        w, _ = scipy.linalg.eigh(K.toarray(), M.toarray())
    return sorted(float(x) for x in w)


def main() -> None:
    what, mode, kpath, mpath, k = sys.argv[1], sys.argv[2], sys.argv[3], sys.argv[4], int(sys.argv[5])
    if what == 'process':
        K = scipy.io.mmread(kpath).tocsc()
        M = scipy.io.mmread(mpath).tocsc()
        print(json.dumps({'lambdas': solve(mode, K, M, k)}))
        return
    runs = int(sys.argv[6])
    K = scipy.io.mmread(kpath).tocsc()
    M = scipy.io.mmread(mpath).tocsc()
    times = []
    values = None
    for _ in range(runs):
        if mode == 'sparse':
            t0 = time.perf_counter()
            values = solve(mode, K, M, k)
            times.append(time.perf_counter() - t0)
        else:
            Kd = K.toarray()
            Md = M.toarray()
            t0 = time.perf_counter()
            w, _ = scipy.linalg.eigh(Kd, Md)
            times.append(time.perf_counter() - t0)
            values = sorted(float(x) for x in w)
    peak_mb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0
    print(json.dumps({
        'tool': f'scipy {scipy.__version__}, numpy {numpy.__version__}',
        'median': sorted(times)[len(times) // 2],
        'times': times,
        'lambdas': values,
        'peakMB': peak_mb,
    }))


if __name__ == '__main__':
    main()
