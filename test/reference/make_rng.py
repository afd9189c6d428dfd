"""numpy's legacy MT19937 generator (RandomState): uniforms and polar-method normals."""
import numpy as np


def build():
    out = []
    for seed in [0, 1, 42, 5489, 20260101, 4294967295]:
        r = np.random.RandomState(seed)
        u = r.random_sample(700)          # crosses the 624-word state refill
        r = np.random.RandomState(seed)
        z = r.standard_normal(701)        # odd count: exercises the kept second draw
        out.append({"seed": seed, "uniform_head": u[:10], "uniform_tail": u[-5:], "normal_head": z[:10], "normal_tail": z[-5:]})
    return {"rng_mt19937.json": out}
