#pragma once
// A number that may be missing, in 8 bytes: "missing" is stored as NaN. std::optional<double>
// takes 16 (the flag pads to the double's alignment), and a city's network holds a dozen of them
// per feature (issue 22: 12 per pipe and structure pair, ~100 MB at 10^6 pipes). The interface is
// the part of std::optional<double> the model uses, so the two read alike; readers never store a
// NaN (value_checks rejects non-finite values), which is what makes NaN free to mean "missing".
#include <cmath>
#include <limits>
#include <optional>
#include <stdexcept>
#include <type_traits>

namespace rimline {

class OptionalDouble {
 public:
  constexpr OptionalDouble() noexcept = default;
  constexpr OptionalDouble(std::nullopt_t) noexcept {}
  constexpr OptionalDouble(double v) noexcept : v_(v) {}
  OptionalDouble(const std::optional<double>& o) noexcept : v_(o ? *o : none) {}

  bool has_value() const noexcept { return !std::isnan(v_); }
  explicit operator bool() const noexcept { return has_value(); }
  // As std::optional: reading an empty one with * is the caller's error (here it reads NaN).
  double operator*() const noexcept { return v_; }
  double value() const {
    if (!has_value()) throw std::bad_optional_access();
    return v_;
  }
  double value_or(double fallback) const noexcept { return has_value() ? v_ : fallback; }
  void reset() noexcept { v_ = none; }
  double& emplace(double v) noexcept { return v_ = v; }
  OptionalDouble& operator=(std::nullopt_t) noexcept {
    v_ = none;
    return *this;
  }
  OptionalDouble& operator=(double v) noexcept {
    v_ = v;
    return *this;
  }
  OptionalDouble& operator=(const std::optional<double>& o) noexcept {
    v_ = o ? *o : none;
    return *this;
  }
  operator std::optional<double>() const noexcept {
    return has_value() ? std::optional<double>(v_) : std::nullopt;
  }

  friend bool operator==(const OptionalDouble& a, std::nullopt_t) noexcept { return !a.has_value(); }
  // A value on the other side (a number, Catch's Approx): equal when present and equal, as std::optional.
  template <class U>
    requires(!std::is_same_v<std::decay_t<U>, OptionalDouble> && !std::is_same_v<std::decay_t<U>, std::nullopt_t> &&
             !std::is_same_v<std::decay_t<U>, std::optional<double>> && !std::is_arithmetic_v<std::decay_t<U>>)
  friend bool operator==(const OptionalDouble& a, const U& b) {
    return a.has_value() && a.v_ == b;
  }
  friend bool operator==(const OptionalDouble& a, const OptionalDouble& b) noexcept {
    return a.has_value() == b.has_value() && (!a.has_value() || a.v_ == b.v_);
  }

 private:
  static constexpr double none = std::numeric_limits<double>::quiet_NaN();
  double v_ = none;
};

static_assert(sizeof(OptionalDouble) == sizeof(double));

}  // namespace rimline
