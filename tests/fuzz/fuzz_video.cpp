// libFuzzer target: opening a video through our reader, the way `probe`, `frame` and the desk
// do: index scan (FrameIndex::build), probe (describeVideo), then decode the first frames and
// seek to the last one (FrameReader). Any input either works or throws stridemark::Error.
#include <algorithm>
#include <cstdint>
#include <memory>

extern "C" {
#include <libavutil/log.h>
}

#include "common/error.h"
#include "fuzz_support.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "video/video_info.h"

extern "C" int LLVMFuzzerInitialize(int*, char***) {
  av_log_set_level(AV_LOG_QUIET);  // libav's warnings about broken input would flood the run
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace stridemark;
  static fuzz::InputFile file(".video");
  const std::string& path = file.write(data, size);
  try {
    auto index = std::make_shared<const video::FrameIndex>(video::FrameIndex::build(path));
    const video::VideoInfo info = video::describeVideo(path, *index);
    fuzz::require(info.frameCount == index->frameCount(), "probe counts the indexed frames");
    video::FrameReader reader(path, index);
    const std::int64_t last = index->frameCount() - 1;
    try {
      reader.decodeSpan(0, std::min<std::int64_t>(last, 3),
                        [](video::DecodedFrame&& frame) { return frame.bytes() > 0; });
    } catch (const Error&) {
    }
    reader.frameAt(last);
  } catch (const Error&) {
  }
  return 0;
}
