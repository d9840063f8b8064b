#pragma once
// Per-limb values of one stride. Quadrupeds and bipeds keep them inline (no heap block per
// stride: a long annotation has 10^5 strides, and three small vectors each cost more than the
// analysis itself); larger limb sets spill to the heap. The std::vector subset users need.
#include <algorithm>
#include <array>
#include <cstddef>
#include <initializer_list>
#include <vector>

namespace stridemark::analysis {

template <typename T, std::size_t Inline = 4>
class LimbValues {
 public:
  LimbValues() = default;
  LimbValues(std::initializer_list<T> values) { assign(values.begin(), values.end()); }
  LimbValues(const std::vector<T>& values) {  // NOLINT(google-explicit-constructor)
    assign(values.begin(), values.end());
  }

  std::size_t size() const { return size_; }
  bool empty() const { return size_ == 0; }
  T* data() { return size_ <= Inline ? inline_.data() : heap_.data(); }
  const T* data() const { return size_ <= Inline ? inline_.data() : heap_.data(); }
  T& operator[](std::size_t i) { return data()[i]; }
  const T& operator[](std::size_t i) const { return data()[i]; }
  T* begin() { return data(); }
  T* end() { return data() + size_; }
  const T* begin() const { return data(); }
  const T* end() const { return data() + size_; }

  void assign(std::size_t count, const T& value) {
    resizeStorage(count);
    std::fill(begin(), end(), value);
  }
  template <typename It>
  void assign(It first, It last) {
    resizeStorage(static_cast<std::size_t>(std::distance(first, last)));
    std::copy(first, last, begin());
  }
  void clear() { resizeStorage(0); }

  friend bool operator==(const LimbValues& a, const LimbValues& b) {
    return std::equal(a.begin(), a.end(), b.begin(), b.end());
  }

 private:
  void resizeStorage(std::size_t count) {
    size_ = count;
    if (count > Inline) {
      heap_.resize(count);
    } else {
      heap_.clear();
    }
  }

  std::size_t size_ = 0;
  std::array<T, Inline> inline_{};
  std::vector<T> heap_;
};

}  // namespace stridemark::analysis
