#pragma once
// Damaged frames: frames the decoder cannot produce (it rejects the data or outputs no picture)
// or produces with errors it reports (concealed). The index is a demux-only scan and sees only
// what the container flags, so finding them takes one full decode of the clip (issue 17, 11).
#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "video/frame_index.h"

namespace stridemark::video {

struct DamagedFrame {
  std::int64_t frame = 0;
  std::string reason;  // e.g. "the decoder rejected its data (Invalid data found ...)"
};

// Decodes every packet once, in file order, and lists the damaged frames in frame order
// (frames the container flags corrupt included). `progress(fraction)` may return false to
// cancel (throws Error(io)). Frames that merely reference a damaged frame decode without an
// error report and are not listed: the decoder conceals those silently.
std::vector<DamagedFrame> findDamagedFrames(const std::string& path, const FrameIndex& index,
                                            const std::function<bool(double)>& progress = {});

}  // namespace stridemark::video
