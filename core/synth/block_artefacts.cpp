#include "synth/block_artefacts.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <vector>

#include <opencv2/imgproc.hpp>

#include "common/error.h"

namespace stridemark::synth {
namespace {

constexpr int kBlock = 8;
using Table = std::array<int, kBlock * kBlock>;

// Source: ITU-T T.81 (JPEG), Annex K, Tables K.1 (luminance) and K.2 (chrominance): the
// example quantisation tables, row by row.
constexpr Table kLuma = {16, 11, 10, 16, 24,  40,  51,  61,  12, 12, 14, 19, 26,  58,  60,  55,
                         14, 13, 16, 24, 40,  57,  69,  56,  14, 17, 22, 29, 51,  87,  80,  62,
                         18, 22, 37, 56, 68,  109, 103, 77,  24, 35, 55, 64, 81,  104, 113, 92,
                         49, 64, 78, 87, 103, 121, 120, 101, 72, 92, 95, 98, 112, 100, 103, 99};
constexpr Table kChroma = {17, 18, 24, 47, 99, 99, 99, 99, 18, 21, 26, 66, 99, 99, 99, 99,
                           24, 26, 56, 99, 99, 99, 99, 99, 47, 66, 99, 99, 99, 99, 99, 99,
                           99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99,
                           99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99, 99};

// From memory: the Independent JPEG Group's quality scaling (50 = the tables as printed).
cv::Mat scaledTable(const Table& base, int quality) {
  quality = std::clamp(quality, 1, 100);
  const int scale = quality < 50 ? 5000 / quality : 200 - 2 * quality;
  cv::Mat table(kBlock, kBlock, CV_32F);
  for (int i = 0; i < kBlock * kBlock; ++i)
    table.at<float>(i / kBlock, i % kBlock) = static_cast<float>(
        std::clamp((base[static_cast<std::size_t>(i)] * scale + 50) / 100, 1, 255));
  return table;
}

// Quantises every 8x8 block of one 8-bit plane in place (the plane is padded to whole blocks).
void quantisePlane(cv::Mat& plane, const cv::Mat& table) {
  cv::Mat padded;
  cv::copyMakeBorder(plane, padded, 0, (kBlock - plane.rows % kBlock) % kBlock, 0,
                     (kBlock - plane.cols % kBlock) % kBlock, cv::BORDER_REPLICATE);
  cv::Mat values;
  padded.convertTo(values, CV_32F, 1.0, -128.0);
  cv::Mat coefficients(kBlock, kBlock, CV_32F);
  for (int y = 0; y < values.rows; y += kBlock) {
    for (int x = 0; x < values.cols; x += kBlock) {
      cv::Mat block = values(cv::Rect(x, y, kBlock, kBlock));
      cv::dct(block, coefficients);
      for (int i = 0; i < kBlock; ++i)
        for (int j = 0; j < kBlock; ++j) {
          const float q = table.at<float>(i, j);
          coefficients.at<float>(i, j) = std::round(coefficients.at<float>(i, j) / q) * q;
        }
      cv::idct(coefficients, block);
    }
  }
  values(cv::Rect(0, 0, plane.cols, plane.rows)).convertTo(plane, CV_8U, 1.0, 128.0);
}

}  // namespace

void applyBlockArtefacts(cv::Mat& image, int quality) {
  if (image.type() != CV_8UC3)  // the renderer's frames always are; anything else is a bug
    throw Error(ErrorCategory::format, "block artefacts need an 8-bit, 3-channel image");
  cv::Mat ycrcb;
  cv::cvtColor(image, ycrcb, cv::COLOR_BGR2YCrCb);
  std::vector<cv::Mat> planes;
  cv::split(ycrcb, planes);
  quantisePlane(planes[0], scaledTable(kLuma, quality));
  const cv::Mat chromaTable = scaledTable(kChroma, quality);
  const cv::Size half((image.cols + 1) / 2, (image.rows + 1) / 2);
  for (std::size_t c = 1; c < planes.size(); ++c) {
    cv::Mat small;
    cv::resize(planes[c], small, half, 0, 0, cv::INTER_AREA);  // 4:2:0 chroma
    quantisePlane(small, chromaTable);
    cv::resize(small, planes[c], image.size(), 0, 0, cv::INTER_LINEAR);
  }
  cv::merge(planes, ycrcb);
  cv::cvtColor(ycrcb, image, cv::COLOR_YCrCb2BGR);
}

}  // namespace stridemark::synth
