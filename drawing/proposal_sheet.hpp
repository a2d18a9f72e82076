// The review sheet of `bandforge propose` (proposals.pdf): the feasible candidates the search
// evaluated, plotted as operator force against band mass with the proposals marked; a front-view
// sketch of each proposal inside the brief's space regions; the ranked table; the caution.
#pragma once

#include <string>

#include "src/brief.hpp"
#include "src/propose.hpp"

namespace bandforge::drawing {

/// The sheet's PDF bytes (reproducible: no clock time inside).
std::string render_proposal_sheet(const Brief& brief, const ProposeResult& result);

/// Writes it to `path` (complete or not at all). Throws IoError / BuildError.
void write_proposal_sheet(const Brief& brief, const ProposeResult& result, const std::string& path);

}  // namespace bandforge::drawing
