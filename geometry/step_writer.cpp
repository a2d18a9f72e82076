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
#include <array>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <APIHeaderSection_MakeHeader.hxx>
#include <BRep_Builder.hxx>
#include <Interface_Static.hxx>
#include <Quantity_Color.hxx>
#include <STEPConstruct.hxx>
#include <STEPConstruct_Styles.hxx>
#include <STEPControl_Controller.hxx>
#include <STEPControl_Writer.hxx>
#include <Standard_Failure.hxx>
#include <StepBasic_Product.hxx>
#include <StepBasic_ProductDefinition.hxx>
#include <StepBasic_ProductDefinitionFormation.hxx>
#include <StepBasic_ProductDefinitionRelationship.hxx>
#include <StepData_StepModel.hxx>
#include <StepRepr_CharacterizedDefinition.hxx>
#include <StepRepr_ProductDefinitionShape.hxx>
#include <StepRepr_PropertyDefinition.hxx>
#include <StepRepr_RepresentationItem.hxx>
#include <StepRepr_RepresentedDefinition.hxx>
#include <StepShape_ContextDependentShapeRepresentation.hxx>
#include <StepShape_ShapeDefinitionRepresentation.hxx>
#include <StepVisual_Colour.hxx>
#include <StepVisual_MechanicalDesignGeometricPresentationRepresentation.hxx>
#include <StepVisual_PresentationStyleAssignment.hxx>
#include <StepVisual_StyledItem.hxx>
#include <TCollection_HAsciiString.hxx>
#include <TopExp_Explorer.hxx>
#include <TopLoc_Location.hxx>
#include <TopoDS.hxx>
#include <TopoDS_Compound.hxx>
#include <TransferBRep.hxx>
#include <TransferBRep_ShapeMapper.hxx>
#include <Transfer_FinderProcess.hxx>
#include <XSControl_TransferWriter.hxx>
#include <XSControl_WorkSession.hxx>

#include "geometry/occt_guard.hpp"
#include "geometry/occt_model.hpp"
#include "geometry/step_canonical.hpp"
#include "geometry/step_header.hpp"
#include "src/errors.hpp"

