// Internal steps of build_brake() shared between assemble.cpp and checks.cpp.
#pragma once

#include <set>
#include <string>
#include <utility>

#include "geometry/occt_model.hpp"

namespace bandforge::geom {

/// Instance-name pairs (sorted) that are meant to touch: pins in their holes and eyes, the
/// lining on the band and (applied state) on the drum, the grip on the lever.
using IntendedContacts = std::set<std::pair<std::string, std::string>>;

/// Validity, mass properties and pairwise interference/clearance of every instance; fills
/// m.valid, m.infos[*].volume/mass/centroid and m.contacts.
void run_checks(BrakeModel::Impl& m, const IntendedContacts& intended);

/// Throws BuildError naming the first invalid solid or the first failing pair of parts.
void reject_failures(const BrakeModel::Impl& m);

}  // namespace bandforge::geom
