#!/usr/bin/python3
"""Write the reference fixtures that Fairlead's tests compare against.

Run with Debian's interpreter after `apt-get install python3-statsmodels`:

    /usr/bin/python3 test/reference/generate.py            # every fixture
    /usr/bin/python3 test/reference/generate.py ols boxcox # only these makers

Each maker is a module `make_<name>.py` beside this script exposing `build()`, which
returns {fixture file name: JSON-serialisable object}. Every fixture records the library
versions that produced it. Output is written with sorted keys and a fixed float format,
so a rerun on the same versions gives the same bytes.
"""
import importlib
import json
import math
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "fixtures")
sys.path.insert(0, HERE)


def versions():
    import numpy
    import scipy
    import statsmodels
    return {
        "numpy": numpy.__version__,
        "scipy": scipy.__version__,
        "statsmodels": statsmodels.__version__,
        "python": sys.version.split()[0],
    }


def clean(obj):
    """Turn numpy values into plain JSON; non-finite floats become strings."""
    import numpy as np
    if isinstance(obj, dict):
        return {str(k): clean(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [clean(v) for v in obj]
    if isinstance(obj, np.ndarray):
        return [clean(v) for v in obj.tolist()]
    if isinstance(obj, (np.floating, float)):
        v = float(obj)
        if math.isnan(v):
            return "NaN"
        if math.isinf(v):
            return "Infinity" if v > 0 else "-Infinity"
        return float(repr(v))
    if isinstance(obj, (np.integer,)):
        return int(obj)
    if isinstance(obj, (np.bool_,)):
        return bool(obj)
    return obj


def main(argv):
    makers = sorted(f[5:-3] for f in os.listdir(HERE) if f.startswith("make_") and f.endswith(".py"))
    wanted = argv or makers
    unknown = [w for w in wanted if w not in makers]
    if unknown:
        sys.exit("unknown maker(s): %s; have: %s" % (", ".join(unknown), ", ".join(makers)))
    os.makedirs(OUT, exist_ok=True)
    stamp = versions()
    for name in wanted:
        module = importlib.import_module("make_" + name)
        for fname, data in module.build().items():
            payload = {"generated_by": "test/reference/make_%s.py" % name, "versions": stamp, "data": clean(data)}
            path = os.path.join(OUT, fname)
            with open(path, "w") as fh:
                json.dump(payload, fh, indent=1, sort_keys=True)
                fh.write("\n")
            print("wrote", os.path.relpath(path, HERE))


if __name__ == "__main__":
    main(sys.argv[1:])
