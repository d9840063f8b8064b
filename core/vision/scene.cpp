#include "common/error.h"
#include "vision/propose.h"

namespace stridemark::vision {

Scene parseScene(std::string_view text) {
  if (text == "treadmill") return Scene::treadmill;
  if (text == "overground") return Scene::overground;
  if (text == "panning") return Scene::panning;
  throw Error(ErrorCategory::format,
              "unknown scene '" + std::string(text.substr(0, 40)) +
                  "' — use treadmill (belt under a still camera), overground (still camera, "
                  "still ground) or panning (the camera follows the animal)");
}

std::string_view sceneName(Scene scene) {
  switch (scene) {
    case Scene::treadmill:
      return "treadmill";
    case Scene::overground:
      return "overground";
    case Scene::panning:
      return "panning";
  }
  return "treadmill";
}

}  // namespace stridemark::vision
