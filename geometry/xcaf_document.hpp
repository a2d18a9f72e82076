// An XCAF document for reading STEP files back (tests only: bandforge itself writes STEP without
// XCAF, see geometry/step_writer.cpp). OCCT types: geometry/ and tests only.
#pragma once

#include <TDocStd_Document.hxx>

namespace bandforge::geom {

/// A new XCAF document ("MDTV-XCAF"), closed when the scope ends. A document and its label tree
/// refer to each other, so a document that is never closed is never freed (the sanitizer build
/// reports it); the tests that re-read STEP files hold one of these.
class DocumentScope {
 public:
  DocumentScope();
  ~DocumentScope();
  DocumentScope(const DocumentScope&) = delete;
  DocumentScope& operator=(const DocumentScope&) = delete;

  Handle(TDocStd_Document) doc;
};

}  // namespace bandforge::geom
