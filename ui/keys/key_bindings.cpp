#include "ui/keys/key_bindings.h"

#include <QCoreApplication>
#include <QSettings>

#include "ui/widgets/tag_keys.h"

namespace stridemark::ui {

namespace {

QString settingsKey(const ActionSpec& spec) {
  return QStringLiteral("keyBindings/") + QString::fromLatin1(spec.name);
}

// One key with no modifier that a tag key could also be (A-Z, 0-9).
bool isTagLikeKey(const QKeySequence& seq) {
  if (seq.count() != 1) return false;
  const auto combined = seq[0];
  if (combined.keyboardModifiers() != Qt::NoModifier) return false;
  const int key = combined.key();
  return (key >= Qt::Key_A && key <= Qt::Key_Z) || (key >= Qt::Key_0 && key <= Qt::Key_9);
}

}  // namespace

KeyBindings::KeyBindings() {
  for (const auto& spec : actionTable()) keys_[spec.id] = defaultsFor(spec.id);
}

QList<QKeySequence> KeyBindings::defaultsFor(ActionId id) {
  QList<QKeySequence> keys;
  for (const auto& key : specOf(id).keys) {
    const QKeySequence seq =
        key.sequence ? QKeySequence(QString::fromLatin1(key.sequence), QKeySequence::PortableText)
                     : QKeySequence(key.standard);  // the platform's first binding
    if (!seq.isEmpty() && !keys.contains(seq)) keys << seq;
  }
  return keys;
}

KeyBindings KeyBindings::load() {
  KeyBindings bindings;
  QSettings settings;
  for (const auto& spec : actionTable()) {
    const auto stored = settings.value(settingsKey(spec));
    if (stored.isValid())
      bindings.keys_[spec.id] =
          QKeySequence::listFromString(stored.toString(), QKeySequence::PortableText);
  }
  return bindings;
}

void KeyBindings::save() const {
  QSettings settings;
  for (const auto& spec : actionTable()) {
    const auto keys = shortcutsFor(spec.id);
    if (keys == defaultsFor(spec.id))
      settings.remove(settingsKey(spec));
    else
      settings.setValue(settingsKey(spec),
                        QKeySequence::listToString(keys, QKeySequence::PortableText));
  }
}

QList<QKeySequence> KeyBindings::shortcutsFor(ActionId id) const {
  const auto it = keys_.find(id);
  return it == keys_.end() ? QList<QKeySequence>{} : it->second;
}

void KeyBindings::set(ActionId id, QList<QKeySequence> keys) {
  keys.removeAll(QKeySequence());
  keys_[id] = std::move(keys);
}

bool KeyBindings::usesPlainKey(int key) const {
  for (const auto& [id, keys] : keys_)
    for (const auto& seq : keys)
      if (seq.count() == 1 && seq[0].toCombined() == key) return true;
  return false;
}

QStringList KeyBindings::plainKeyNames() const {
  QStringList names;
  for (const auto& spec : actionTable())
    for (const auto& seq : shortcutsFor(spec.id))
      if (seq.count() == 1 && seq[0].keyboardModifiers() == Qt::NoModifier)
        names << seq.toString(QKeySequence::NativeText);
  names.removeDuplicates();
  return names;
}

QString KeyBindings::problemWith(ActionId id, const QKeySequence& key,
                                 const TagKeyMap& tags) const {
  if (key.isEmpty()) return {};
  const QString text = key.toString(QKeySequence::NativeText);
  if (isTagLikeKey(key))
    return QCoreApplication::translate("Actions",
                                       "%1: plain letters and digits are kept for tag keys.")
        .arg(text);
  if (key.count() == 1 && isDialogKey(key[0].toCombined()))
    return QCoreApplication::translate("Actions", "%1 is needed by dialogs and focus moves.")
        .arg(text);
  if (key.count() == 1 && tags.limbFor(key[0].toCombined()))
    return QCoreApplication::translate("Actions", "%1 is a tag key.").arg(text);
  for (const auto& [other, keys] : keys_)
    if (other != id && keys.contains(key))
      return QCoreApplication::translate("Actions", "%1 is already used by %2.")
          .arg(text, menuPath(other));
  return {};
}

}  // namespace stridemark::ui
