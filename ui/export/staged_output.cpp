#include "ui/export/staged_output.h"

#include <unistd.h>
#include <algorithm>
#include <system_error>

#include "common/error.h"

namespace stridemark::ui::exports {
namespace fs = std::filesystem;

namespace {

// A name that cannot clash with a final name or another export running at the same time.
fs::path tempNameFor(const fs::path& final) {
  static int counter = 0;
  ++counter;
  return final.parent_path() / (".part-" + std::to_string(::getpid()) + "-" +
                                std::to_string(counter) + "-" + final.filename().string());
}

}  // namespace

StagedOutput::StagedOutput(fs::path outDir) : outDir_(std::move(outDir)) {
  std::error_code ec;
  fs::path missing;
  for (fs::path p = outDir_; !p.empty() && !fs::exists(p, ec); p = p.parent_path()) {
    createdDirs_.push_back(p);
    if (p == p.parent_path()) break;
  }
  fs::create_directories(outDir_, ec);
  if (ec || !fs::is_directory(outDir_)) {
    throw Error(ErrorCategory::io, "cannot create output folder '" + outDir_.string() +
                                       "': " + ec.message() +
                                       ". Choose a folder you can write to with --out.");
  }
}

StagedOutput::~StagedOutput() {
  if (!committed_) discard();
}

fs::path StagedOutput::stage(const fs::path& relative) {
  const fs::path final = outDir_ / relative;
  std::error_code ec;
  for (fs::path p = final.parent_path(); p != outDir_ && !fs::exists(p, ec); p = p.parent_path()) {
    createdDirs_.push_back(p);
  }
  fs::create_directories(final.parent_path(), ec);
  if (ec) {
    throw Error(ErrorCategory::io,
                "cannot create folder '" + final.parent_path().string() + "': " + ec.message());
  }
  entries_.push_back({tempNameFor(final), final});
  return entries_.back().temp;
}

std::vector<fs::path> StagedOutput::commit() {
  std::vector<fs::path> written;
  for (const Entry& e : entries_) {
    std::error_code ec;
    if (!fs::exists(e.temp, ec)) continue;  // a stage that decided to write nothing
    fs::rename(e.temp, e.final, ec);
    if (ec) {
      throw Error(ErrorCategory::export_, "cannot move finished file into place as '" +
                                              e.final.string() + "': " + ec.message());
    }
    written.push_back(e.final);
  }
  committed_ = true;
  entries_.clear();
  return written;
}

void StagedOutput::discard() noexcept {
  std::error_code ec;
  for (const Entry& e : entries_) fs::remove(e.temp, ec);
  entries_.clear();
  // Folders we created, deepest first, only while they are empty.
  std::sort(createdDirs_.begin(), createdDirs_.end(),
            [](const fs::path& a, const fs::path& b) { return a.string() > b.string(); });
  for (const fs::path& d : createdDirs_) {
    if (fs::is_directory(d, ec) && fs::is_empty(d, ec)) fs::remove(d, ec);
  }
  createdDirs_.clear();
}

}  // namespace stridemark::ui::exports
