#include "video/decoded_frame.h"

#include <algorithm>
#include <cstdlib>
#include <cstring>
#include <utility>

#include "common/error.h"

extern "C" {
#include <libavutil/imgutils.h>
#include <libavutil/md5.h>
#include <libavutil/pixdesc.h>
}

namespace stridemark::video {

namespace {
constexpr int kRowAlign = 64;

int alignUp(int value, int align) {
  return (value + align - 1) / align * align;
}
}  // namespace

PlaneLayout planeLayoutFor(int width, int height, int pixelFormat) {
  const auto format = static_cast<AVPixelFormat>(pixelFormat);
  const AVPixFmtDescriptor* desc = av_pix_fmt_desc_get(format);
  if (!desc || width <= 0 || height <= 0)
    throw Error(ErrorCategory::decode, "unsupported picture: " + std::to_string(width) + "x" +
                                           std::to_string(height) + " pixel format " +
                                           std::to_string(pixelFormat));
  PlaneLayout layout;
  layout.width = width;
  layout.height = height;
  layout.pixelFormat = pixelFormat;
  int linesize[4] = {};
  if (av_image_fill_linesizes(linesize, format, width) < 0)
    throw Error(ErrorCategory::decode,
                "cannot lay out planes for pixel format " + std::string(desc->name));
  std::ptrdiff_t linesizes[4] = {};
  for (int i = 0; i < 4; ++i) {
    layout.linesize[static_cast<std::size_t>(i)] =
        linesize[i] ? alignUp(linesize[i], kRowAlign) : 0;
    linesizes[i] = layout.linesize[static_cast<std::size_t>(i)];
  }
  std::size_t sizes[4] = {};
  if (av_image_fill_plane_sizes(sizes, format, height, linesizes) < 0)
    throw Error(ErrorCategory::decode,
                "cannot size planes for pixel format " + std::string(desc->name));
  std::size_t offset = 0;
  for (std::size_t i = 0; i < 4; ++i) {
    layout.offset[i] = offset;
    offset += (sizes[i] + kRowAlign - 1) / kRowAlign * kRowAlign;
  }
  // Paletted formats keep their 1 KiB palette in plane 1 (libav convention).
  if (desc->flags & AV_PIX_FMT_FLAG_PAL) {
    layout.offset[1] = offset;
    layout.linesize[1] = 4;
    offset += 256 * 4;
  }
  layout.bytes = offset;
  return layout;
}

DecodedFrame::DecodedFrame(std::int64_t index, const PlaneLayout& layout,
                           std::shared_ptr<FramePool> pool)
    : index_(index), layout_(layout), pool_(std::move(pool)) {
  data_ = pool_->acquire(layout_.bytes);
}

DecodedFrame::~DecodedFrame() {
  release();
}

DecodedFrame::DecodedFrame(DecodedFrame&& other) noexcept
    : pts(other.pts),
      keyframe(other.keyframe),
      pictureType(other.pictureType),
      damaged(other.damaged),
      index_(other.index_),
      layout_(other.layout_),
      data_(std::exchange(other.data_, nullptr)),
      pool_(std::move(other.pool_)) {}

DecodedFrame& DecodedFrame::operator=(DecodedFrame&& other) noexcept {
  if (this != &other) {
    release();
    pts = other.pts;
    keyframe = other.keyframe;
    pictureType = other.pictureType;
    damaged = other.damaged;
    index_ = other.index_;
    layout_ = other.layout_;
    data_ = std::exchange(other.data_, nullptr);
    pool_ = std::move(other.pool_);
  }
  return *this;
}

void DecodedFrame::release() {
  if (data_ && pool_) pool_->giveBack(data_, layout_.bytes);
  data_ = nullptr;
}

std::array<const std::uint8_t*, 4> DecodedFrame::planes() const {
  std::array<const std::uint8_t*, 4> out{};
  for (std::size_t i = 0; i < 4; ++i)
    out[i] = (data_ && layout_.linesize[i]) ? data_ + layout_.offset[i] : nullptr;
  return out;
}

std::array<std::uint8_t*, 4> DecodedFrame::mutablePlanes() {
  std::array<std::uint8_t*, 4> out{};
  for (std::size_t i = 0; i < 4; ++i)
    out[i] = (data_ && layout_.linesize[i]) ? data_ + layout_.offset[i] : nullptr;
  return out;
}

std::vector<std::uint8_t> DecodedFrame::packedPlanes() const {
  const auto format = static_cast<AVPixelFormat>(layout_.pixelFormat);
  const int size = av_image_get_buffer_size(format, layout_.width, layout_.height, 1);
  if (size < 0 || !data_) throw Error(ErrorCategory::decode, "frame has no picture data");
  std::vector<std::uint8_t> packed(static_cast<std::size_t>(size));
  const auto src = planes();
  const std::uint8_t* srcData[4] = {src[0], src[1], src[2], src[3]};
  const int srcLines[4] = {layout_.linesize[0], layout_.linesize[1], layout_.linesize[2],
                           layout_.linesize[3]};
  if (av_image_copy_to_buffer(packed.data(), size, srcData, srcLines, format, layout_.width,
                              layout_.height, 1) < 0)
    throw Error(ErrorCategory::decode, "cannot pack frame planes");
  return packed;
}

std::string DecodedFrame::md5() const {
  const auto packed = packedPlanes();
  std::uint8_t digest[16] = {};
  av_md5_sum(digest, packed.data(), packed.size());
  static constexpr char kHex[] = "0123456789abcdef";
  std::string hex;
  for (const std::uint8_t byte : digest) {
    hex += kHex[byte >> 4];
    hex += kHex[byte & 15];
  }
  return hex;
}

void FramePool::FreeBytes::operator()(std::uint8_t* p) const {
  std::free(p);
}

std::uint8_t* FramePool::acquire(std::size_t bytes) {
  {
    std::lock_guard lock(mutex_);
    const auto it = std::find_if(idle_.begin(), idle_.end(),
                                 [bytes](const Idle& idle) { return idle.bytes == bytes; });
    if (it != idle_.end()) {
      std::uint8_t* data = it->data.release();
      *it = std::move(idle_.back());
      idle_.pop_back();
      return data;
    }
  }
  // 64-byte aligned: PlaneLayout's rows are, and swscale's SIMD loads want it.
  constexpr std::size_t kAlign = 64;
  void* raw = std::aligned_alloc(kAlign, (bytes + kAlign - 1) / kAlign * kAlign);
  if (!raw) throw Error(ErrorCategory::decode, "out of memory for the frame cache");
  return static_cast<std::uint8_t*>(raw);
}

void FramePool::giveBack(std::uint8_t* data, std::size_t bytes) {
  std::unique_ptr<std::uint8_t, FreeBytes> owned(data);
  std::lock_guard lock(mutex_);
  idle_.push_back({std::move(owned), bytes});
}

std::size_t FramePool::idleBytes() const {
  std::lock_guard lock(mutex_);
  std::size_t total = 0;
  for (const auto& idle : idle_) total += idle.bytes;
  return total;
}

void FramePool::trimIdle() {
  std::lock_guard lock(mutex_);
  idle_.clear();
}

}  // namespace stridemark::video
