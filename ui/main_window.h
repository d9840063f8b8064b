#pragma once
// The workstation window: Viewer and Footfall lanes in the centre, analysis docks around them,
// transport and tag keys on the keyboard. All edits go through the ProjectDocument; analysis
// reruns on a worker after each edit; frames come from the video engine without blocking.
//
// One class, its definitions split by concern: main_window.cpp (wiring and saved window
// state), main_window_docks.cpp, main_window_menus.cpp (actions made from ui/keys/action_table),
// main_window_open.cpp and main_window_save.cpp (file and session: open, recover, save,
// journal), main_window_proxy.cpp (stepping proxy status), main_window_transport.cpp (play,
// step, seek), main_window_tagging.cpp (tag keys, hidden spans), main_window_display.cpp
// (report, title, status), main_window_scope.cpp (the Scope toolbar), main_window_export.cpp and
// main_window_settings.cpp; main_window_seeds.cpp (foot seeds), main_window_propose.cpp (the
// background proposal run) and main_window_review.cpp (reviewing proposals), issue 18 item 3.
#include <QElapsedTimer>
#include <QMainWindow>
#include <QPointF>
#include <QStringList>
#include <QTimer>
#include <cstdint>
#include <functional>
#include <map>
#include <memory>
#include <optional>

#include "analysis/report.h"
#include "ui/document/project_document.h"
#include "ui/keys/key_bindings.h"
#include "ui/session/analysis_runner.h"
#include "ui/session/proposal_review.h"
#include "ui/session/report_scope.h"
#include "ui/session/video_source.h"
#include "ui/widgets/proposal_dialogs.h"
#include "ui/widgets/tag_keys.h"
#include "vision/propose.h"

class QAction;
class QComboBox;
class QLabel;
class QMenu;
class QProgressBar;
class QPushButton;

namespace stridemark::ui {

class Viewer;
class FootfallLanes;
class StrideSheet;
class StrideSheetPanel;
class FigureView;
class ChecksList;
class SummaryView;
class ProjectLock;
class ProposeJob;
class FrameCrops;

// What to do when a journal from a crashed session exists (tests choose without a dialog).
enum class RecoveryPolicy { ask, recover, discard };
// What to do when a clip without a project is opened: ask for its capture rate, limb set and
// an events CSV (the New trial dialog), or take the dialog's defaults without asking (tests).
enum class BareClipPolicy { ask, useDefaults };

struct ClipSetup;

class MainWindow : public QMainWindow {
  Q_OBJECT
 public:
  explicit MainWindow(QWidget* parent = nullptr);
  ~MainWindow() override;

  // Each returns false after showing the error (the window stays usable).
  bool openPath(const QString& path);
  bool openVideo(const QString& path);
  bool openProject(const QString& path);
  bool saveProjectAs(const QString& path);
  // Gait map, Phase dial, duty plot and footfall diagram as SVG, PNG and PDF in `dir`.
  bool exportFiguresTo(const QString& dir);

  // The window's command for `id` of the action table (nullptr before the menus exist).
  QAction* action(ActionId id) const;
  // File > Export… (Ctrl+E); exposed for tests.
  QAction* exportAction() const { return action(ActionId::exportProject); }
  QAction* hiddenSpanAction() const { return action(ActionId::markHiddenSpans); }
  QAction* stepOnProxyAction() const { return action(ActionId::stepOnProxy); }
  const KeyBindings& keyBindings() const { return bindings_; }
  // Help > Keyboard cheat sheet, for the bindings and tag keys in force.
  QString cheatSheetHtml() const;

  void seek(std::int64_t frame);
  std::int64_t playhead() const { return playhead_; }
  std::int64_t frameCount() const;
  // What a tag key press does (Shift: the opposite kind).
  bool tagLimb(int limb, bool opposite = false);
  // Marks these hidden spans as one undoable edit (Edit > Mark hidden span for limbs…).
  bool markHiddenSpans(const std::vector<model::HiddenSpan>& spans);

  ProjectDocument* document() { return &doc_; }
  AnalysisRunner* analysisRunner() { return &runner_; }
  std::shared_ptr<const analysis::Report> report() const { return report_; }
  Viewer* viewer() const { return viewer_; }
  FootfallLanes* lanes() const { return lanes_; }
  VideoSource* video() const { return video_.get(); }
  const TagKeyMap& tagKeys() const { return keys_; }
  void setAutoAdvance(bool on, std::int64_t frames = 1);
  void setRecoveryPolicy(RecoveryPolicy policy) { recovery_ = policy; }
  void setBareClipPolicy(BareClipPolicy policy) { bareClip_ = policy; }
  void setAskBeforeDiscard(bool ask) { askBeforeDiscard_ = ask; }
  // Cache budget and proxy folder for videos opened from now on (tests; else from settings).
  void setVideoOptions(const VideoSourceOptions& options) { videoOptions_ = options; }
  // Settings > Frame cache: the budget for decoded frames, saved, applied to the open video at
  // once, and the stepping proxy offered if the new budget is too small for its keyframe spacing.
  void setFrameCacheBudget(std::size_t bytes);
  // What the Summary dock, Gait map, Phase dial and Stride sheet show (the Scope toolbar):
  // All by default; a scope the newest report no longer has falls back to All.
  const ReportScope& scope() const { return scope_; }
  void setScope(const ReportScope& scope);
  QComboBox* scopeSelector() const { return scopeBox_; }
  StrideSheetPanel* strideSheetPanel() const { return sheetPanel_; }
  QPushButton* proxyCancelButton() const { return proxyCancel_; }
  // The red status-bar warning shown while the autosave journal cannot be written; empty when
  // the last write succeeded.
  QString journalWarning() const;
  QProgressBar* proxyProgressBar() const { return proxyBar_; }

