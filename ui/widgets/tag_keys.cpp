#include "ui/widgets/tag_keys.h"

#include <QDialogButtonBox>
#include <QFormLayout>
#include <QKeySequenceEdit>
#include <QLabel>
#include <QPainter>
#include <QPushButton>
#include <QSettings>
#include <QVBoxLayout>
#include <algorithm>
#include <limits>

#include "ui/figures/figure_style.h"
#include "ui/keys/action_table.h"
#include "ui/keys/key_bindings.h"
#include "ui/keys/shortcut_edit.h"

namespace stridemark::ui {

namespace {

// Keyboard rows from top to bottom; the front pair of limbs takes the highest row used.
const std::array<QString, 4> kRows{QStringLiteral("1234567890"), QStringLiteral("QWERTYUIOP"),
                                   QStringLiteral("ASDFGHJKL"), QStringLiteral("ZXCVBNM")};

QString settingsKey(const model::LimbSet& limbs, int limb) {
  return QStringLiteral("tagKeys/%1/%2")
      .arg(QString::fromStdString(limbs.name()), QString::fromStdString(limbs.label(limb)));
}

// Row and column block of a limb: segments go down the rows, more than fit wrap into a new
// pair of columns further right; left limbs take the left column of their pair.
std::pair<int, int> slotOf(const model::LimbSet& limbs, int limb) {
  const auto& l = limbs.limb(limb);
  const int segments = std::max(1, limbs.pairs());
  // Two segments (quadruped) use the Q and A rows, one (biped) the A row, three the Q-A-Z
  // rows, four or more start on the digit row.
  const int firstRow = segments == 1 ? 2 : (segments <= 3 ? 1 : 0);
  const int rowsAvailable = 4 - firstRow;
  const int row = firstRow + l.segment % rowsAvailable;
  const int block = l.segment / rowsAvailable;
  return {row, 3 + block * 2 + (l.side == model::Side::right ? 1 : 0)};
}

}  // namespace

TagKeyMap::TagKeyMap(const model::LimbSet& limbs) : limbs_(limbs) {
  for (int i = 0; i < limbs.size(); ++i) {
    const auto [row, col] = slotOf(limbs, i);
    const QString& keys = kRows[static_cast<std::size_t>(row)];
    keys_.push_back(keys.at(std::min<int>(col, static_cast<int>(keys.size()) - 1)).unicode());
  }
}

TagKeyMap TagKeyMap::load(const model::LimbSet& limbs) {
  TagKeyMap map(limbs);
  QSettings settings;
  for (int i = 0; i < limbs.size(); ++i) {
    const int key = settings.value(settingsKey(limbs, i), 0).toInt();
    if (key != 0) map.bind(i, key);
  }
  return map;
}

void TagKeyMap::save() const {
  QSettings settings;
  for (int i = 0; i < limbs_.size(); ++i) settings.setValue(settingsKey(limbs_, i), keyFor(i));
}

bool TagKeyMap::isReserved(int key) {
  // The keys of the commands in force (see ui/keys/action_table.cpp) and of dialogs.
  return isDialogKey(key) || KeyBindings::load().usesPlainKey(key);
}

bool TagKeyMap::bind(int limb, int key) {
  if (limb < 0 || limb >= limbs_.size() || isReserved(key)) return false;
  for (int i = 0; i < limbs_.size(); ++i)
    if (i != limb && keyFor(i) == key) return false;
  keys_[static_cast<std::size_t>(limb)] = key;
  return true;
}

std::optional<int> TagKeyMap::limbFor(int key) const {
  const auto it = std::find(keys_.begin(), keys_.end(), key);
  if (it == keys_.end()) return std::nullopt;
  return static_cast<int>(it - keys_.begin());
}

QString TagKeyMap::keyText(int key) {
  return QKeySequence(key).toString(QKeySequence::NativeText);
}

// --- legend ---

TagKeyLegend::TagKeyLegend(QWidget* parent) : QWidget(parent) {
  setAccessibleName(tr("Tag keys legend"));
  setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Fixed);
}

void TagKeyLegend::setKeys(const TagKeyMap& keys) {
  keys_ = keys;
  next_.assign(static_cast<std::size_t>(keys.limbs().size()), Next{});
  describe();
  updateGeometry();
  update();
}

