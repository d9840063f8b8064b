// Foot seeds (issue 18 item 3): Review ▸ Place foot seeds turns the Viewer's click into "this is
// the chosen limb's foot on this frame". The limb comes from the Review toolbar or a tag key;
// each seed is one undo step and is drawn on its frame as a small labelled ring.
#include <QAction>
#include <QComboBox>
#include <QLabel>
#include <QStatusBar>
#include <QToolBar>
#include <cmath>

#include "ui/figures/figure_style.h"
#include "ui/main_window.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {

namespace {
constexpr double kSeedHitPixels = 12;  // a right click this close (video pixels) removes a seed
}  // namespace

void MainWindow::buildReviewBar() {
  addToolBarBreak();  // a row of its own: the Transport toolbar fills the first at 1280 pixels
  auto* bar = addToolBar(tr("Review"));
  bar->setObjectName(QStringLiteral("reviewBar"));
  auto* label = new QLabel(tr(" Seed limb "));
  seedLimbBox_ = new QComboBox;
  seedLimbBox_->setAccessibleName(tr("Limb to seed"));
  seedLimbBox_->setToolTip(
      tr("The limb whose foot a click in the Viewer marks (or press its "
         "tag key while placing seeds)"));
  seedLimbBox_->setFocusPolicy(Qt::ClickFocus);
  connect(seedLimbBox_, &QComboBox::currentIndexChanged, this, [this](int i) {
    if (i >= 0) seedLimb_ = i;
  });
  bar->addAction(action(ActionId::seedMode));
  bar->addWidget(label);
  bar->addWidget(seedLimbBox_);
  bar->addSeparator();
  for (const auto id : {ActionId::proposeEvents, ActionId::previousProposal, ActionId::nextProposal,
                        ActionId::acceptProposal, ActionId::rejectProposal,
                        ActionId::leastConfidentFirst, ActionId::acceptProposalsAbove})
    bar->addAction(action(id));
  // Short words on the buttons; the menu and the tool tip keep the full text.
  const std::pair<ActionId, QString> shortTexts[] = {
      {ActionId::seedMode, tr("Seeds")},
      {ActionId::proposeEvents, tr("Propose…")},
      {ActionId::previousProposal, tr("◀ Proposal")},
      {ActionId::nextProposal, tr("Proposal ▶")},
      {ActionId::acceptProposal, tr("Accept")},
      {ActionId::rejectProposal, tr("Reject")},
      {ActionId::leastConfidentFirst, tr("Least confident first")},
      {ActionId::acceptProposalsAbove, tr("Accept above…")}};
  for (const auto& [id, text] : shortTexts) {
    QAction* a = action(id);
    a->setIconText(text);
    a->setToolTip(withoutMnemonic(a->text()));
  }
  refillSeedLimbs();
  connect(viewer_, &Viewer::seedClicked, this, [this](QPointF at) { placeSeed(at); });
  connect(viewer_, &Viewer::seedRemoveClicked, this, [this](QPointF at) { removeSeedNear(at); });
}

void MainWindow::refillSeedLimbs() {
  const QSignalBlocker block(seedLimbBox_);
  seedLimbBox_->clear();
  const auto& limbs = doc_.annotation().limbs;
  for (int i = 0; i < limbs.size(); ++i)
    seedLimbBox_->addItem(QString::fromStdString(limbs.label(i)));
  seedLimb_ = std::min(seedLimb_, limbs.size() - 1);
  seedLimbBox_->setCurrentIndex(seedLimb_);
}

void MainWindow::setSeeding(bool on) {
  action(ActionId::seedMode)->setChecked(on);
}

bool MainWindow::seeding() const {
  return action(ActionId::seedMode)->isChecked();
}

void MainWindow::setSeedLimb(int limb) {
  if (limb < 0 || limb >= doc_.annotation().limbs.size()) return;
  seedLimb_ = limb;
  seedLimbBox_->setCurrentIndex(limb);
  if (seeding())
    statusBar()->showMessage(tr("Click %1's foot in the Viewer to seed it at frame %2.")
                                 .arg(QString::fromStdString(doc_.annotation().limbs.label(limb)))
                                 .arg(playhead_));
}

bool MainWindow::placeSeed(QPointF videoPixel) {
  const bool placed = doc_.setSeed({seedLimb_, playhead_, videoPixel.x(), videoPixel.y()});
  if (!placed) return false;
  const auto& limbs = doc_.annotation().limbs;
  QString message = tr("Seed of %1 at frame %2 (%3, %4).")
                        .arg(QString::fromStdString(limbs.label(seedLimb_)))
                        .arg(playhead_)
                        .arg(videoPixel.x(), 0, 'f', 0)
                        .arg(videoPixel.y(), 0, 'f', 0);
  // The next limb without a seed is chosen, so seeding four feet is four clicks.
  for (int step = 1; step < limbs.size(); ++step) {
    const int next = (seedLimb_ + step) % limbs.size();
    const auto& seeds = doc_.project().seeds;
    if (std::none_of(seeds.begin(), seeds.end(), [&](const auto& s) { return s.limb == next; })) {
      setSeedLimb(next);
      message += tr(" Next: %1.").arg(QString::fromStdString(limbs.label(next)));
      break;
    }
  }
  statusBar()->showMessage(message, 8000);
  return true;
}

bool MainWindow::removeSeedNear(QPointF videoPixel) {
  for (const auto& seed : doc_.project().seeds) {
    if (seed.frame != playhead_) continue;
    if (std::hypot(seed.x - videoPixel.x(), seed.y - videoPixel.y()) <= kSeedHitPixels)
      return doc_.removeSeed(seed.limb, seed.frame);
  }
  return false;
}

void MainWindow::showSeeds() {
  std::vector<ViewerSeed> marks;
  const auto& limbs = doc_.annotation().limbs;
  for (const auto& seed : doc_.project().seeds) {
    if (seed.limb < 0 || seed.limb >= limbs.size()) continue;
    marks.push_back({seed.frame, QPointF(seed.x, seed.y),
                     QString::fromStdString(limbs.label(seed.limb)),
                     figures::limbColour(seed.limb)});
  }
  viewer_->setSeeds(std::move(marks));
}

}  // namespace stridemark::ui
