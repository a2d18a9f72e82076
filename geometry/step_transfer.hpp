// The OpenCASCADE half of write_step(): solids, names and colours in, a Part 21 file out.
//
// It lives in its own shared module, bandforge-step.so beside bandforge-cad (and linked
// straight into the tests), because OpenCASCADE's STEP libraries (TKSTEP, TKSTEPBase,
// TKSTEPAttr, TKSTEP209, TKXSBase, TKShHealing) are the largest part of what the dynamic
// loader relocates at every start: loading them only in the export's child process takes
// ~20 ms off the serial start of `build` (README "Performance"). The entry point is a C
// function so that dlsym finds it by a plain name; the input is C++ (the module is built with
// the same compiler and links the same OCCT and libstdc++ already in the process).
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include <TopoDS_Shape.hxx>
#include <gp_Trsf.hxx>

#include "geometry/brake_model.hpp"  // Rgb
#include "geometry/step_header.hpp"

namespace bandforge::geom {

/// What the STEP file holds: one product per part, one located instance per placement.
struct StepTransferInput {
  struct Part {
    TopoDS_Shape solid;  ///< one solid, part coordinates [mm]
    std::string name;    ///< PRODUCT id and name
    Rgb colour;          ///< sRGB
  };
  struct Instance {
    std::size_t part = 0;  ///< index into parts
    std::string name;      ///< NEXT_ASSEMBLY_USAGE_OCCURRENCE name
    gp_Trsf placement;     ///< part → assembly
  };
  std::vector<Part> parts;
  std::vector<Instance> instances;
  StepHeader header;
};

/// Results of the entry point.
enum StepTransferStatus : int { step_ok = 0, step_build_error = 1, step_io_error = 2 };

/// The module's file name, looked for in the directory of the running executable.
inline constexpr const char* step_module_file = "bandforge-step.so";
/// The entry point's symbol name (see bandforge_step_transfer_v1 below).
inline constexpr const char* step_entry_symbol = "bandforge_step_transfer_v1";

}  // namespace bandforge::geom

/// Writes `input` as an AP214 file at `path` (OCCT's own bytes: write_step post-processes them).
/// Returns a StepTransferStatus; on failure `message` (of `message_size` bytes) holds the error
/// text and no file is left at `path`. Never throws.
extern "C" int bandforge_step_transfer_v1(const bandforge::geom::StepTransferInput* input, const char* path,
                                          char* message, std::size_t message_size);
