#pragma once
// Internal: body plans (where hips are, leg segment lengths, colours) and the drawing of one
// animal pose. Units: metres in the body frame (x forward, y up, origin on the ground under
// the body centre); pixels only inside View.
#include <vector>

#include <opencv2/core.hpp>

#include "model/limb_set.h"
#include "synth/look.h"
#include "synth/render.h"

namespace stridemark::synth::detail {

struct LegPlan {
  double hipX = 0, hipY = 0;  // metres
  double neutralX = 0;        // foot's mid-stance point relative to the hip, metres
  double upper = 0, lower = 0;
  int kneeSign = 1;  // +1 joint bends forward, -1 backward, 0 joint raised above (insects)
  bool far = false;  // right side: away from the camera
};

struct BodyPlan {
  model::LimbSetKind kind = model::LimbSetKind::quadruped;
  FootStyle feet = FootStyle::paw;
  double leg = 0.5;                      // scale, metres
  std::vector<LegPlan> legs;             // per limb index
  double liftHeight = 0.1;               // metres at the top of swing
  double minX = -1, maxX = 1, maxY = 1;  // extents for framing
  cv::Scalar coat, coatDark, accent;
};

// Look 0's colours are the plan's own; other looks replace the coat and accent.
BodyPlan makeBodyPlan(const model::LimbSet& limbs, double legLengthM, FootStyle feet,
                      std::uint64_t seed, const Look& look);

// Screen mapping: body-frame metres -> pixels (sub-pixel; drawn with a 4-bit shift).
struct View {
  double scale = 100;           // px per metre
  double originX = 0;           // screen x of body x = 0
  double groundY = 0;           // screen y of the near-side ground
  double farDx = 0, farDy = 0;  // pixel offset of far-side limbs (perspective)
  cv::Point2d toScreen(double x, double y, bool far) const {
    return {originX + x * scale + (far ? farDx : 0), groundY - y * scale + (far ? farDy : 0)};
  }
};

struct LegState {
  double footX = 0;  // metres, body frame
  double footY = 0;  // metres above ground
};

// Centre of the drawn foot of leg `index` (where a person would click it), in pixels.
cv::Point2d footCentre(const BodyPlan& plan, const View& view, int index, const LegState& state,
                       double bob);

// Draws the whole animal: far legs, body, head and tail, near legs, optional foot markers.
void drawAnimal(cv::Mat& image, const BodyPlan& plan, const View& view,
                const std::vector<LegState>& legs, double bob, double clock, bool markers);

}  // namespace stridemark::synth::detail
