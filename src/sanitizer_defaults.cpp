// Built into every executable of the sanitizer build only (-DBANDFORGE_SANITIZE=ON, see
// DEVELOPERS.md), so that the tests, the executables they run and a developer's own runs all
// use the same settings without environment variables.
//
// Full stacks for every allocation: OpenCASCADE is built without frame pointers, and the
// suppressions below only match with complete stacks.
//
// The suppressions name only OpenCASCADE 7.6's own allocations: the STEP translator's
// process-lifetime singletons (controllers, static parameters, editors registered once per
// process), the XCAF application's driver table, and a small leak inside
// GeomToStep_MakeDirection. Each was read with full stacks; none is freed by OCCT before exit.
// Nothing of bandforge's own is suppressed: a leak whose allocation is not under one of these
// OCCT calls still fails the test.
extern "C" {

const char* __asan_default_options() { return "fast_unwind_on_malloc=0:detect_leaks=1"; }

const char* __ubsan_default_options() { return "print_stacktrace=1"; }

const char* __lsan_default_suppressions() {
  return "leak:STEPControl_Controller::STEPControl_Controller\n"
         "leak:STEPControl_Controller::Init\n"
         "leak:STEPCAFControl_Controller::STEPCAFControl_Controller\n"
         "leak:STEPCAFControl_Controller::Init\n"
         "leak:IFSelect_Editor::IFSelect_Editor\n"
         "leak:Interface_Static::Init\n"
         "leak:MoniTool_TypedValue::AddEnum\n"
         "leak:STEPEdit_EditSDR::STEPEdit_EditSDR\n"
         "leak:STEPEdit_EditContext::STEPEdit_EditContext\n"
         "leak:APIHeaderSection_EditHeader::APIHeaderSection_EditHeader\n"
         "leak:GeomToStep_MakeDirection::GeomToStep_MakeDirection\n"
         "leak:TPrsStd_DriverTable::Get\n";
}

}  // extern "C"
