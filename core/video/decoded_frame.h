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
#include <unordered_map>
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
  bool damaged = false;    // the decoder reported errors while producing it

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

// Recycles frame buffers so a refill does not fault in fresh pages for every frame. Fresh
// buffers are carved one after another out of 2 MiB-aligned slabs advised for transparent huge
// pages: nearly every byte then sits on huge pages, where first touch costs about a twentieth
// of 4 KiB pages (a lone 3 MB frame would leave a 4 KiB-page tail that costs more than the
// rest of it). Buffers are zero-filled once when carved (touching every page) and reused.
// When a pool closes, its slabs stay in the process for the next pool (reopening a clip, the
// next clip of a batch) instead of being faulted in again; trimIdle() really frees.
class FramePool : public std::enable_shared_from_this<FramePool> {
 public:
  static std::shared_ptr<FramePool> create() { return std::make_shared<FramePool>(); }
  FramePool() = default;
  ~FramePool();  // hands its slabs to the next pool of the process (up to 1 GiB is kept)
  FramePool(const FramePool&) = delete;
  FramePool& operator=(const FramePool&) = delete;
  std::uint8_t* acquire(std::size_t bytes);
  void giveBack(std::uint8_t* data, std::size_t bytes);
  std::size_t idleBytes() const;
  void trimIdle();  // frees every slab none of whose buffers is lent out
  // Carves and faults in one more idle buffer of `bytes` (a background warm-up, so the first
  // refills after opening a clip do not pay for fresh memory). Thread-safe.
  void warmOne(std::size_t bytes);
  std::size_t carvedBytes() const;  // buffers carved so far, idle or lent

 private:
  struct FreeSlab {
    void operator()(std::uint8_t* p) const;
  };
  struct Slab {
    std::unique_ptr<std::uint8_t, FreeSlab> memory;
    std::size_t bytes = 0;
    std::size_t used = 0;  // carved so far
    int lent = 0;          // buffers out on loan
  };
  struct Buffer {
    std::uint8_t* data = nullptr;
    std::size_t bytes = 0;
    Slab* slab = nullptr;
  };
  Buffer reserveLocked(std::size_t bytes);  // address space only; the caller touches it

  mutable std::mutex mutex_;
  std::vector<std::unique_ptr<Slab>> slabs_;
  std::vector<Buffer> idle_;
  std::unordered_map<std::uint8_t*, Buffer> lent_;
};

}  // namespace stridemark::video
