// A building's thermal bridges as a schedule: the project as its file states it, and per junction
// the ψ in the energy method's dimension system, the lengths, ψ·l, fRsi and the criteria, summed
// to H_TB = Σ ψk·lk (ISO 14683; the transmission heat transfer coefficient of ISO 13789).
#pragma once

#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "geometry/cross_section.h"
#include "results/variant_summary.h"

namespace edgeflux {

/// One length of a junction taken off the drawings, m, and where it was taken from.
struct TakenLength {
  double metres = 0;
  std::string where;
};

/// A junction of the project: a detail file with its parameter values, and its lengths.
struct ProjectJunction {
  std::string reference;    ///< e.g. "J03", unique in the project
  std::string description;
  std::string detail_file;  ///< resolved against the project file's folder
  std::map<std::string, double> overrides;  ///< <set name value/>
  std::vector<TakenLength> lengths;
  std::optional<double> assumed_psi;  ///< the ψ the energy calculation assumed, W/(m·K)
  std::string assumed_source;         ///< where that value comes from (required with it)
  SourceLocation where;
};

struct Project {
  std::string file;
  JunctionRecord record;              ///< the project's record (no junction reference)
  DimensionSystem system = DimensionSystem::external;  ///< of the energy method
  std::optional<double> envelope_area;  ///< m², for ΔU_TB = H_TB / A
  std::vector<ProjectJunction> junctions;
};

/// The record a junction's report shows in a project: the project's fields where it gives them
/// (it is the authority for project, client, site, revision, assessor, checker and date), the
/// detail's drawing unless the project names one only, and the junction's reference.
inline JunctionRecord record_in_project(const JunctionRecord& detail, const JunctionRecord& project, const std::string& reference) {
  JunctionRecord r = detail;
  r.reference = reference;
  for (auto [field, value] : {std::pair{&r.project, &project.project}, {&r.client, &project.client}, {&r.site, &project.site},
                              {&r.revision, &project.revision}, {&r.assessor, &project.assessor}, {&r.checker, &project.checker},
                              {&r.date, &project.date}})
    if (!value->empty()) *field = *value;
  if (r.drawing.empty()) r.drawing = project.drawing;
  return r;
}

/// A junction's line of the schedule.
struct ScheduleRow {
  ProjectJunction junction;
  VariantSummary result;              ///< the calculation (result.error set when it failed)
  std::optional<double> psi;          ///< ψ in the project's system, W/(m·K)
  std::optional<double> psi_error;    ///< its estimated discretisation error
  double length = 0;                  ///< Σ of the lengths, m
  std::optional<double> psi_length;   ///< ψ·l, W/K
  bool exceeds_assumed = false;       ///< computed ψ above the assumed ψ
  std::string error;                  ///< why this junction has no ψ (empty when it has one)
  bool from_cache = false;            ///< the result was read from the cache, not solved in this run
};

struct Schedule {
  Project project;
  std::vector<ScheduleRow> rows;
  double heat_transfer_coefficient = 0;     ///< H_TB = Σ ψ·l over the junctions with a ψ, W/K
  double heat_transfer_coefficient_error = 0;  ///< Σ |ψ error|·l, W/K
  std::optional<double> u_surcharge;        ///< ΔU_TB = H_TB / A, W/(m²K)
  int failed = 0;                           ///< junctions without a ψ
  std::vector<std::string> notes;           ///< e.g. a cache that could not be written
};

}  // namespace edgeflux
