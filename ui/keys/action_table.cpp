#include "ui/keys/action_table.h"

#include <QCoreApplication>
#include <algorithm>
#include <stdexcept>
#include <string>

namespace stridemark::ui {

namespace {

DefaultKey standard(QKeySequence::StandardKey key) {
  return {key, nullptr};
}
DefaultKey fixed(const char* sequence) {
  return {QKeySequence::UnknownKey, sequence};
}

QString translated(const char* text) {
  return QCoreApplication::translate("Actions", text);
}

std::vector<ActionSpec> fileActions() {
  return {
      {ActionId::open,
       Menu::file,
       "file/open",
       QT_TRANSLATE_NOOP("Actions", "&Open video or project…"),
       {standard(QKeySequence::Open)}},
      {ActionId::save,
       Menu::file,
       "file/save",
       QT_TRANSLATE_NOOP("Actions", "&Save"),
       {standard(QKeySequence::Save)}},
      {ActionId::saveAs,
       Menu::file,
       "file/saveAs",
       QT_TRANSLATE_NOOP("Actions", "Save &as…"),
       {standard(QKeySequence::SaveAs)}},
      {ActionId::exportProject,
       Menu::file,
       "file/export",
       QT_TRANSLATE_NOOP("Actions", "&Export…"),
       {fixed("Ctrl+E")},
       QT_TRANSLATE_NOOP("Actions", "report, tables, figures and clips")},
      {ActionId::exportFigures,
       Menu::file,
       "file/exportFigures",
       QT_TRANSLATE_NOOP("Actions", "Export &figures…"),
       {fixed("Ctrl+Shift+E")},
       QT_TRANSLATE_NOOP("Actions", "the figures as SVG, PNG and PDF")},
      {ActionId::quit,
       Menu::file,
       "file/quit",
       QT_TRANSLATE_NOOP("Actions", "&Quit"),
       {standard(QKeySequence::Quit)},
       nullptr,
       kSeparatorBefore},
  };
}

std::vector<ActionSpec> editActions() {
  return {
      {ActionId::undo,
       Menu::edit,
       "edit/undo",
       QT_TRANSLATE_NOOP("Actions", "&Undo"),
       {standard(QKeySequence::Undo)}},
      {ActionId::redo,
       Menu::edit,
       "edit/redo",
       QT_TRANSLATE_NOOP("Actions", "&Redo"),
       {standard(QKeySequence::Redo), fixed("Ctrl+Y")}},
      {ActionId::nudgeEarlier,
       Menu::edit,
       "edit/nudgeEarlier",
       QT_TRANSLATE_NOOP("Actions", "Nudge selected events earlier"),
       {fixed(",")},
       QT_TRANSLATE_NOOP("Actions", "by one frame"),
       kSeparatorBefore},
      {ActionId::nudgeLater,
       Menu::edit,
       "edit/nudgeLater",
       QT_TRANSLATE_NOOP("Actions", "Nudge selected events later"),
       {fixed(".")},
       QT_TRANSLATE_NOOP("Actions", "by one frame")},
      {ActionId::deleteSelection,
       Menu::edit,
       "edit/delete",
       QT_TRANSLATE_NOOP("Actions", "&Delete selected events or hidden span"),
       {standard(QKeySequence::Delete)},
       QT_TRANSLATE_NOOP("Actions",
                         "a hidden span is selected by clicking inside it in the lanes")},
      {ActionId::toggleHiddenSpan,
       Menu::edit,
       "edit/toggleHiddenSpan",
       QT_TRANSLATE_NOOP("Actions", "Start / end &hidden span of selected limb"),
       {fixed("Ctrl+H")},
       QT_TRANSLATE_NOOP("Actions", "press at the span's first frame, then at its last")},
      {ActionId::markHiddenSpans,
       Menu::edit,
       "edit/markHiddenSpans",
       QT_TRANSLATE_NOOP("Actions", "Mark hidden span for &limbs…"),
       {fixed("Ctrl+Shift+H")},
       QT_TRANSLATE_NOOP("Actions", "for chosen limbs or all; also ends a span already started")},
      {ActionId::trialCard,
       Menu::edit,
       "edit/trialCard",
       QT_TRANSLATE_NOOP("Actions", "&Trial card…"),
       {fixed("Ctrl+T")},
       nullptr,
       kSeparatorBefore},
  };
}

std::vector<ActionSpec> transportActions() {
  return {
      {ActionId::firstFrame,
       Menu::transport,
       "transport/firstFrame",
       QT_TRANSLATE_NOOP("Actions", "First frame"),
       {fixed("Home")},
       nullptr,
       kOnToolbar},
      {ActionId::backBigStep,
       Menu::transport,
       "transport/backBigStep",
       QT_TRANSLATE_NOOP("Actions", "Back N frames"),
       {fixed("Shift+Left")},
       nullptr,
       kOnToolbar,
       nullptr,
       true,
       ActionId::setBigStep},
      {ActionId::stepBack,
       Menu::transport,
       "transport/stepBack",
       QT_TRANSLATE_NOOP("Actions", "Step back"),
       {fixed("Left")},
       nullptr,
       kOnToolbar},
      {ActionId::playBackwards,
       Menu::transport,
       "transport/playBackwards",
       QT_TRANSLATE_NOOP("Actions", "Play backwards"),
       {fixed("Shift+Space")},
       QT_TRANSLATE_NOOP("Actions", "press again to pause"),
       kOnToolbar},
      {ActionId::playPause,
       Menu::transport,
       "transport/playPause",
       QT_TRANSLATE_NOOP("Actions", "Play / pause"),
       {fixed("Space")},
       nullptr,
       kOnToolbar},
      {ActionId::stepForward,
       Menu::transport,
       "transport/stepForward",
       QT_TRANSLATE_NOOP("Actions", "Step forward"),
       {fixed("Right")},
       nullptr,
       kOnToolbar},
      {ActionId::forwardBigStep,
       Menu::transport,
       "transport/forwardBigStep",
       QT_TRANSLATE_NOOP("Actions", "Forward N frames"),
       {fixed("Shift+Right")},
       nullptr,
       kOnToolbar,
       nullptr,
       true,
       ActionId::setBigStep},
      {ActionId::lastFrame,
       Menu::transport,
       "transport/lastFrame",
       QT_TRANSLATE_NOOP("Actions", "Last frame"),
       {fixed("End")},
       nullptr,
       kOnToolbar},
      {ActionId::slower,
       Menu::transport,
       "transport/slower",
       QT_TRANSLATE_NOOP("Actions", "Slower"),
       {fixed("-")},
       QT_TRANSLATE_NOOP("Actions", "playback from 1/32 to 1× of the capture rate"),
       kSeparatorBefore},
      {ActionId::faster,
       Menu::transport,
       "transport/faster",
       QT_TRANSLATE_NOOP("Actions", "Faster"),
       {fixed("+")},
       QT_TRANSLATE_NOOP("Actions", "playback from 1/32 to 1× of the capture rate")},
      {ActionId::previousEvent,
       Menu::transport,
       "transport/previousEvent",
       QT_TRANSLATE_NOOP("Actions", "Previous event of selected limb"),
       {fixed("[")}},
      {ActionId::nextEvent,
       Menu::transport,
       "transport/nextEvent",
       QT_TRANSLATE_NOOP("Actions", "Next event of selected limb"),
       {fixed("]")}},
      {ActionId::goTo,
       Menu::transport,
       "transport/goTo",
       QT_TRANSLATE_NOOP("Actions", "&Go to frame or time…"),
       {fixed("Ctrl+G")},
       QT_TRANSLATE_NOOP("Actions", "a frame number, or seconds like 1.25s")},
      {ActionId::setBigStep,
       Menu::transport,
       "transport/setBigStep",
       QT_TRANSLATE_NOOP("Actions", "Set big step (N)…"),
       {}},
      {ActionId::autoAdvance,
       Menu::transport,
       "transport/autoAdvance",
       QT_TRANSLATE_NOOP("Actions", "&Auto-advance after tag"),
       {fixed("Ctrl+Shift+A")},
       QT_TRANSLATE_NOOP("Actions", "on or off"),
       kCheckable},
  };
}

// Seeds, proposing and reviewing proposals (issue 18 item 3). Keys: Page Up / Page Down walk
// the proposals, ; and ' (side by side under the right hand) accept and reject, Ctrl+, and
// Ctrl+. nudge the proposal like , and . nudge selected tags.
std::vector<ActionSpec> reviewActions() {
  return {
      {ActionId::seedMode,
       Menu::review,
       "review/seedMode",
       QT_TRANSLATE_NOOP("Actions", "Place foot &seeds"),
       {fixed("Ctrl+Shift+F")},
       QT_TRANSLATE_NOOP("Actions",
                         "on or off; a tag key picks the limb, a click on its foot in the Viewer "
                         "places the seed"),
       kCheckable},
      {ActionId::proposeEvents,
       Menu::review,
       "review/propose",
       QT_TRANSLATE_NOOP("Actions", "&Propose events…"),
       {fixed("Ctrl+Shift+P")},
       QT_TRANSLATE_NOOP("Actions", "from the seeds, for the whole clip or a range")},
      {ActionId::cancelProposing,
       Menu::review,
       "review/cancelPropose",
       QT_TRANSLATE_NOOP("Actions", "Cancel proposing"),
       {}},
      {ActionId::previousProposal,
       Menu::review,
       "review/previous",
       QT_TRANSLATE_NOOP("Actions", "Previous proposal"),
       {fixed("PgUp")},
       nullptr,
       kSeparatorBefore},
      {ActionId::nextProposal,
       Menu::review,
       "review/next",
       QT_TRANSLATE_NOOP("Actions", "Next proposal"),
       {fixed("PgDown")}},
      {ActionId::leastConfidentFirst,
       Menu::review,
       "review/leastConfidentFirst",
       QT_TRANSLATE_NOOP("Actions", "&Least confident first"),
       {fixed("Ctrl+Shift+L")},
       QT_TRANSLATE_NOOP("Actions", "review order: on, by confidence; off, by frame"),
       kCheckable},
      {ActionId::acceptProposal,
       Menu::review,
       "review/accept",
       QT_TRANSLATE_NOOP("Actions", "&Accept proposal"),
       {fixed(";")},
       QT_TRANSLATE_NOOP("Actions", "it becomes a tag; the next proposal follows"),
       kSeparatorBefore},
      {ActionId::rejectProposal,
       Menu::review,
       "review/reject",
       QT_TRANSLATE_NOOP("Actions", "&Reject proposal"),
       {fixed("'")},
       QT_TRANSLATE_NOOP("Actions", "the next proposal follows")},
      {ActionId::nudgeProposalEarlier,
       Menu::review,
       "review/nudgeEarlier",
       QT_TRANSLATE_NOOP("Actions", "Nudge proposal earlier"),
       {fixed("Ctrl+,")},
       QT_TRANSLATE_NOOP("Actions", "by one frame")},
      {ActionId::nudgeProposalLater,
       Menu::review,
       "review/nudgeLater",
       QT_TRANSLATE_NOOP("Actions", "Nudge proposal later"),
       {fixed("Ctrl+.")},
       QT_TRANSLATE_NOOP("Actions", "by one frame")},
      {ActionId::acceptProposalsAbove,
       Menu::review,
       "review/acceptAbove",
       QT_TRANSLATE_NOOP("Actions", "Accept all a&bove a confidence…"),
       {fixed("Ctrl+;")},
       QT_TRANSLATE_NOOP("Actions", "shows how many would be accepted first")},
      {ActionId::acceptProposedHidden,
       Menu::review,
       "review/acceptHidden",
       QT_TRANSLATE_NOOP("Actions", "Accept proposed &hidden spans"),
       {},
       QT_TRANSLATE_NOOP("Actions", "where a foot could not be followed (dotted boxes)")},
  };
}

std::vector<ActionSpec> viewActions() {
  return {
      {ActionId::zoomLanesIn,
       Menu::view,
       "view/zoomLanesIn",
       QT_TRANSLATE_NOOP("Actions", "Zoom lanes in"),
       {fixed("Ctrl+=")}},
      {ActionId::zoomLanesOut,
       Menu::view,
       "view/zoomLanesOut",
       QT_TRANSLATE_NOOP("Actions", "Zoom lanes out"),
       {fixed("Ctrl+-")}},
      {ActionId::fitVideo,
       Menu::view,
       "view/fitVideo",
       QT_TRANSLATE_NOOP("Actions", "Fit video"),
       {fixed("Ctrl+0")}},
      {ActionId::stepOnProxy,
       Menu::view,
       "view/stepOnProxy",
       QT_TRANSLATE_NOOP("Actions", "Step on intra &proxy"),
       {},
       nullptr,
       kCheckable,
       QT_TRANSLATE_NOOP("Actions",
                         "Show frames from the all-intra stepping proxy of a long-GOP "
                         "clip (export always reads the source)")},
      {ActionId::cancelProxy,
       Menu::view,
       "view/cancelProxy",
       QT_TRANSLATE_NOOP("Actions", "Cancel stepping proxy build"),
       {}},
      {ActionId::darkPalette,
       Menu::view,
       "view/darkPalette",
       QT_TRANSLATE_NOOP("Actions", "&Dark palette"),
       {},
       nullptr,
       kCheckable},
  };
}

std::vector<ActionSpec> settingsAndHelpActions() {
  return {
      {ActionId::tagKeys,
       Menu::settings,
       "settings/tagKeys",
       QT_TRANSLATE_NOOP("Actions", "&Tag keys…"),
       {}},
      {ActionId::keyBindings,
       Menu::settings,
       "settings/keyBindings",
       QT_TRANSLATE_NOOP("Actions", "&Key bindings…"),
       {}},
      {ActionId::frameCache,
       Menu::settings,
       "settings/frameCache",
       QT_TRANSLATE_NOOP("Actions", "Frame &cache…"),
       {}},
      {ActionId::cheatSheet,
       Menu::help,
       "help/cheatSheet",
       QT_TRANSLATE_NOOP("Actions", "&Keyboard cheat sheet"),
       {fixed("F1")}},
      {ActionId::about,
       Menu::help,
       "help/about",
       QT_TRANSLATE_NOOP("Actions", "&About Stridemark"),
       {}},
  };
}

}  // namespace

const std::vector<ActionSpec>& actionTable() {
  static const std::vector<ActionSpec> table = [] {
    std::vector<ActionSpec> all;
    for (auto part : {fileActions(), editActions(), transportActions(), reviewActions(),
                      viewActions(), settingsAndHelpActions()})
      all.insert(all.end(), part.begin(), part.end());
    return all;
  }();
  return table;
}

const std::vector<GestureSpec>& gestureTable() {
  static const std::vector<GestureSpec> table{
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Click or drag on a lane"),
       QT_TRANSLATE_NOOP("Actions", "seek to that frame and select the lane's limb")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Click a limb label"),
       QT_TRANSLATE_NOOP("Actions", "select that limb")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Click an event tick"),
       QT_TRANSLATE_NOOP("Actions", "select the event")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Ctrl+click an event tick"),
       QT_TRANSLATE_NOOP("Actions", "add it to the selection, or take it out")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Drag an event tick"),
       QT_TRANSLATE_NOOP("Actions", "move the selected events (one undo step)")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Click inside a hidden span"),
       QT_TRANSLATE_NOOP("Actions", "select the span (Delete removes it) and seek")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Wheel"),
       QT_TRANSLATE_NOOP("Actions", "scroll in time")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Ctrl+wheel"),
       QT_TRANSLATE_NOOP("Actions", "zoom in time around the pointer")},
      {Place::lanes, QT_TRANSLATE_NOOP("Actions", "Click a proposal's hollow tick"),
       QT_TRANSLATE_NOOP("Actions", "make it the proposal under review")},
      {Place::viewer, QT_TRANSLATE_NOOP("Actions", "Click while placing foot seeds"),
       QT_TRANSLATE_NOOP("Actions",
                         "place the chosen limb's seed on the foot, at the playhead's frame")},
      {Place::viewer, QT_TRANSLATE_NOOP("Actions", "Right-click a seed while placing seeds"),
       QT_TRANSLATE_NOOP("Actions", "remove that seed")},
      {Place::viewer, QT_TRANSLATE_NOOP("Actions", "Wheel"),
       QT_TRANSLATE_NOOP("Actions", "zoom the picture around the pointer (up to 32×)")},
      {Place::viewer, QT_TRANSLATE_NOOP("Actions", "Drag"),
       QT_TRANSLATE_NOOP("Actions", "pan the zoomed picture")},
      {Place::viewer, QT_TRANSLATE_NOOP("Actions", "Double-click"),
       QT_TRANSLATE_NOOP("Actions", "fit the picture to the Viewer")},
      {Place::window, QT_TRANSLATE_NOOP("Actions", "Right-click a Checks entry"),
       QT_TRANSLATE_NOOP("Actions",
                         "on \"tags look swapped\": swap this limb's tags from there (one undo "
                         "step)")},
      {Place::window, QT_TRANSLATE_NOOP("Actions", "Drop a video or project file"),
       QT_TRANSLATE_NOOP("Actions", "open it")},
  };
  return table;
}