void TagKeyLegend::setFrame(const model::Annotation& annotation, std::int64_t frame) {
  std::vector<Next> next(next_.size());
  for (std::size_t i = 0; i < next.size(); ++i) {
    const int limb = static_cast<int>(i);
    if (limb >= annotation.limbs.size()) break;
    const auto tagged = [&](model::EventKind kind) {
      return std::binary_search(annotation.events.begin(), annotation.events.end(),
                                model::Event{frame, limb, kind});
    };
    // As ProjectDocument::tag decides: one event per limb and frame.
    if (tagged(model::EventKind::touchdown) || tagged(model::EventKind::liftoff))
      next[i].kind = NextTag::taggedHere;
    else
      next[i].kind = annotation.inStance(limb, frame) ? NextTag::liftoff : NextTag::touchdown;
    const auto firstEvent = std::lower_bound(
        annotation.events.begin(), annotation.events.end(),
        model::Event{std::numeric_limits<std::int64_t>::min(), limb, model::EventKind::touchdown});
    next[i].first = firstEvent == annotation.events.end() || firstEvent->limb != limb ||
                    firstEvent->frame >= frame;
  }
  if (next == next_ && frame == frame_) return;
  next_ = std::move(next);
  frame_ = frame;
  describe();
  update();
}

QString TagKeyLegend::nextText(NextTag next) {
  switch (next) {
    case NextTag::touchdown:
      return tr("↓ touchdown");
    case NextTag::liftoff:
      return tr("↑ lift-off");
    case NextTag::taggedHere:
      return tr("tagged here");
  }
  return {};
}

// The cap's second line: what the key records, and the way to the other kind at a first tag.
void TagKeyLegend::setSeeding(bool on) {
  seeding_ = on;
  update();
}

QString TagKeyLegend::capNote(int limb) const {
  if (seeding_) return tr("seed this foot");
  QString note = nextText(next(limb));
  if (firstTag(limb) && next(limb) == NextTag::touchdown) note += tr(" · Shift: lift-off");
  return note;
}

void TagKeyLegend::describe() {
  QStringList desc;
  for (int i = 0; i < keys_.limbs().size(); ++i)
    desc << tr("%1: %2 records %3")
                .arg(QString::fromStdString(keys_.limbs().label(i)),
                     TagKeyMap::keyText(keys_.keyFor(i)), capNote(i));
  setAccessibleDescription(tr("At frame %1: %2").arg(frame_).arg(desc.join(QStringLiteral(", "))));
  QStringList uses;
  for (const auto& use : tagKeyUses())
    uses << modifierText(use.modifiers) + tr("key: %1").arg(tagKeyEffect(use));
  setToolTip(tr("Each cap says what its key records at the playhead.\n%1")
                 .arg(uses.join(QLatin1Char('\n'))));
}

QSize TagKeyLegend::capSize() const {
  QFont bold = font();
  bold.setBold(true);
  const QFontMetrics plain(font()), strong(bold);
  int width = 0;
  for (int i = 0; i < keys_.limbs().size(); ++i) {
    const int top = strong.horizontalAdvance(TagKeyMap::keyText(keys_.keyFor(i))) +
                    plain.horizontalAdvance(QString::fromStdString(keys_.limbs().label(i))) +
                    plain.averageCharWidth() * 3;
    const int bottom =
        plain.horizontalAdvance(nextText(NextTag::touchdown) + tr(" · Shift: lift-off"));
    width = std::max({width, top, bottom});
  }
  return {width + 12, 2 * plain.height() + 8};
}

QSize TagKeyLegend::sizeHint() const {
  const auto& limbs = keys_.limbs();
  int minRow = 4, maxRow = 0, maxCol = 3;
  for (int i = 0; i < limbs.size(); ++i) {
    const auto [row, col] = slotOf(limbs, i);
    minRow = std::min(minRow, row);
    maxRow = std::max(maxRow, row);
    maxCol = std::max(maxCol, col);
  }
  const QSize cap = capSize();
  const int header = fontMetrics().height() + 6;
  return {16 + (maxCol - 2) * (cap.width() + 6),
          header + (maxRow - minRow + 1) * (cap.height() + 6) + 6};
}

