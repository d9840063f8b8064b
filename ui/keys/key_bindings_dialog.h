#pragma once
// Settings > Key bindings: one field per command of the action table, grouped by menu.
#include <QDialog>
#include <utility>
#include <vector>

#include "ui/keys/key_bindings.h"
#include "ui/widgets/tag_keys.h"

class QLabel;

namespace stridemark::ui {

class ShortcutEdit;

class KeyBindingsDialog : public QDialog {
  Q_OBJECT
 public:
  KeyBindingsDialog(const KeyBindings& bindings, const TagKeyMap& tagKeys,
                    QWidget* parent = nullptr);
  KeyBindings bindings() const { return bindings_; }
  ShortcutEdit* editFor(ActionId id) const;
  void accept() override;

 private:
  void restoreDefaults();

  KeyBindings bindings_;
  TagKeyMap tagKeys_;
  std::vector<std::pair<ActionId, ShortcutEdit*>> edits_;
  QLabel* error_;
};

}  // namespace stridemark::ui
