// Results of junctions kept between runs of a project, keyed by a hash of everything a result
// depends on: the program version, the accuracy target, the detail file's bytes and those of the
// files it refers to (drawings), and the parameter values. A re-run after one change re-solves
// only the junctions whose inputs changed.
#pragma once

#include <optional>
#include <string>

#include "pipeline/calculate.h"
#include "results/project_schedule.h"

namespace edgeflux {

/// SHA-256 (hex) of the junction's inputs as above; a file that cannot be read makes the key
/// unique to this run (no cache hit, the solve reports the problem).
std::string junction_cache_key(const ProjectJunction& junction, const AccuracyTarget& target);

/// The stored result for `key` in `folder`, or nothing (absent, unreadable or damaged entries are
/// misses, never errors).
std::optional<VariantSummary> load_cached_result(const std::string& folder, const std::string& key);

/// Stores a successful result under `key` (written atomically; the folder is created). A cache
/// that cannot be written is skipped, with the reason returned; an empty string on success.
std::string store_cached_result(const std::string& folder, const std::string& key, const VariantSummary& result);

}  // namespace edgeflux
