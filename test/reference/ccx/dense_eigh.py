#!/usr/bin/python3
"""Independent dense reference for framewright's sparse eigen solver: numpy's symmetric eigen solver on
the generalized problem K x = lambda M x, reduced to standard form with the Cholesky factor of M
(L^-1 K L^-T) by numpy.
stdin: JSON {"k": [[...], ...] full symmetric matrix, "m": [[...], ...] full matrix or [diagonal], "count": n}
stdout: JSON {"values": lowest n eigenvalues}
"""
import json
import sys

import numpy as np

spec = json.load(sys.stdin)
k = np.array(spec["k"], dtype=float)
m = np.array(spec["m"], dtype=float)
if m.ndim == 1:
    m = np.diag(m)
l_inv = np.linalg.inv(np.linalg.cholesky((m + m.T) / 2))
a = l_inv @ k @ l_inv.T
vals = np.linalg.eigvalsh((a + a.T) / 2)
json.dump({"values": sorted(vals.tolist())[: spec["count"]]}, sys.stdout)
