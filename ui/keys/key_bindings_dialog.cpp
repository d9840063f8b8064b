#include "ui/keys/key_bindings_dialog.h"

#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QPushButton>
#include <QScrollArea>
#include <QVBoxLayout>

#include "ui/keys/shortcut_edit.h"

namespace stridemark::ui {

KeyBindingsDialog::KeyBindingsDialog(const KeyBindings& bindings, const TagKeyMap& tagKeys,
                                     QWidget* parent)
    : QDialog(parent), bindings_(bindings), tagKeys_(tagKeys) {
  setWindowTitle(tr("Key bindings"));
  auto* form = new QFormLayout;
  for (const Menu menu : kMenus) {
    auto* title = new QLabel(QStringLiteral("<b>%1</b>").arg(withoutMnemonic(menuTitle(menu))));
    form->addRow(title);
    for (const auto& spec : actionTable()) {
      if (spec.menu != menu) continue;
      const auto keys = bindings.shortcutsFor(spec.id);
      auto* edit = new ShortcutEdit(keys.value(0));
      const QString text = withoutMnemonic(actionText(spec));
      edit->setAccessibleName(tr("Key for %1").arg(menuPath(spec.id)));
      if (keys.size() > 1)
        edit->setToolTip(tr("Also %1 while this field is unchanged")
                             .arg(keys.mid(1).value(0).toString(QKeySequence::NativeText)));
      form->addRow(text, edit);
      edits_.emplace_back(spec.id, edit);
    }
  }
  auto* page = new QWidget;
  page->setLayout(form);
  auto* scroll = new QScrollArea;
  scroll->setWidget(page);
  scroll->setWidgetResizable(true);
  error_ = new QLabel;
  error_->setWordWrap(true);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel |
                                       QDialogButtonBox::RestoreDefaults);
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  connect(buttons->button(QDialogButtonBox::RestoreDefaults), &QPushButton::clicked, this,
          &KeyBindingsDialog::restoreDefaults);
  auto* layout = new QVBoxLayout(this);
  auto* rule =
      new QLabel(tr("Click a field and press the new key; Escape cancels the dialog. "
                    "Plain letters and digits are kept for tag keys."));
  rule->setWordWrap(true);
  layout->addWidget(rule);
  layout->addWidget(scroll);
  layout->addWidget(error_);
  layout->addWidget(buttons);
  resize(520, 640);
}

ShortcutEdit* KeyBindingsDialog::editFor(ActionId id) const {
  for (const auto& [action, edit] : edits_)
    if (action == id) return edit;
  return nullptr;
}

void KeyBindingsDialog::restoreDefaults() {
  for (const auto& [id, edit] : edits_) edit->setKeySequence(KeyBindings::defaultsFor(id).value(0));
}

void KeyBindingsDialog::accept() {
  // An unchanged field keeps every key the command had (Redo has two); a changed one its new key.
  KeyBindings wanted = bindings_;
  for (const auto& [id, edit] : edits_) {
    const auto before = bindings_.shortcutsFor(id);
    const auto seq = edit->keySequence();
    const bool restored = seq == KeyBindings::defaultsFor(id).value(0);
    if (seq != before.value(0))
      wanted.set(id, restored ? KeyBindings::defaultsFor(id) : QList<QKeySequence>{seq});
  }
  for (const auto& [id, edit] : edits_) {
    for (const auto& seq : wanted.shortcutsFor(id)) {
      const QString problem = wanted.problemWith(id, seq, tagKeys_);
      if (problem.isEmpty()) continue;
      error_->setText(problem);
      edit->setFocus();
      return;
    }
  }
  bindings_ = wanted;
  QDialog::accept();
}

}  // namespace stridemark::ui