const std::vector<TagKeyUse>& tagKeyUses() {
  static const std::vector<TagKeyUse> uses{
      {Qt::NoModifier, QT_TRANSLATE_NOOP("Actions",
                                         "tag the limb at the playhead: touchdown "
                                         "when it is in swing, lift-off in stance")},
      {Qt::ShiftModifier, QT_TRANSLATE_NOOP("Actions",
                                            "tag the other kind (e.g. a first "
                                            "lift-off when the clip starts in stance)")},
  };
  return uses;
}

const ActionSpec& specOf(ActionId id) {
  const auto& table = actionTable();
  const auto it =
      std::find_if(table.begin(), table.end(), [id](const ActionSpec& s) { return s.id == id; });
  if (it == table.end())
    throw std::logic_error("action " + std::to_string(static_cast<int>(id)) +
                           " is missing from the table");
  return *it;
}

QString menuTitle(Menu menu) {
  switch (menu) {
    case Menu::file:
      return QCoreApplication::translate("Actions", "&File");
    case Menu::edit:
      return QCoreApplication::translate("Actions", "&Edit");
    case Menu::transport:
      return QCoreApplication::translate("Actions", "&Transport");
    case Menu::review:
      return QCoreApplication::translate("Actions", "&Review");
    case Menu::view:
      return QCoreApplication::translate("Actions", "&View");
    case Menu::settings:
      return QCoreApplication::translate("Actions", "&Settings");
    case Menu::help:
      return QCoreApplication::translate("Actions", "&Help");
  }
  return {};
}

