# Independent reference for the beam solver: deflection at a point by the unit-load (virtual work)
# method, delta_p = integral of M(x) m_p(x) / EI dx, integrated with scipy.integrate.quad (Debian
# python3-scipy). Reads a beam JSON plus "pointsMm" on stdin; prints reactions and deflections.
import json
import sys

from scipy.integrate import quad

beam = json.load(sys.stdin)
L = beam["lengthMm"] / 1000
x1, x2 = (s / 1000 for s in beam["supportsMm"])
EI = beam["eiNm2"]
loads = [(l["xMm"] / 1000, l["forceN"]) for l in beam["loads"]]


def reactions(point_loads):
    r2 = sum(f * (x - x1) for x, f in point_loads) / (x2 - x1)
    return sum(f for _, f in point_loads) - r2, r2


def moment_of(point_loads):
    r1, r2 = reactions(point_loads)
    forces = [(x1, r1), (x2, r2)] + [(x, -f) for x, f in point_loads]
    return lambda x: sum(p * (x - s) for s, p in forces if s < x)


M = moment_of(loads)
breaks = sorted({x1, x2, *(x for x, _ in loads)})
out = []
for p_mm in beam["pointsMm"]:
    p = p_mm / 1000
    m = moment_of([(p, 1.0)])
    # Piecewise quadratic integrand: integrate each smooth piece on its own.
    edges = sorted({0.0, L, *(b for b in breaks + [p] if 0 < b < L)})
    value = sum(quad(lambda x: M(x) * m(x), lo, hi, epsabs=1e-15, epsrel=1e-13)[0] for lo, hi in zip(edges, edges[1:]))
    out.append(value / EI * 1000)
print(json.dumps({"reactionsN": reactions(loads), "deflectionsMm": out}))
