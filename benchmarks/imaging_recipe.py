#!/usr/bin/python3
"""The imaging practitioner's way to the Betti numbers of a binary volume, for comparison
with `lacuna homology` on the same file (docs/performance.md, "Volumes by duality").

Reads a raw uint8 NRRD (as `bench_scale --write-volume` writes them; a sample is foreground
when it is not 0), labels the foreground with 26-connectivity and the background with
6-connectivity (scipy.ndimage.label), counts the background components that do not touch the
border of the box, and takes the Euler number of the foreground with 26-connectivity
(skimage.measure.euler_number). Then b0, b2 = bounded background components, and
b1 = b0 + b2 - chi. General-purpose libraries from Debian: python3-scipy, python3-skimage.

    /usr/bin/time -f "%e s %M KB" /usr/bin/python3 benchmarks/imaging_recipe.py FILE.nrrd
"""
import sys

import numpy as np
from scipy import ndimage
from skimage.measure import euler_number


def read_nrrd(path):
    with open(path, "rb") as f:
        sizes, encoding = None, None
        while True:
            line = f.readline()
            if line in (b"\n", b"\r\n", b""):
                break
            text = line.decode("ascii", "replace").strip()
            if text.startswith("sizes:"):
                sizes = [int(x) for x in text.split(":", 1)[1].split()]
            elif text.startswith("encoding:"):
                encoding = text.split(":", 1)[1].strip()
        if encoding != "raw" or sizes is None:
            sys.exit(f"{path}: expected a raw NRRD with sizes")
        data = np.frombuffer(f.read(), dtype=np.uint8)
    # NRRD: the first axis varies fastest
    return data[: int(np.prod(sizes))].reshape(sizes[::-1]) != 0


def main():
    volume = read_nrrd(sys.argv[1])
    _, b0 = ndimage.label(volume, structure=np.ones((3, 3, 3), dtype=bool))
    background, nb = ndimage.label(~volume)  # 6-connectivity by default
    border = np.unique(np.concatenate([
        background[0].ravel(), background[-1].ravel(), background[:, 0].ravel(),
        background[:, -1].ravel(), background[:, :, 0].ravel(), background[:, :, -1].ravel()]))
    b2 = nb - np.count_nonzero(border)
    chi = euler_number(volume, connectivity=3)
    print(f"b0 {b0} b1 {b0 + b2 - chi} b2 {b2}")


if __name__ == "__main__":
    main()
