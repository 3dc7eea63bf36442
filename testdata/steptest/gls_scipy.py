#!/usr/bin/python3
"""Reference values of the generalised least-squares fits of Jacob's (1947)
law s_w = B Q + C Q^2 and Rorabaugh's (1953) law s_w = B Q + C Q^n to
step drawdowns with correlated errors, computed with scipy.

Source: scipy (Debian package python3-scipy), scipy.optimize.curve_fit on
the specific drawdown y = s_w / Q with a 2-D sigma (the covariance of y,
Cov(s_w)_kl / (Q_k Q_l)) and absolute_sigma=False: generalised least
squares, the covariance of the parameters scaled by the residual variance
r^T Cov(y)^-1 r / (N - p). Jacob: y = B + C Q; Rorabaugh: y = B + C Q^(n-1),
method 'lm' with the analytic Jacobian from B = 280, C = 3000, n = 2 (the optimum lies inside the
default range 1.5 <= n <= 3.5 of package steptest).

The inputs are of our own making: the equal-duration drawdowns of a
synthetic five-step test (Theis drawdown plus well losses, 5 mm of
Gaussian noise on the readings) and their covariance as package steptest
derives it for readings of unit variance, rounded. Run from the
repository root:

    /usr/bin/python3 testdata/steptest/gls_scipy.py > testdata/steptest/gls_scipy.tsv

Output: tab-separated lines. "point Q s_w cov_k1 ... cov_k5" gives the
inputs; "fit METHOD name value stderr" the results, for
METHOD = jacob (B, C) and rorabaugh (B, C, n).
"""
import numpy as np
import scipy
from scipy.optimize import curve_fit

Q = np.array([0.004, 0.008, 0.012, 0.016, 0.020])
SW = np.array([1.1785, 2.4558, 3.8278, 5.2896, 6.8481])
COV = np.array([
    [1.0, 0.6061859358, 0.6061859358, 0.6061859358, 0.6061859358],
    [0.6061859358, 1.796973321, 1.341875011, 1.341875011, 1.341875011],
    [0.6061859358, 1.341875011, 2.614666594, 2.123499749, 2.123499749],
    [0.6061859358, 1.341875011, 2.123499749, 3.451519017, 2.935431126],
    [0.6061859358, 1.341875011, 2.123499749, 2.935431126, 4.304491737],
])

y = SW / Q
cy = COV / np.outer(Q, Q)


def jacob(q, b, c):
    return b + c * q


def rorabaugh(q, b, c, n):
    return b + c * q ** (n - 1)


# Analytic Jacobians, so that the parameter covariance carries no
# finite-difference error.
def jacob_jac(q, b, c):
    return np.column_stack([np.ones_like(q), q])


def rorabaugh_jac(q, b, c, n):
    g = q ** (n - 1)
    return np.column_stack([np.ones_like(q), g, c * g * np.log(q)])


print("# scipy %s, numpy %s" % (scipy.__version__, np.__version__))
for k in range(len(Q)):
    print("point\t%r\t%r\t%s" % (Q[k], SW[k], "\t".join(repr(v) for v in COV[k])))
for name, f, jac, p0, names in [
    ("jacob", jacob, jacob_jac, [280.0, 3000.0], ["B", "C"]),
    ("rorabaugh", rorabaugh, rorabaugh_jac, [280.0, 3000.0, 2.0], ["B", "C", "n"]),
]:
    p, pcov = curve_fit(f, Q, y, p0=p0, sigma=cy, absolute_sigma=False, jac=jac,
                        method="lm", xtol=1e-15, ftol=1e-15, gtol=1e-15, maxfev=100000)
    for j, nm in enumerate(names):
        print("fit\t%s\t%s\t%.15g\t%.15g" % (name, nm, p[j], np.sqrt(pcov[j, j])))
