#pragma once
// The pipes arriving at or leaving one structure: a list of indices that keeps up to two in place
// and goes to the heap only beyond that. Almost every structure of a sewer or storm network has one
// outflow and one or two inflows, so a city's nodes need no allocation of their own (issue 22: a
// std::vector per list cost 2 heap blocks per structure, ~92 MB at 10^6 pipes in the heap profile).
// The same size as a std::vector (24 bytes) and read like one.
#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <initializer_list>
#include <vector>

namespace rimline::topology {

class IndexList {
 public:
  using value_type = std::size_t;
  using size_type = std::size_t;
  using iterator = std::size_t*;
  using const_iterator = const std::size_t*;

  IndexList() noexcept : inline_{0, 0} {}
  IndexList(std::initializer_list<std::size_t> values) : IndexList() {
    for (std::size_t v : values) push_back(v);
  }
  IndexList(const IndexList& other) : IndexList() { append(other.begin(), other.end()); }
  IndexList(IndexList&& other) noexcept : IndexList() { take(other); }
  IndexList& operator=(const IndexList& other) {
    if (this != &other) {
      clear();
      append(other.begin(), other.end());
    }
    return *this;
  }
  IndexList& operator=(IndexList&& other) noexcept {
    if (this != &other) {
      release();
      take(other);
    }
    return *this;
  }
  ~IndexList() { release(); }

  std::size_t size() const noexcept { return size_; }
  bool empty() const noexcept { return size_ == 0; }
  std::size_t* data() noexcept { return on_heap() ? heap_ : inline_; }
  const std::size_t* data() const noexcept { return on_heap() ? heap_ : inline_; }
  iterator begin() noexcept { return data(); }
  iterator end() noexcept { return data() + size_; }
  const_iterator begin() const noexcept { return data(); }
  const_iterator end() const noexcept { return data() + size_; }
  std::size_t& operator[](std::size_t i) noexcept { return data()[i]; }
  std::size_t operator[](std::size_t i) const noexcept { return data()[i]; }
  std::size_t front() const noexcept { return data()[0]; }
  std::size_t back() const noexcept { return data()[size_ - 1]; }

  void push_back(std::size_t v) {
    if (size_ == capacity_) grow(capacity_ * 2);
    data()[size_++] = v;
  }
  void pop_back() noexcept { --size_; }
  void clear() noexcept { size_ = 0; }
  iterator erase(const_iterator pos) noexcept {
    std::size_t* p = begin() + (pos - begin());
    std::move(p + 1, end(), p);
    --size_;
    return p;
  }
  iterator erase(const_iterator first, const_iterator last) noexcept {
    std::size_t* p = begin() + (first - begin());
    const std::size_t n = static_cast<std::size_t>(last - first);
    std::move(p + n, end(), p);
    size_ -= static_cast<std::uint32_t>(n);
    return p;
  }

  // For the few callers that want a std::vector (a copy).
  operator std::vector<std::size_t>() const { return {begin(), end()}; }
  friend bool operator==(const IndexList& a, const IndexList& b) noexcept {
    return std::equal(a.begin(), a.end(), b.begin(), b.end());
  }

 private:
  static constexpr std::uint32_t inline_capacity = 2;
  bool on_heap() const noexcept { return capacity_ > inline_capacity; }
  void grow(std::uint32_t capacity) {
    auto* bigger = new std::size_t[capacity];
    std::memcpy(bigger, data(), size_ * sizeof(std::size_t));
    if (on_heap()) delete[] heap_;
    heap_ = bigger;
    capacity_ = capacity;
  }
  void append(const std::size_t* first, const std::size_t* last) {
    for (; first != last; ++first) push_back(*first);
  }
  void release() noexcept {
    if (on_heap()) delete[] heap_;
    capacity_ = inline_capacity;
    size_ = 0;
  }
  void take(IndexList& other) noexcept {  // *this holds nothing on the heap
    if (other.on_heap()) {
      heap_ = other.heap_;
    } else {
      inline_[0] = other.inline_[0];
      inline_[1] = other.inline_[1];
    }
    size_ = other.size_;
    capacity_ = other.capacity_;
    other.capacity_ = inline_capacity;
    other.size_ = 0;
  }

  union {
    std::size_t inline_[inline_capacity];
    std::size_t* heap_;
  };
  std::uint32_t size_ = 0;
  std::uint32_t capacity_ = inline_capacity;
};

static_assert(sizeof(IndexList) == 3 * sizeof(std::size_t));

}  // namespace rimline::topology
