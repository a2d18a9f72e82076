#include "geometry/xcaf_document.hpp"

#include <Standard_Failure.hxx>
#include <XCAFApp_Application.hxx>

namespace bandforge::geom {

DocumentScope::DocumentScope() {
  XCAFApp_Application::GetApplication()->NewDocument("MDTV-XCAF", doc);
}

DocumentScope::~DocumentScope() {
  try {
    if (!doc.IsNull() && doc->IsOpened()) XCAFApp_Application::GetApplication()->Close(doc);
  } catch (const Standard_Failure&) {
    // Closing cannot fail for a document that was only read into; never throw here.
  }
}

}  // namespace bandforge::geom
