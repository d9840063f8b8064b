#pragma once
// The about box, with the caution (core/common/caution.h). The cheat sheet lives in ui/keys.
class QWidget;

namespace stridemark::ui {

void showAbout(QWidget* parent);

}  // namespace stridemark::ui
