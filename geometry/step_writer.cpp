// write_step(): the assembly as an AP214 STEP file (REFERENCE §6): one product per distinct part,
// named instances, sRGB colours, millimetres, a header from the design's [project] block,
// reproducible bytes.
//
// Written with STEPControl_Writer alone, not through an XCAF document: XCAF (TKXCAF, TKXDESTEP)
// pulls OpenCASCADE's visualisation libraries and their image and font libraries into the
// process, 39 shared libraries whose loading took ~47 ms of every `build` (measured with a
// program linking only the libraries, README "Performance"). The writer's assembly mode makes
// the product structure from a compound of located solids (one product per distinct solid, one
// NEXT_ASSEMBLY_USAGE_OCCURRENCE with its placement per located one); the names and colours
// are then put on the STEP entities found through the transfer's finder process, as XCAF's own
// writer does it: PRODUCT id and name from the shape's SHAPE_DEFINITION_REPRESENTATION, the
// instance name on the NAUO behind its CONTEXT_DEPENDENT_SHAPE_REPRESENTATION, and a styled
// item per solid (STEPConstruct_Styles) gathered in one
// MECHANICAL_DESIGN_GEOMETRIC_PRESENTATION_REPRESENTATION per part. tests/step_test.cpp reads the
// file back with OCCT's XCAF reader, an independent path, and checks all of it.
//
// The OCCT part (the transfer, names, colours, header) is in step_transfer.cpp, built as the
// module bandforge-step.so that `build` loads in the export's child process only (the STEP
// libraries' relocations were ~20 ms of every start); the tests link it in. This file gathers
// the input from the model, calls it, and post-processes the text (step_canonical.hpp).
#include <dlfcn.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <TopExp_Explorer.hxx>

#include "geometry/occt_model.hpp"
#include "geometry/step_canonical.hpp"
#include "geometry/step_header.hpp"
#include "geometry/step_transfer.hpp"
#include "src/errors.hpp"

// Defined when the module's object is linked in (the tests and benchmarks); null in
// bandforge-cad, which loads the module instead.
extern "C" int bandforge_step_transfer_v1(const bandforge::geom::StepTransferInput*, const char*, char*,
                                          std::size_t) __attribute__((weak));

namespace bandforge::geom {
namespace {

// A part as one solid: a boolean's result is a compound holding it, which the writer's
// assembly mode would take for a sub-assembly.
TopoDS_Shape as_solid(const TopoDS_Shape& s) {
  if (s.ShapeType() == TopAbs_SOLID) return s;
  TopExp_Explorer ex(s, TopAbs_SOLID);
  if (!ex.More()) throw BuildError("while writing the STEP file: a part has no solid");
  const TopoDS_Shape solid = ex.Current();
  ex.Next();
  if (ex.More()) throw BuildError("while writing the STEP file: a part has more than one solid");
  return solid;
}

using TransferFunction = int (*)(const StepTransferInput*, const char*, char*, std::size_t);

// The transfer: linked in, or from bandforge-step.so in the running executable's directory
// (build/bin/ in the build tree, <prefix>/libexec/bandforge/ installed, beside bandforge-cad).
// Loaded once per process, with lazy binding: RTLD_NOW would bind every function of the STEP
// libraries at once (~12 000 more relocations, ~10 ms) where the export calls a few hundred.
// A missing or broken module is a BuildError naming the file.
TransferFunction load_transfer_module() {
  std::error_code ec;
  const std::filesystem::path exe = std::filesystem::read_symlink("/proc/self/exe", ec);
  const std::filesystem::path module = exe.parent_path() / step_module_file;
  void* handle = ::dlopen(module.c_str(), RTLD_LAZY | RTLD_LOCAL);
  if (handle == nullptr) {
    const char* why = ::dlerror();
    throw BuildError("cannot load the STEP writer " + module.string() + ": " + (why ? why : "unknown error") +
                     " (it is installed beside bandforge-cad)");
  }
  const auto entry = reinterpret_cast<TransferFunction>(::dlsym(handle, step_entry_symbol));
  if (entry == nullptr) {
    throw BuildError("the STEP writer " + module.string() + " has no entry point " + step_entry_symbol);
  }
  return entry;
}

TransferFunction transfer_function() {
  if (bandforge_step_transfer_v1 != nullptr) return &bandforge_step_transfer_v1;
  // A function-local static: loaded once even when threads export at once; a failed load
  // throws and is tried again by the next export.
  static const TransferFunction loaded = load_transfer_module();
  return loaded;
}

std::string read_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream ss;
  ss << in.rdbuf();
  if (!in && !in.eof()) throw IoError("cannot read back " + path);
  return ss.str();
}

void write_file(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out << text;
  out.close();
  if (!out) throw IoError("cannot write " + path);
}

}  // namespace

void write_step(const BrakeModel& model, const Design& design, const std::string& path) {
  const BrakeModel::Impl& m = model.impl();
  const StepHeader header = step_header(design, std::filesystem::path(path).filename().string());
  const std::string partial = path + ".partial";
  QuietOcct quiet;
  StepTransferInput input;
  input.header = header;
  for (std::size_t i = 0; i < m.parts.size(); ++i) {
    input.parts.push_back({as_solid(m.parts[i].shape), m.infos[i].name, m.infos[i].colour});
  }
  for (const auto& in : m.instances) input.instances.push_back({in.part, in.name, in.placement});
  char message[1024] = "";
  const int status = transfer_function()(&input, partial.c_str(), message, sizeof message);
  if (status == step_io_error) throw IoError(message);
  if (status != step_ok) throw BuildError(message);
  try {
    std::vector<std::array<double, 3>> colours;
    for (const PartInfo& p : m.infos) colours.push_back({p.colour.r, p.colour.g, p.colour.b});
    std::string text = read_file(partial);
    text = encode_non_ascii(text);          // names and header: Part 21 \X2\ strings
    text = exact_colours(text, colours);    // the sRGB values chosen, not float round-off
    text = occurrence_ids_from_one(text);   // as a first export in a fresh process
    write_file(partial, canonical_step(text));  // entity order from content, not addresses
  } catch (...) {
    std::remove(partial.c_str());
    throw;
  }
  std::error_code ec;
  std::filesystem::rename(partial, path, ec);
  if (ec) {
    std::remove(partial.c_str());
    throw IoError("cannot write " + path + ": " + ec.message());
  }
}

}  // namespace bandforge::geom
