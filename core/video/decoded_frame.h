#pragma once
// A decoded picture that owns its planes. The memory comes from a FramePool, never from the
// decoder's own buffers: holding decoder buffers pins its pool and costs page faults on every
// refill (VIDEO-NOTES §4.2.2). Frames stay in the file's native pixel format; conversion to
// RGB happens only for display or export (convert.h).
#include <array>
#include <cstddef>
#include <cstdint>
#include <memory>
#include <mutex>
#include <string>
#include <vector>

namespace stridemark::video {

class FramePool;

struct PlaneLayout {
  int width = 0;
  int height = 0;
  int pixelFormat = -1;  // AVPixelFormat value; native format of the stream
  std::array<int, 4> linesize{};
  std::array<std::size_t, 4> offset{};
  std::size_t bytes = 0;  // size of one frame's buffer (planes with aligned rows)
  friend bool operator==(const PlaneLayout&, const PlaneLayout&) = default;
};

// Layout with 64-byte aligned rows for the given size and AVPixelFormat.
PlaneLayout planeLayoutFor(int width, int height, int pixelFormat);

// Why a `damaged` frame is no exact picture, in the words every message uses.
inline constexpr const char* kConcealedDamage =
    "decoded with errors (the decoder concealed damaged data)";

class DecodedFrame {
 public:
  DecodedFrame() = default;
  DecodedFrame(std::int64_t index, const PlaneLayout& layout, std::shared_ptr<FramePool> pool);
  ~DecodedFrame();
  DecodedFrame(DecodedFrame&& other) noexcept;
  DecodedFrame& operator=(DecodedFrame&& other) noexcept;
  DecodedFrame(const DecodedFrame&) = delete;
  DecodedFrame& operator=(const DecodedFrame&) = delete;

  std::int64_t index() const { return index_; }  // presentation-order frame number
  int width() const { return layout_.width; }
  int height() const { return layout_.height; }
  int pixelFormat() const { return layout_.pixelFormat; }  // AVPixelFormat
  const PlaneLayout& layout() const { return layout_; }
  std::size_t bytes() const { return layout_.bytes; }

  // Plane pointers and strides in the form libav/swscale expect (unused planes are null).
  std::array<const std::uint8_t*, 4> planes() const;
  std::array<std::uint8_t*, 4> mutablePlanes();
  const std::array<int, 4>& linesizes() const { return layout_.linesize; }

  std::int64_t pts = 0;    // in the stream time base
  bool keyframe = false;   // the decoder marked it as a keyframe
  char pictureType = '?';  // 'I', 'P', 'B' or '?'
  bool damaged = false;    // the decoder reported errors while producing it (kConcealedDamage)

  // The planes packed without padding (rows of exactly the visible width), as libav's
  // rawvideo encoder lays them out: this is what `ffmpeg -f framemd5` hashes.
  std::vector<std::uint8_t> packedPlanes() const;
  // Lower-case hex MD5 of packedPlanes(), the same value `ffmpeg -f framemd5` prints.
  std::string md5() const;

 private:
  void release();
  std::int64_t index_ = -1;
  PlaneLayout layout_;
  std::uint8_t* data_ = nullptr;
  std::shared_ptr<FramePool> pool_;
};

// Recycles frame buffers of one clip: a frame evicted from the cache hands its buffer to the
// next decoded frame instead of returning it to the allocator, so a refill reuses memory that is
// already faulted in. Thread-safe (the frame server decodes on a worker thread).
class FramePool {
 public:
  static std::shared_ptr<FramePool> create() { return std::make_shared<FramePool>(); }
  FramePool() = default;
  FramePool(const FramePool&) = delete;
  FramePool& operator=(const FramePool&) = delete;
  std::uint8_t* acquire(std::size_t bytes);  // an idle buffer of that size, or a fresh one
  void giveBack(std::uint8_t* data, std::size_t bytes);
  std::size_t idleBytes() const;
  void trimIdle();  // frees every idle buffer (after the cache budget shrinks)

 private:
  struct FreeBytes {
    void operator()(std::uint8_t* p) const;
  };
  struct Idle {
    std::unique_ptr<std::uint8_t, FreeBytes> data;
    std::size_t bytes = 0;
  };
  mutable std::mutex mutex_;
  std::vector<Idle> idle_;
};

}  // namespace stridemark::video
