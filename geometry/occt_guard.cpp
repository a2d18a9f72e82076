// QuietOcct (geometry/brake_model.hpp): OpenCASCADE's messenger, quieted and restored.
#include "geometry/brake_model.hpp"

#include <Message.hxx>
#include <Message_Messenger.hxx>
#include <Message_PrinterOStream.hxx>
#include <Message_SequenceOfPrinters.hxx>
#include <Standard_Failure.hxx>

#include <mutex>

#include "src/errors.hpp"

namespace bandforge::geom {

namespace {

std::mutex quiet_mutex;
int quiet_depth = 0;  // guarded by quiet_mutex

Message_SequenceOfPrinters& saved_printers() {
  static Message_SequenceOfPrinters saved;  // guarded by quiet_mutex
  return saved;
}

}  // namespace

QuietOcct::QuietOcct() {
  const std::lock_guard<std::mutex> lock(quiet_mutex);
  if (quiet_depth++ > 0) return;
  const Handle(Message_Messenger)& messenger = Message::DefaultMessenger();
  saved_printers() = messenger->Printers();
  messenger->ChangePrinters().Clear();
  // The default printer stream is std::cout; the file name "cerr" selects the error stream.
  messenger->AddPrinter(new Message_PrinterOStream("cerr", false, Message_Fail));
}

QuietOcct::~QuietOcct() {
  const std::lock_guard<std::mutex> lock(quiet_mutex);
  if (--quiet_depth > 0) return;
  Message::DefaultMessenger()->ChangePrinters() = saved_printers();
  saved_printers().Clear();
}

}  // namespace bandforge::geom
