#pragma once
// The 8x8 block artefacts of a lossy camera or recorder, without encoding a file: each block's
// DCT coefficients are quantised as a baseline JPEG encoder at `quality` (1-100) would, with the
// chroma at half resolution. Done in-house so the command-line tool does not load an image-codec
// library (and the dozens it pulls in) at every start.
#include <opencv2/core.hpp>

namespace stridemark::synth {

// `image` is 8-bit BGR; it is replaced by its quantised version. `quality` 1-100.
void applyBlockArtefacts(cv::Mat& image, int quality);

}  // namespace stridemark::synth