  // --- foot seeds (main_window_seeds.cpp) ---
  // Seeding mode: tag keys choose the limb, a click on the Viewer places its seed.
  void setSeeding(bool on);
  bool seeding() const;
  int seedLimb() const { return seedLimb_; }
  void setSeedLimb(int limb);
  // The chosen limb's seed at the playhead's frame, at this pixel of the upright frame.
  bool placeSeed(QPointF videoPixel);
  bool removeSeedNear(QPointF videoPixel);
  // --- proposing (main_window_propose.cpp) ---
  // Starts vision::propose in the background from the project's seeds; false after showing
  // why it cannot start. Review ▸ Propose events… asks for these settings first.
  bool proposeEvents(const ProposeSettings& settings);
  bool proposing() const;
  void cancelProposing();
  ProposeJob* proposeJob() const { return proposeJob_.get(); }
  QProgressBar* proposeProgressBar() const { return proposeBar_; }
  QPushButton* proposeCancelButton() const { return proposeCancel_; }
  // The tracks of the newest run (kept in memory for display, not saved).
  const std::vector<vision::FootTrack>& tracks() const { return tracks_; }
  // --- review (main_window_review.cpp) ---
  const std::optional<model::ProposedEvent>& currentProposal() const { return current_; }
  // Makes `proposal` the one under review (highlighted, playhead on it); nothing: none.
  void setCurrentProposal(std::optional<model::ProposedEvent> proposal);
  void setReviewOrder(ReviewOrder order);
  ReviewOrder reviewOrder() const { return order_; }
  bool stepProposal(int direction);  // next (+1) or previous (-1); seeks to it
  bool acceptCurrentProposal();
  bool rejectCurrentProposal();
  bool nudgeCurrentProposal(std::int64_t delta);
  int acceptProposalsAbove(double minConfidence);
  // "RF touchdown @ 132 proposed, confidence 0.83 (3 of 41)"; empty with no current proposal.
  QString reviewText() const;

 protected:
  bool eventFilter(QObject* watched, QEvent* event) override;
  void closeEvent(QCloseEvent* event) override;
  void dragEnterEvent(QDragEnterEvent* event) override;
  void dropEvent(QDropEvent* event) override;

