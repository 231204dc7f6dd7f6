"""What every fixture generator under tests/reference uses to write the same bytes on every run.

pin_blas() must run before numpy is imported. OpenBLAS (behind both the pip numpy and Debian's
python3-numpy) picks its kernels by CPU and splits work over threads, and the last bits of
LAPACK results follow both: the same script gave different last digits on two x86-64 machines.
One kernel (Haswell, i.e. AVX2: any x86-64 CPU since 2013) on one thread gives the same bits
everywhere such a CPU runs the script. Another BLAS (MKL, Accelerate, ARM) may still differ in
the last digits; the checksums below then say so.

check(here, checksums) compares the SHA-256 of each written file with the digests the generator
holds and exits 1 when they differ (update them only together with a deliberate change of the
script); tests/reference/fixtureChecksums.test.ts checks the committed files against the same
digests without Python.
"""
import hashlib
import json
import os
import pathlib
import sys


def pin_blas():
    if "numpy" in sys.modules:
        raise SystemExit("reproducible.pin_blas() must run before numpy is imported")
    os.environ["OPENBLAS_CORETYPE"] = "Haswell"
    os.environ["OPENBLAS_NUM_THREADS"] = "1"
    os.environ["OMP_NUM_THREADS"] = "1"


def check(here: pathlib.Path, checksums: dict):
    digests = {name: hashlib.sha256((here / name).read_bytes()).hexdigest() for name in checksums}
    print(json.dumps(digests, indent=2))
    if digests != checksums:
        raise SystemExit("outputs changed: compare the digests above with CHECKSUMS")
