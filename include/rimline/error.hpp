#pragma once
// The one exception type of rimline: raised only for what stops a whole run
// (an unreadable file, a bad project file, a bad argument to a hydraulic function).
// Data problems in single features are Findings, not Errors.
#include <stdexcept>
#include <string>
#include <vector>

namespace rimline {

// Where an error was found. Empty parts are left out of the message.
struct ErrorContext {
  std::string file;
  std::string layer;
  std::string feature_id;
  std::string field;
};

enum class ErrorKind {
  bad_argument,  // a caller passed a value a function cannot work with (exit 2 at the CLI)
  bad_config,    // project file or command line is wrong (exit 2)
  bad_input,     // an input source is unreadable or unusable as a whole (exit 3)
  internal       // a rimline defect
};

class Error : public std::runtime_error {
 public:
  Error(ErrorKind kind, const ErrorContext& where, const std::string& what);
  Error(ErrorKind kind, const std::string& what) : Error(kind, ErrorContext{}, what) {}
  ErrorKind kind() const { return kind_; }
  const ErrorContext& where() const { return where_; }

 private:
  ErrorKind kind_;
  ErrorContext where_;
};

// "file:layer:fid 12:field DIA: " prefix used by every error message.
std::string format_context(const ErrorContext& where);

// Suggests the closest candidate for a misspelt name ("did you mean ...?"); empty if none is close.
std::string closest_name(const std::string& wrong, const std::vector<std::string>& candidates);

}  // namespace rimline
