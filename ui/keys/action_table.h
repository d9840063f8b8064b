#pragma once
// The one declared list of what the desk does on a key or a click: every menu command with its
// default shortcut, the uses of a tag key, and the mouse gestures of the Footfall lanes and the
// Viewer. The menus, Settings > Key bindings, the reserved keys of the Tag keys dialog and the
// Help cheat sheet are all made from these tables; add a command here, not in a menu by hand.
#include <QKeySequence>
#include <QString>
#include <vector>

namespace stridemark::ui {

// Menus in menu-bar order.
enum class Menu { file, edit, transport, review, view, settings, help };
inline constexpr Menu kMenus[] = {Menu::file, Menu::edit,     Menu::transport, Menu::review,
                                  Menu::view, Menu::settings, Menu::help};

enum class ActionId {
  open,
  save,
  saveAs,
  exportProject,
  exportFigures,
  quit,
  undo,
  redo,
  nudgeEarlier,
  nudgeLater,
  deleteSelection,
  toggleHiddenSpan,
  markHiddenSpans,
  trialCard,
  firstFrame,
  backBigStep,
  stepBack,
  playBackwards,
  playPause,
  stepForward,
  forwardBigStep,
  lastFrame,
  slower,
  faster,
  previousEvent,
  nextEvent,
  goTo,
  setBigStep,
  autoAdvance,
  seedMode,
  proposeEvents,
  cancelProposing,
  previousProposal,
  nextProposal,
  leastConfidentFirst,
  acceptProposal,
  rejectProposal,
  nudgeProposalEarlier,
  nudgeProposalLater,
  acceptProposalsAbove,
  acceptProposedHidden,
  zoomLanesIn,
  zoomLanesOut,
  fitVideo,
  stepOnProxy,
  cancelProxy,
  darkPalette,
  tagKeys,
  keyBindings,
  frameCache,
  cheatSheet,
  about,
};

// A default shortcut: the platform's standard key (Open, Save, ...) or a fixed sequence.
struct DefaultKey {
  QKeySequence::StandardKey standard = QKeySequence::UnknownKey;
  const char* sequence = nullptr;  // PortableText, e.g. "Ctrl+G"
};

enum ActionTrait : unsigned {
  kPlain = 0,
  kSeparatorBefore = 1,  // a separator above it in its menu
  kOnToolbar = 2,        // also on the Transport toolbar
  kCheckable = 4,
};

struct ActionSpec {
  ActionId id;
  Menu menu;
  const char* name;  // stable name for settings ("transport/playPause")
  const char* text;  // menu text with its & mnemonic (translated in the "Actions" context)
  std::vector<DefaultKey> keys;
  const char* note = nullptr;  // what the cheat sheet adds to the menu text
  unsigned traits = kPlain;
  const char* tip = nullptr;  // tool tip
  bool hasSeeAlso = false;    // the cheat sheet points to `seeAlso` for a setting of this one
  ActionId seeAlso = ActionId::open;
};

// Where a mouse gesture works.
enum class Place { lanes, viewer, window };

struct GestureSpec {
  Place place;
  const char* gesture;  // "Ctrl+wheel"
  const char* does;     // "zoom in time around the pointer"
};

// What a tag key does, plain and with modifiers.
struct TagKeyUse {
  Qt::KeyboardModifiers modifiers;
  const char* does;
};

const std::vector<ActionSpec>& actionTable();
const std::vector<GestureSpec>& gestureTable();
const std::vector<TagKeyUse>& tagKeyUses();

const ActionSpec& specOf(ActionId id);
QString menuTitle(Menu menu);                // with its & mnemonic
QString actionText(const ActionSpec& spec);  // translated, with its & mnemonic
QString placeName(Place place);
QString gestureText(const GestureSpec& gesture);
QString gestureEffect(const GestureSpec& gesture);
QString tagKeyEffect(const TagKeyUse& use);
// "Shift+" for keys pressed with Shift, written the way key sequences are shown.
QString modifierText(Qt::KeyboardModifiers modifiers);
// "Transport ▸ Go to frame or time…": where a person finds the command, mnemonics removed.
QString menuPath(ActionId id);
inline constexpr char16_t kMenuArrow = u'▸';
QString withoutMnemonic(QString text);

// Keys that no binding may take: the ones dialogs and focus moves need.
bool isDialogKey(int key);

}  // namespace stridemark::ui
