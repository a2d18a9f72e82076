// Internal steps of build_brake() shared between assemble.cpp and checks.cpp.
#pragma once

#include "geometry/occt_model.hpp"

namespace bandforge::geom {

/// Instance-name pairs (sorted) that are meant to touch (see BrakeModel::Impl::intended).
using IntendedContacts = std::set<std::pair<std::string, std::string>>;

/// Validity, mass properties and pairwise interference/clearance of every instance; fills
/// m.valid, m.infos[*].volume/mass/centroid and m.contacts.
/// `validity` false skips BRepCheck_Analyzer (solid_ok then says one solid of positive volume).
void run_checks(BrakeModel::Impl& m, const IntendedContacts& intended, bool interference,
                bool validity = true);

/// Smallest distance between the segments p0–p1 and q0–q1 (either may be a point) [mm]: the
/// axes of two round parts' bounding capsules (Part::bound_radius).
double segment_distance(const gp_Pnt& p0, const gp_Pnt& p1, const gp_Pnt& q0, const gp_Pnt& q1);

/// Throws BuildError naming the first invalid solid, or every failing pair of parts.
void reject_failures(const BrakeModel::Impl& m);

}  // namespace bandforge::geom
