#pragma once
// The shortcuts in force: the action table's defaults with the person's own choices from
// Settings > Key bindings on top (kept in QSettings under "keyBindings/<action name>").
#include <QKeySequence>
#include <QList>
#include <QString>
#include <QStringList>
#include <map>

#include "ui/keys/action_table.h"

namespace stridemark::ui {

class TagKeyMap;

class KeyBindings {
 public:
  KeyBindings();              // the table's defaults
  static KeyBindings load();  // QSettings, else the defaults
  void save() const;          // only what differs from the defaults is stored

  QList<QKeySequence> shortcutsFor(ActionId id) const;
  static QList<QKeySequence> defaultsFor(ActionId id);
  void set(ActionId id, QList<QKeySequence> keys);

  // True when some action uses `key` alone (no modifier): a tag key may not take it.
  bool usesPlainKey(int key) const;
  QStringList plainKeyNames() const;  // those keys as a person reads them, in table order
  // Why `id` may not take `key` (empty: it may). Plain letters and digits belong to tag keys;
  // dialog keys stay free; no two actions share a key.
  QString problemWith(ActionId id, const QKeySequence& key, const TagKeyMap& tags) const;

 private:
  std::map<ActionId, QList<QKeySequence>> keys_;
};

}  // namespace stridemark::ui
