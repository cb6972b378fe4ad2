#pragma once
// One-dimensional solvers shared by the depth and profile computations (internal header).
#include <cmath>
#include <utility>

namespace rimline::hydraulics::detail {

struct RootResult {
  double x = 0.0;
  int iterations = 0;
  bool converged = false;
};

// Brent's method (Brent 1973, "Algorithms for Minimization without Derivatives", ch. 4) on a
// bracket [a, b] with f(a), f(b) of opposite sign (or one of them zero). Stops when the bracket
// is narrower than tol or f is exactly zero.
template <class F>
RootResult brent_root(F&& f, double a, double b, double fa, double fb, double tol, int max_iter) {
  RootResult out;
  if (fa == 0.0) return {a, 0, true};
  if (fb == 0.0) return {b, 0, true};
  double c = a, fc = fa, d = b - a, e = d;
  for (int i = 1; i <= max_iter; ++i) {
    if ((fb > 0.0) == (fc > 0.0)) {
      c = a;
      fc = fa;
      d = e = b - a;
    }
    if (std::fabs(fc) < std::fabs(fb)) {
      a = b; b = c; c = a;
      fa = fb; fb = fc; fc = fa;
    }
    const double tol1 = 2.0 * 1e-16 * std::fabs(b) + 0.5 * tol;
    const double xm = 0.5 * (c - b);
    if (std::fabs(xm) <= tol1 || fb == 0.0) return {b, i, true};
    if (std::fabs(e) >= tol1 && std::fabs(fa) > std::fabs(fb)) {
      double p, q, r;
      const double s = fb / fa;
      if (a == c) {
        p = 2.0 * xm * s;
        q = 1.0 - s;
      } else {
        q = fa / fc;
        r = fb / fc;
        p = s * (2.0 * xm * q * (q - r) - (b - a) * (r - 1.0));
        q = (q - 1.0) * (r - 1.0) * (s - 1.0);
      }
      if (p > 0.0) q = -q;
      p = std::fabs(p);
      if (2.0 * p < std::fmin(3.0 * xm * q - std::fabs(tol1 * q), std::fabs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm;
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    fa = fb;
    b += std::fabs(d) > tol1 ? d : (xm > 0.0 ? tol1 : -tol1);
    fb = f(b);
    out.iterations = i;
  }
  out.x = b;
  out.converged = false;
  return out;
}

// Golden-section search for the maximum of a unimodal f on [a, b] (Kiefer 1953).
template <class F>
std::pair<double, double> golden_max(F&& f, double a, double b, double tol) {
  const double invphi = 0.6180339887498949;
  double c = b - invphi * (b - a), d = a + invphi * (b - a);
  double fc = f(c), fd = f(d);
  while (b - a > tol) {
    if (fc > fd) {
      b = d; d = c; fd = fc;
      c = b - invphi * (b - a);
      fc = f(c);
    } else {
      a = c; c = d; fc = fd;
      d = a + invphi * (b - a);
      fd = f(d);
    }
  }
  const double x = 0.5 * (a + b);
  return {x, f(x)};
}

}  // namespace rimline::hydraulics::detail