 private:
  // Wiring and window state (main_window.cpp).
  void connectDocument();
  void restoreSettings();
  // Docks (main_window_docks.cpp).
  void buildDocks();
  // Menus and actions from the action table (main_window_menus.cpp).
  void buildActions();
  QAction* makeAction(const ActionSpec& spec);
  std::function<void()> handlerFor(ActionId id);
  void connectToggles();
  void insertViewToggles();
  void applyKeyBindings();
  void addRecent(const QString& path);
  void rebuildRecentMenu();
  // Opening (main_window_open.cpp).
  void openDialog();
  // `opensInstead` says what the person gets when the journal is not recovered.
  std::optional<model::Project> offerRecovery(const QString& journalFile,
                                              const QString& opensInstead);
  void setAsideDamagedJournal(const QString& journalFile, const QString& why,
                              const QString& opensInstead);
  // The lock for `base` (project or unsaved clip): nothing in *lock when this window already
  // holds it; false after showing whose it is when another desk does.
  bool lockFor(const QString& base, std::unique_ptr<ProjectLock>* lock);
  void keepLock(std::unique_ptr<ProjectLock> lock);
  // Temporary files that a killed save or journal write left beside `base` (we own it now).
  void removeLeftovers(const QString& base);
  void showJournalWarning(const QString& message);
  QString projectBesideClip(const QString& videoPath, QString* note) const;
  bool askClipSetup(const VideoSource& source, const QString& note, ClipSetup* setup);
  bool openVideoForProject(const QString& projectPath);
  void attachVideo(std::unique_ptr<VideoSource> video);
  void connectVideo();
  // Saving (main_window_save.cpp).
  bool maybeSave();
  bool save();
  bool saveAsDialog();
  // Stepping proxy status (main_window_proxy.cpp).
  void buildProxyStatus();
  void showProxyProgress(bool on);
  void connectProxySignals();
  void cancelProxyBuild();
  // Transport (main_window_transport.cpp).
  void onFrame(qint64 frame, const QImage& image);
  void stepBy(std::int64_t delta);
  void jumpToEvent(int direction);
  void togglePlayback(int direction);
  void startPlayback(int direction);
  void stopPlayback();
  void playTick();
  void changeSpeed(int direction);
  void goToDialog();
  void bigStepDialog();
  QString speedText() const;  // "1/4×"
  // Tagging (main_window_tagging.cpp).
  void toggleHiddenSpan();
  void hiddenSpanDialog();
  void selectLimb(int limb);
  void reloadTagKeysIfLimbsChanged();
  void updateTagKeyHints();  // what each tag key records at the playhead
  // Display (main_window_display.cpp).
  void onAnnotationChanged();
  void onReport(std::shared_ptr<const analysis::Report> report, std::uint64_t revision);
  void updateTitle();
  void updateStatus();
  // Scope (main_window_scope.cpp).
  void buildScopeBar();
  void updateScopeChoices();
  void showScope();
  // Seeds (main_window_seeds.cpp).
  void buildReviewBar();
  void refillSeedLimbs();
  void showSeeds();
  // Proposing (main_window_propose.cpp).
  void buildProposeStatus();
  void showProposeProgress(bool on);
  void proposeDialog();
  void onProposeFinished();
  void attachCropReader();
  // Review (main_window_review.cpp).
  void afterReviewStep(const std::optional<model::ProposedEvent>& from);
  void acceptAboveDialog();
  void showReview();
  void showTracks();
  void fetchCrops();
  void onCrops(quint64 ticket, const std::vector<QImage>& crops);
  // Export (main_window_export.cpp). File > Export…: saves first when needed, then opens the
  // Export dialog on the project file.
  void exportFigures();
  bool saveBeforeExport();
  void openExport();
  // Settings and dialogs (main_window_settings.cpp).
  void setTheme(bool dark);
  void editTrialCard();
  void editTagKeys();
  void editKeyBindings();
  void editFrameCacheBudget();

  ProjectDocument doc_;
  AnalysisRunner runner_;
  VideoSourceOptions videoOptions_;
  std::unique_ptr<VideoSource> video_;
  std::shared_ptr<const analysis::Report> report_;
  std::uint64_t shownRevision_ = 0;
  TagKeyMap keys_;
  KeyBindings bindings_;

  Viewer* viewer_ = nullptr;
  FootfallLanes* lanes_ = nullptr;
  StrideSheet* sheet_ = nullptr;
  StrideSheetPanel* sheetPanel_ = nullptr;
  QComboBox* scopeBox_ = nullptr;
  ReportScope scope_;
  std::vector<ReportScope> scopes_;  // the selector's entries, in order
  FigureView* gaitMap_ = nullptr;
  FigureView* phaseDial_ = nullptr;
  FigureView* dutyPlot_ = nullptr;
  ChecksList* checks_ = nullptr;
  SummaryView* summary_ = nullptr;
  TagKeyLegend* legend_ = nullptr;
  QLabel* status_ = nullptr;
  QLabel* journalWarning_ = nullptr;
  std::unique_ptr<ProjectLock> lock_;
  QMenu* recentMenu_ = nullptr;
  QMenu* viewMenu_ = nullptr;
  std::map<ActionId, QAction*> actions_;
  QProgressBar* proxyBar_ = nullptr;
  QPushButton* proxyCancel_ = nullptr;
  // Seeds, proposing and review (issue 18 item 3).
  QComboBox* seedLimbBox_ = nullptr;
  int seedLimb_ = 0;
  std::unique_ptr<ProposeJob> proposeJob_;
  std::uint64_t proposeTicket_ = 0;  // grows on every project reset: a late run is dropped
  std::uint64_t runTicket_ = 0;      // the ticket the running job started with
  ProposeSettings proposeSettings_;
  QProgressBar* proposeBar_ = nullptr;
  QPushButton* proposeCancel_ = nullptr;
  std::vector<vision::FootTrack> tracks_;
  std::optional<model::ProposedEvent> current_;
  ReviewOrder order_ = ReviewOrder::byFrame;
  std::unique_ptr<FrameCrops> crops_;
  std::uint64_t cropTicket_ = 0;

  std::int64_t playhead_ = 0;
  int selectedLimb_ = 0;
  std::int64_t bigStep_ = 10;
  std::int64_t autoAdvanceFrames_ = 1;
  std::optional<std::int64_t> hiddenStart_;
  QTimer playTimer_;
  QElapsedTimer playClock_;
  std::int64_t playOrigin_ = 0;
  int playDirection_ = 0;
  int speedIndex_ = 5;  // index into the 1/32 ... 1x ladder
  RecoveryPolicy recovery_ = RecoveryPolicy::ask;
  BareClipPolicy bareClip_ = BareClipPolicy::ask;
  bool askBeforeDiscard_ = true;
};

}  // namespace stridemark::ui
