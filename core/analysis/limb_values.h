#pragma once
// Per-limb values of one stride. Quadrupeds and bipeds keep them inline (no heap block per
// stride: a long annotation has 10^5 strides, and three small vectors each cost more than the
// analysis itself); larger limb sets spill to the heap. The std::vector subset users need.
// Kept small (80 bytes for optional<double>, 32 for int): a stride record holds three.
#include <algorithm>
#include <array>
#include <cstddef>
#include <cstdint>
#include <initializer_list>
#include <memory>
#include <type_traits>
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
  LimbValues(const LimbValues& other) { assign(other.begin(), other.end()); }
  LimbValues& operator=(const LimbValues& other) {
    if (this != &other) assign(other.begin(), other.end());
    return *this;
  }
  LimbValues(LimbValues&& other) noexcept
      : size_(other.size_), inline_(other.inline_), heap_(std::move(other.heap_)) {
    other.size_ = 0;
  }
  LimbValues& operator=(LimbValues&& other) noexcept {
    size_ = other.size_;
    inline_ = other.inline_;
    heap_ = std::move(other.heap_);
    other.size_ = 0;
    return *this;
  }
  ~LimbValues() = default;

  std::size_t size() const { return size_; }
  bool empty() const { return size_ == 0; }
  T* data() { return size_ <= Inline ? inline_.data() : heap_.get(); }
  const T* data() const { return size_ <= Inline ? inline_.data() : heap_.get(); }
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
  requires(!std::is_integral_v<It>)  // assign(count, value) with int arguments
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
    if (count > Inline) {
      if (count != size_ || !heap_) heap_ = std::make_unique<T[]>(count);
    } else {
      heap_.reset();
    }
    size_ = static_cast<std::uint32_t>(count);
  }

  std::uint32_t size_ = 0;
  std::array<T, Inline> inline_{};
  std::unique_ptr<T[]> heap_;  // only when size_ > Inline
};

}  // namespace stridemark::analysis
