#pragma once
// The workstation window: Viewer and Footfall lanes in the centre, analysis docks around them,
// transport and tag keys on the keyboard. All edits go through the ProjectDocument; analysis
// reruns on a worker after each edit; frames come from the video engine without blocking.
#include <QElapsedTimer>
#include <QMainWindow>
#include <QStringList>
#include <QTimer>
#include <cstdint>
#include <memory>
#include <optional>

#include "analysis/report.h"
#include "ui/app/analysis_runner.h"
#include "ui/app/video_source.h"
#include "ui/document/project_document.h"
#include "ui/widgets/tag_keys.h"

class QAction;
class QLabel;
class QMenu;
class QProgressBar;
class QPushButton;

namespace stridemark::ui {

class Viewer;
class FootfallLanes;
class StrideSheet;
class FigureView;
class ChecksList;
class SummaryView;

// What to do when a journal from a crashed session exists (tests choose without a dialog).
enum class RecoveryPolicy { ask, recover, discard };

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
  // File > Export… (Ctrl+E); exposed for tests.
  QAction* exportAction() const { return exportAction_; }

  void seek(std::int64_t frame);
  std::int64_t playhead() const { return playhead_; }
  std::int64_t frameCount() const;
  // What a tag key press does (Shift: the opposite kind).
  bool tagLimb(int limb, bool opposite = false);
  // Marks these hidden spans as one undoable edit (Edit > Mark hidden span for limbs…).
  bool markHiddenSpans(const std::vector<model::HiddenSpan>& spans);
  QAction* hiddenSpanAction() const { return hiddenSpanAction_; }

  ProjectDocument* document() { return &doc_; }
  AnalysisRunner* analysisRunner() { return &runner_; }
  std::shared_ptr<const analysis::Report> report() const { return report_; }
  Viewer* viewer() const { return viewer_; }
  FootfallLanes* lanes() const { return lanes_; }
  VideoSource* video() const { return video_.get(); }
  const TagKeyMap& tagKeys() const { return keys_; }
  void setAutoAdvance(bool on, std::int64_t frames = 1);
  void setRecoveryPolicy(RecoveryPolicy policy) { recovery_ = policy; }
  void setAskBeforeDiscard(bool ask) { askBeforeDiscard_ = ask; }
  // Cache budget and proxy folder for videos opened from now on (tests; else from settings).
  void setVideoOptions(const VideoSourceOptions& options) { videoOptions_ = options; }
  // Settings > Frame cache: the budget for decoded frames, saved, applied to the open video at
  // once, and the stepping proxy offered if the new budget is too small for its keyframe spacing.
  void setFrameCacheBudget(std::size_t bytes);
  QAction* stepOnProxyAction() const { return stepOnProxyAction_; }
  QPushButton* proxyCancelButton() const { return proxyCancel_; }
  QProgressBar* proxyProgressBar() const { return proxyBar_; }

 protected:
  bool eventFilter(QObject* watched, QEvent* event) override;
  void closeEvent(QCloseEvent* event) override;
  void dragEnterEvent(QDragEnterEvent* event) override;
  void dropEvent(QDropEvent* event) override;

 private:
  void buildDocks();
  void buildActions();
  QAction* addAction(QMenu* menu, const QString& text, const QKeySequence& key,
                     std::function<void()> slot);
  void onAnnotationChanged();
  void onReport(std::shared_ptr<const analysis::Report> report, std::uint64_t revision);
  void onFrame(qint64 frame, const QImage& image);
  void attachVideo(std::unique_ptr<VideoSource> video);
  void buildProxyStatus();
  void showProxyProgress(bool on);
  void connectProxySignals();
  void cancelProxyBuild();
  bool openVideoForProject(const QString& projectPath);
  std::optional<model::Project> offerRecovery(const QString& journalFile);
  bool maybeSave();
  bool save();
  bool saveAsDialog();
  void stepBy(std::int64_t delta);
  void jumpToEvent(int direction);
  void startPlayback(int direction);
  void stopPlayback();
  void playTick();
  void changeSpeed(int direction);
  void goToDialog();
  void toggleHiddenSpan();
  void hiddenSpanDialog();
  void selectLimb(int limb);
  void updateTitle();
  void updateStatus();
  void addRecent(const QString& path);
  void rebuildRecentMenu();
  void setTheme(bool dark);
  void editTrialCard();
  void editTagKeys();
  void editFrameCacheBudget();
  void exportFigures();
  // File > Export…: saves first when needed, then opens the Export dialog on the project file.
  bool saveBeforeExport();
  void openExport();

  ProjectDocument doc_;
  AnalysisRunner runner_;
  VideoSourceOptions videoOptions_;
  std::unique_ptr<VideoSource> video_;
  std::shared_ptr<const analysis::Report> report_;
  std::uint64_t shownRevision_ = 0;
  TagKeyMap keys_;

  Viewer* viewer_ = nullptr;
  FootfallLanes* lanes_ = nullptr;
  StrideSheet* sheet_ = nullptr;
  FigureView* gaitMap_ = nullptr;
  FigureView* phaseDial_ = nullptr;
  FigureView* dutyPlot_ = nullptr;
  ChecksList* checks_ = nullptr;
  SummaryView* summary_ = nullptr;
  TagKeyLegend* legend_ = nullptr;
  QLabel* status_ = nullptr;
  QMenu* recentMenu_ = nullptr;
  QMenu* viewMenu_ = nullptr;
  QAction* autoAdvanceAction_ = nullptr;
  QAction* exportAction_ = nullptr;
  QAction* darkAction_ = nullptr;
  QAction* stepOnProxyAction_ = nullptr;
  QAction* hiddenSpanAction_ = nullptr;
  QAction* cancelProxyAction_ = nullptr;
  QProgressBar* proxyBar_ = nullptr;
  QPushButton* proxyCancel_ = nullptr;

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
  bool askBeforeDiscard_ = true;
};

}  // namespace stridemark::ui
