#pragma once
// Keyboard cheat sheet and the about box (with the clinical caution).
class QWidget;

namespace stridemark::ui {

class TagKeyMap;

void showCheatSheet(QWidget* parent, const TagKeyMap& keys);
void showAbout(QWidget* parent);
extern const char* const kClinicalCautionText;

}  // namespace stridemark::ui
