#pragma once
// Frames as the ffmpeg CLI decodes them, and how close two pictures are: the outside reference
// the ui suites check displayed pictures against.
#include <QImage>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <string>

#include "tests/support/process.h"

namespace stridemark::ui::test {

// Frame n of `clip` as BGRA, decoded by the ffmpeg CLI (Source: ffmpeg's own decoder and
// swscale, outside the project). Null on failure (the test's expectations then fail).
inline QImage ffmpegFrameBgra(const std::filesystem::path& clip, int n, int width, int height,
                              const std::filesystem::path& dir) {
  using testsupport::runShell;
  using testsupport::shellQuote;
  const std::filesystem::path raw = dir / ("ref" + std::to_string(n) + ".bgra");
  const auto r = runShell("ffmpeg -v error -y -i " + shellQuote(clip.string()) + " -vf " +
                          shellQuote("select=eq(n\\," + std::to_string(n) + ")") +
                          " -fps_mode passthrough -frames:v 1 -f rawvideo -pix_fmt bgra " +
                          shellQuote(raw.string()));
  const std::string bytes = r.exitCode == 0 ? testsupport::readText(raw) : std::string();
  const auto expected = static_cast<std::size_t>(width) * static_cast<std::size_t>(height) * 4;
  if (bytes.size() != expected) return {};
  QImage image(width, height, QImage::Format_RGB32);
  for (int y = 0; y < height; ++y)
    std::memcpy(image.scanLine(y), bytes.data() + static_cast<std::ptrdiff_t>(y) * width * 4,
                static_cast<std::size_t>(width) * 4);
  return image;
}

// PSNR over the R, G and B channels. Source: the usual definition, 10·log10(255² / MSE).
inline double psnr(const QImage& a, const QImage& b) {
  if (a.size() != b.size() || a.isNull()) return 0;
  double sum = 0;
  for (int y = 0; y < a.height(); ++y) {
    const auto* pa = reinterpret_cast<const QRgb*>(a.constScanLine(y));
    const auto* pb = reinterpret_cast<const QRgb*>(b.constScanLine(y));
    for (int x = 0; x < a.width(); ++x) {
      const double dr = qRed(pa[x]) - qRed(pb[x]);
      const double dg = qGreen(pa[x]) - qGreen(pb[x]);
      const double db = qBlue(pa[x]) - qBlue(pb[x]);
      sum += dr * dr + dg * dg + db * db;
    }
  }
  const double mse = sum / (3.0 * a.width() * a.height());
  return mse <= 0 ? 99.0 : 10.0 * std::log10(255.0 * 255.0 / mse);
}

}  // namespace stridemark::ui::test
