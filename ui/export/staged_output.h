#pragma once
// All-or-nothing output: every file of an export is first written under a temporary name in
// the target folder; commit() renames them all into place. If the export fails or is
// cancelled, the destructor removes every temporary file, so no partial file is left behind.
#include <filesystem>
#include <vector>

namespace stridemark::ui::exports {

class StagedOutput {
 public:
  explicit StagedOutput(std::filesystem::path outDir);
  ~StagedOutput();
  StagedOutput(const StagedOutput&) = delete;
  StagedOutput& operator=(const StagedOutput&) = delete;

  // Temporary path to write `relative` (e.g. "figures/gait_map.svg") to. Creates parent
  // folders. The final name is reserved until commit() or destruction.
  std::filesystem::path stage(const std::filesystem::path& relative);

  // Renames every staged file that exists to its final name; returns the final paths.
  // Throws stridemark::Error(export_) naming the file when a rename fails.
  std::vector<std::filesystem::path> commit();

  // Drops every staged file (also done by the destructor when commit() was not called).
  void discard() noexcept;

  const std::filesystem::path& outDir() const { return outDir_; }

 private:
  struct Entry {
    std::filesystem::path temp;
    std::filesystem::path final;
  };
  std::filesystem::path outDir_;
  std::vector<Entry> entries_;
  std::vector<std::filesystem::path> createdDirs_;  // removed again on discard when empty
  bool committed_ = false;
};

}  // namespace stridemark::ui::exports