QString placeName(Place place) {
  switch (place) {
    case Place::lanes:
      return QCoreApplication::translate("Actions", "Footfall lanes");
    case Place::viewer:
      return QCoreApplication::translate("Actions", "Viewer");
    case Place::window:
      return QCoreApplication::translate("Actions", "Window");
  }
  return {};
}

QString actionText(const ActionSpec& spec) {
  return translated(spec.text);
}
QString gestureText(const GestureSpec& gesture) {
  return translated(gesture.gesture);
}
QString gestureEffect(const GestureSpec& gesture) {
  return translated(gesture.does);
}
QString tagKeyEffect(const TagKeyUse& use) {
  return translated(use.does);
}

QString modifierText(Qt::KeyboardModifiers modifiers) {
  if (modifiers == Qt::NoModifier) return {};
  // The text of modifiers+A without the A.
  return QKeySequence(QKeyCombination(modifiers, Qt::Key_A))
      .toString(QKeySequence::NativeText)
      .chopped(1);
}

QString withoutMnemonic(QString text) {
  return text.remove(QLatin1Char('&'));
}

QString menuPath(ActionId id) {
  const auto& spec = specOf(id);
  return withoutMnemonic(menuTitle(spec.menu)) + QStringLiteral(" %1 ").arg(QChar(kMenuArrow)) +
         withoutMnemonic(actionText(spec));
}

bool isDialogKey(int key) {
  switch (key) {
    case Qt::Key_Escape:
    case Qt::Key_Tab:
    case Qt::Key_Backtab:
    case Qt::Key_Return:
    case Qt::Key_Enter:
    case Qt::Key_Up:
    case Qt::Key_Down:
    case Qt::Key_Backspace:
      return true;
    default:
      return key == 0 || key == Qt::Key_unknown;
  }
}

}  // namespace stridemark::ui