void TagKeyLegend::paintEvent(QPaintEvent*) {
  QPainter p(this);
  p.setRenderHint(QPainter::Antialiasing);
  const auto& limbs = keys_.limbs();
  const QSize capPixels = capSize();
  const QFontMetrics metrics(font());
  const int header = metrics.height() + 6;
  p.setPen(palette().color(QPalette::WindowText));
  p.drawText(QRect(8, 2, width() - 16, metrics.height()), Qt::AlignLeft | Qt::AlignVCenter,
             seeding_ ? tr("Placing seeds: a press chooses")
                      : tr("A press at frame %1 records:").arg(frame_));
  int minRow = 4;
  for (int i = 0; i < limbs.size(); ++i) minRow = std::min(minRow, slotOf(limbs, i).first);
  for (int i = 0; i < limbs.size(); ++i) {
    const auto [row, col] = slotOf(limbs, i);
    const QRectF cap(8 + (col - 3) * (capPixels.width() + 6),
                     header + (row - minRow) * (capPixels.height() + 6), capPixels.width(),
                     capPixels.height());
    const QColor colour = figures::limbColour(i);
    p.setPen(QPen(colour.darker(120), 1.5));
    QColor fill = colour;
    fill.setAlpha(70);
    p.setBrush(fill);
    p.drawRoundedRect(cap, 5, 5);
    p.setPen(palette().color(QPalette::WindowText));
    const QRectF top = cap.adjusted(6, 3, -6, -cap.height() / 2);
    const QRectF bottom = cap.adjusted(6, cap.height() / 2, -6, -3);
    QFont f = font();
    f.setBold(true);
    p.setFont(f);
    p.drawText(top, Qt::AlignVCenter | Qt::AlignLeft, TagKeyMap::keyText(keys_.keyFor(i)));
    f.setBold(false);
    p.setFont(f);
    p.drawText(top, Qt::AlignVCenter | Qt::AlignRight, QString::fromStdString(limbs.label(i)));
    if (!seeding_ && next(i) == NextTag::taggedHere)
      p.setPen(palette().color(QPalette::PlaceholderText));
    p.drawText(bottom, Qt::AlignVCenter | Qt::AlignLeft, capNote(i));
  }
}

// --- rebinding dialog ---

TagKeyDialog::TagKeyDialog(const TagKeyMap& keys, QWidget* parent) : QDialog(parent), keys_(keys) {
  setWindowTitle(tr("Tag keys"));
  auto* form = new QFormLayout;
  for (int i = 0; i < keys.limbs().size(); ++i) {
    auto* edit = new ShortcutEdit(QKeySequence(keys.keyFor(i)));
    const auto label = QString::fromStdString(keys.limbs().label(i));
    edit->setAccessibleName(tr("Tag key for %1").arg(label));
    form->addRow(label, edit);
    edits_.push_back(edit);
  }
  error_ = new QLabel;
  error_->setWordWrap(true);
  auto* buttons = keyDialogButtons(this, [this] {
    const TagKeyMap defaults(keys_.limbs());
    for (std::size_t i = 0; i < edits_.size(); ++i)
      edits_[i]->setKeySequence(QKeySequence(defaults.keyFor(static_cast<int>(i))));
  });
  auto* layout = new QVBoxLayout(this);
  auto* rule =
      new QLabel(tr("One plain key per limb (no modifiers). These keys belong to "
                    "commands (%1): %2.")
                     .arg(menuPath(ActionId::keyBindings),
                          KeyBindings::load().plainKeyNames().join(QStringLiteral("  ·  "))));
  rule->setWordWrap(true);
  layout->addWidget(rule);
  layout->addLayout(form);
  layout->addWidget(error_);
  layout->addWidget(buttons);
}

void TagKeyDialog::accept() {
  std::vector<int> wanted;
  for (auto* edit : edits_) {
    const auto seq = edit->keySequence();
    wanted.push_back(seq.isEmpty() ? 0 : seq[0].toCombined());
  }
  for (std::size_t i = 0; i < wanted.size(); ++i) {
    const int key = wanted[i];
    const bool plain = (key & Qt::KeyboardModifierMask) == 0;
    const bool duplicate = std::count(wanted.begin(), wanted.end(), key) > 1;
    if (!plain || duplicate || TagKeyMap::isReserved(key)) {
      error_->setText(tr("The key for %1 is reserved, has modifiers or is used twice.")
                          .arg(QString::fromStdString(keys_.limbs().label(static_cast<int>(i)))));
      edits_[i]->setFocus();
      return;
    }
  }
  // All distinct and allowed. Park every limb on a unique placeholder first so that swapping
  // two keys does not collide halfway.
  TagKeyMap result(keys_.limbs());
  for (std::size_t i = 0; i < wanted.size(); ++i)
    result.bind(static_cast<int>(i), 0x01000100 + static_cast<int>(i));
  for (std::size_t i = 0; i < wanted.size(); ++i) result.bind(static_cast<int>(i), wanted[i]);
  keys_ = result;
  QDialog::accept();
}

}  // namespace stridemark::ui
