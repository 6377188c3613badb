#!/usr/bin/python3
"""Independent dense reference for framewright's sparse eigen solver: numpy's symmetric eigen solver on
the generalized problem K x = lambda M x with a diagonal M (reduced to M^-1/2 K M^-1/2).
stdin: JSON {"k": [[...], ...] full symmetric matrix, "m": [diagonal], "count": n}
stdout: JSON {"values": lowest n eigenvalues}
"""
import json
import sys

import numpy as np

spec = json.load(sys.stdin)
k = np.array(spec["k"], dtype=float)
s = 1.0 / np.sqrt(np.array(spec["m"], dtype=float))
a = (k * s[:, None]) * s[None, :]
vals = np.linalg.eigvalsh((a + a.T) / 2)
json.dump({"values": sorted(vals.tolist())[: spec["count"]]}, sys.stdout)
