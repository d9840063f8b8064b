#pragma once
// Tidy CSV tables of one scored trial, ready for R (read.csv(comment.char = "#")) or pandas
// (read_csv(comment="#")). One observation per row, units in column names, empty cell = value
// undefined. Each file opens with '#' lines naming the software version, input and capture rate.
//
//   events.csv    limb, event, frame, time_s
//   strides.csv   one row per reference stride x limb: stride-level columns (gait, band,
//                 quadrant, sequence, lead, symmetrical, aerial, dap) and the limb's
//                 duty_factor and phase_cycles in that stride
//   limbs.csv     one row per limb x measure: n, mean, sd, cv
//   phases.csv    one row per limb: circular statistics of its relative phase
//   support.csv   one row per support pattern (k limbs down, or a named combination)
//   bouts.csv     one row per bout of same-gait strides
//   symmetry.csv  one row per measure x limb pair: symmetry index and ratio
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"

namespace stridemark::formats {

struct TableSource {
  std::string input;  // what was scored, as the user named it
};

std::string eventsTable(const model::Annotation& annotation, const TableSource& source);
std::string stridesTable(const analysis::Report& report, const TableSource& source);
std::string limbsTable(const analysis::Report& report, const TableSource& source);
std::string phasesTable(const analysis::Report& report, const TableSource& source);
std::string supportTable(const analysis::Report& report, const TableSource& source);
std::string boutsTable(const analysis::Report& report, const TableSource& source);
std::string symmetryTable(const analysis::Report& report, const TableSource& source);

// Writes every table into `folder` (created when missing); returns the files written.
std::vector<std::filesystem::path> writeTables(const std::filesystem::path& folder,
                                               const model::Annotation& annotation,
                                               const analysis::Report& report,
                                               const TableSource& source);

}  // namespace stridemark::formats