namespace bandforge::geom {
namespace {

Handle(TCollection_HAsciiString) ascii(const std::string& s) {
  return new TCollection_HAsciiString(s.c_str());
}

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

// The PRODUCT of a transferred shape (part or assembly), through its
// SHAPE_DEFINITION_REPRESENTATION → PRODUCT_DEFINITION_SHAPE → PRODUCT_DEFINITION.
Handle(StepBasic_Product) product_of(const Handle(Transfer_FinderProcess)& fp, const TopoDS_Shape& s) {
  Handle(StepShape_ShapeDefinitionRepresentation) sdr;
  if (!fp->FindTypedTransient(TransferBRep::ShapeMapper(fp, s),
                              STANDARD_TYPE(StepShape_ShapeDefinitionRepresentation), sdr)) {
    return {};
  }
  const Handle(StepRepr_PropertyDefinition) pd = sdr->Definition().PropertyDefinition();
  if (pd.IsNull()) return {};
  const Handle(StepBasic_ProductDefinition) def = pd->Definition().ProductDefinition();
  if (def.IsNull() || def->Formation().IsNull()) return {};
  return def->Formation()->OfProduct();
}

// The NEXT_ASSEMBLY_USAGE_OCCURRENCE of a located instance, through its
// CONTEXT_DEPENDENT_SHAPE_REPRESENTATION → PRODUCT_DEFINITION_SHAPE.
Handle(StepBasic_ProductDefinitionRelationship) occurrence_of(const Handle(Transfer_FinderProcess)& fp,
                                                              const TopoDS_Shape& located) {
  Handle(StepShape_ContextDependentShapeRepresentation) cdsr;
  if (!fp->FindTypedTransient(TransferBRep::ShapeMapper(fp, located),
                              STANDARD_TYPE(StepShape_ContextDependentShapeRepresentation), cdsr)) {
    return {};
  }
  const Handle(StepRepr_ProductDefinitionShape) pds = cdsr->RepresentedProductRelation();
  if (pds.IsNull()) return {};
  return pds->Definition().ProductDefinitionRelationship();
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
  try {
    std::vector<TopoDS_Shape> solids;
    for (const auto& part : m.parts) solids.push_back(as_solid(part.shape));
    // The assembly: every instance is its part's solid, located; instances of one part share it.
    TopoDS_Compound assembly;
    BRep_Builder builder;
    builder.MakeCompound(assembly);
    std::vector<TopoDS_Shape> located;
    for (const auto& in : m.instances) {
      located.push_back(solids[in.part].Located(TopLoc_Location(in.placement)));
      builder.Add(assembly, located.back());
    }
    StaticSettings settings;
    // The schema must be set after Init() and before the writer exists (TOOLCHAIN.md).
    STEPControl_Controller::Init();
    settings.set("write.step.schema", "AP214IS");
    settings.set("write.step.unit", "MM");
    // Auto: a compound of several shapes is an assembly, a single solid a part.
    settings.set("write.step.assembly", "Auto");
    STEPControl_Writer writer;
    if (writer.Transfer(assembly, STEPControl_AsIs) != IFSelect_RetDone) {
      throw BuildError("while writing the STEP file: the assembly did not transfer");
    }
    const Handle(XSControl_WorkSession)& ws = writer.WS();
    const Handle(Transfer_FinderProcess) fp = ws->TransferWriter()->FinderProcess();
    // Names: PRODUCT id and name alike (REFERENCE §6.2), the instance's name on its NAUO.
    auto name_product = [&](const TopoDS_Shape& s, const std::string& name) {
      const Handle(StepBasic_Product) p = product_of(fp, s);
      if (p.IsNull()) throw BuildError("while writing the STEP file: no product for " + name);
      p->SetId(ascii(name));
      p->SetName(ascii(name));
    };
    name_product(assembly, header.assembly);
    for (std::size_t i = 0; i < m.parts.size(); ++i) name_product(solids[i], m.infos[i].name);
    for (std::size_t k = 0; k < m.instances.size(); ++k) {
      const Handle(StepBasic_ProductDefinitionRelationship) nauo = occurrence_of(fp, located[k]);
      if (nauo.IsNull()) {
        throw BuildError("while writing the STEP file: no assembly occurrence for " + m.instances[k].name);
      }
      nauo->SetName(ascii(m.instances[k].name));
    }
    // Colours: one styled item on each part's solid, one presentation per part in its context.
    STEPConstruct_Styles styles(ws);
    const Handle(StepVisual_Colour) no_colour;
    // One COLOUR_RGB per distinct colour, shared by the parts that have it.
    STEPConstruct_DataMapOfAsciiStringTransient named_colours;
    STEPConstruct_DataMapOfPointTransient rgb_colours;
    for (std::size_t i = 0; i < m.parts.size(); ++i) {
      const Handle(StepRepr_RepresentationItem) item = STEPConstruct::FindEntity(fp, solids[i]);
      const Handle(StepRepr_RepresentationContext) context = styles.FindContext(solids[i]);
      if (item.IsNull() || context.IsNull()) {
        throw BuildError("while writing the STEP file: no solid entity for " + m.infos[i].name);
      }
      const Rgb c = m.infos[i].colour;
      const Handle(StepVisual_Colour) colour = STEPConstruct_Styles::EncodeColor(
          Quantity_Color(c.r, c.g, c.b, Quantity_TOC_sRGB), named_colours, rgb_colours);
      styles.ClearStyles();
      styles.AddStyle(item, styles.MakeColorPSA(item, colour, no_colour, no_colour, 0.0), nullptr);
      Handle(StepVisual_MechanicalDesignGeometricPresentationRepresentation) presentation;
      if (!styles.CreateMDGPR(context, presentation) || presentation.IsNull()) {
        throw BuildError("while writing the STEP file: the colour of " + m.infos[i].name + " was not written");
      }
      writer.Model()->AddWithRefs(presentation);
    }
    APIHeaderSection_MakeHeader mh(writer.Model());
    mh.SetName(ascii(header.file_name));
    mh.SetTimeStamp(ascii(header.time_stamp));
    mh.SetDescriptionValue(1, ascii(header.description));
    mh.SetAuthorValue(1, ascii(header.author));
    mh.SetOrganizationValue(1, ascii(header.organization));
    mh.SetPreprocessorVersion(ascii(header.system));
    mh.SetOriginatingSystem(ascii(header.system));
    mh.SetAuthorisation(ascii(header.authorisation));
    if (writer.Write(partial.c_str()) != IFSelect_RetDone) {
      std::remove(partial.c_str());
      throw IoError("cannot write " + partial);
    }
  } catch (const Standard_Failure& e) {
    std::remove(partial.c_str());
    throw BuildError(std::string("while writing the STEP file: ") + e.GetMessageString());
  } catch (...) {
    std::remove(partial.c_str());
    throw;
  }
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
