// The OpenCASCADE half of write_step(), built as the module bandforge-step.so (see
// step_transfer.hpp for why). Everything here runs in the STEP export's process only.
#include "geometry/step_transfer.hpp"

#include <cstdio>
#include <cstring>
#include <exception>
#include <string>
#include <utility>
#include <vector>

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
#include <TopLoc_Location.hxx>
#include <TopoDS_Compound.hxx>
#include <TransferBRep.hxx>
#include <TransferBRep_ShapeMapper.hxx>
#include <Transfer_FinderProcess.hxx>
#include <XSControl_TransferWriter.hxx>
#include <XSControl_WorkSession.hxx>

namespace bandforge::geom {
namespace {

// A failure with its status; the entry point turns it into its return value and message.
struct Failure {
  int status = step_build_error;
  std::string message;
};

Handle(TCollection_HAsciiString) ascii(const std::string& s) {
  return new TCollection_HAsciiString(s.c_str());
}

// Interface_Static settings (OCCT's translation options, process-wide) changed for one
// translation and restored on destruction, so that a library user sees no side effect.
class StaticSettings {
 public:
  StaticSettings() = default;
  ~StaticSettings() {
    for (auto it = saved_.rbegin(); it != saved_.rend(); ++it) {
      Interface_Static::SetCVal(it->first.c_str(), it->second.c_str());
    }
  }
  StaticSettings(const StaticSettings&) = delete;
  StaticSettings& operator=(const StaticSettings&) = delete;

  // SetCVal fails silently on unknown values, so every call is checked.
  void set(const std::string& name, const std::string& value) {
    const Standard_CString old = Interface_Static::CVal(name.c_str());
    if (old == nullptr) throw Failure{step_build_error, "OpenCASCADE has no setting " + name};
    const std::string previous = old;
    if (!Interface_Static::SetCVal(name.c_str(), value.c_str()) ||
        value != Interface_Static::CVal(name.c_str())) {
      throw Failure{step_build_error, "OpenCASCADE refused " + name + " = " + value};
    }
    saved_.emplace_back(name, previous);
  }

 private:
  std::vector<std::pair<std::string, std::string>> saved_;
};

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

void transfer(const StepTransferInput& in, const char* path) {
  std::vector<TopoDS_Shape> solids;
  for (const auto& part : in.parts) solids.push_back(part.solid);
  // The assembly: every instance is its part's solid, located; instances of one part share it.
  TopoDS_Compound assembly;
  BRep_Builder builder;
  builder.MakeCompound(assembly);
  std::vector<TopoDS_Shape> located;
  for (const auto& instance : in.instances) {
    located.push_back(solids.at(instance.part).Located(TopLoc_Location(instance.placement)));
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
    throw Failure{step_build_error, "while writing the STEP file: the assembly did not transfer"};
  }
  const Handle(XSControl_WorkSession)& ws = writer.WS();
  const Handle(Transfer_FinderProcess) fp = ws->TransferWriter()->FinderProcess();
  // Names: PRODUCT id and name alike (REFERENCE §6.2), the instance's name on its NAUO.
  auto name_product = [&](const TopoDS_Shape& s, const std::string& name) {
    const Handle(StepBasic_Product) p = product_of(fp, s);
    if (p.IsNull()) throw Failure{step_build_error, "while writing the STEP file: no product for " + name};
    p->SetId(ascii(name));
    p->SetName(ascii(name));
  };
  name_product(assembly, in.header.assembly);
  for (std::size_t i = 0; i < in.parts.size(); ++i) name_product(solids[i], in.parts[i].name);
  for (std::size_t k = 0; k < in.instances.size(); ++k) {
    const Handle(StepBasic_ProductDefinitionRelationship) nauo = occurrence_of(fp, located[k]);
    if (nauo.IsNull()) {
      throw Failure{step_build_error, "while writing the STEP file: no assembly occurrence for " + in.instances[k].name};
    }
    nauo->SetName(ascii(in.instances[k].name));
  }
  // Colours: one styled item on each part's solid, one presentation per part in its context.
  STEPConstruct_Styles styles(ws);
  const Handle(StepVisual_Colour) no_colour;
  // One COLOUR_RGB per distinct colour, shared by the parts that have it.
  STEPConstruct_DataMapOfAsciiStringTransient named_colours;
  STEPConstruct_DataMapOfPointTransient rgb_colours;
  for (std::size_t i = 0; i < in.parts.size(); ++i) {
    const Handle(StepRepr_RepresentationItem) item = STEPConstruct::FindEntity(fp, solids[i]);
    const Handle(StepRepr_RepresentationContext) context = styles.FindContext(solids[i]);
    if (item.IsNull() || context.IsNull()) {
      throw Failure{step_build_error, "while writing the STEP file: no solid entity for " + in.parts[i].name};
    }
    const Rgb c = in.parts[i].colour;
    const Handle(StepVisual_Colour) colour = STEPConstruct_Styles::EncodeColor(
        Quantity_Color(c.r, c.g, c.b, Quantity_TOC_sRGB), named_colours, rgb_colours);
    styles.ClearStyles();
    styles.AddStyle(item, styles.MakeColorPSA(item, colour, no_colour, no_colour, 0.0), nullptr);
    Handle(StepVisual_MechanicalDesignGeometricPresentationRepresentation) presentation;
    if (!styles.CreateMDGPR(context, presentation) || presentation.IsNull()) {
      throw Failure{step_build_error, "while writing the STEP file: the colour of " + in.parts[i].name + " was not written"};
    }
    writer.Model()->AddWithRefs(presentation);
  }
  APIHeaderSection_MakeHeader mh(writer.Model());
  mh.SetName(ascii(in.header.file_name));
  mh.SetTimeStamp(ascii(in.header.time_stamp));
  mh.SetDescriptionValue(1, ascii(in.header.description));
  mh.SetAuthorValue(1, ascii(in.header.author));
  mh.SetOrganizationValue(1, ascii(in.header.organization));
  mh.SetPreprocessorVersion(ascii(in.header.system));
  mh.SetOriginatingSystem(ascii(in.header.system));
  mh.SetAuthorisation(ascii(in.header.authorisation));
  if (writer.Write(path) != IFSelect_RetDone) throw Failure{step_io_error, std::string("cannot write ") + path};
}

}  // namespace
}  // namespace bandforge::geom

extern "C" int bandforge_step_transfer_v1(const bandforge::geom::StepTransferInput* input, const char* path,
                                          char* message, std::size_t message_size) {
  using namespace bandforge::geom;
  auto fail = [&](int status, const std::string& text) {
    std::remove(path);
    if (message_size > 0) {
      std::strncpy(message, text.c_str(), message_size - 1);
      message[message_size - 1] = '\0';
    }
    return status;
  };
  try {
    transfer(*input, path);
    return step_ok;
  } catch (const Failure& f) {
    return fail(f.status, f.message);
  } catch (const Standard_Failure& e) {
    return fail(step_build_error, std::string("while writing the STEP file: ") +
                                      (e.GetMessageString() ? e.GetMessageString() : "OpenCASCADE error"));
  } catch (const std::exception& e) {
    return fail(step_build_error, std::string("while writing the STEP file: ") + e.what());
  } catch (...) {
    return fail(step_build_error, "while writing the STEP file: an unknown error");
  }
}
