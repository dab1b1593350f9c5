// expected.hpp: the result of validating input from a person (pasted text, a typed field,
// a file). Either a value or an Error that says what is wrong and where. Core never throws
// through the GUI and never aborts on bad input; internal invariants use assert.
#pragma once

#include <cassert>
#include <string>
#include <utility>
#include <variant>

namespace attiscope {

/// What is wrong with a piece of input, and where. line and column are 1-based; 0 means
/// "no place in a text" (a typed field, an option). `field` names the field when there is one.
struct Error {
  Error() = default;
  explicit Error(std::string message_, int line_ = 0, int column_ = 0, std::string field_ = {})
      : message(std::move(message_)), line(line_), column(column_), field(std::move(field_)) {}

  std::string message;
  int line = 0;
  int column = 0;
  std::string field;

  /// "line 2, column 5: message" (or the message alone when there is no place).
  std::string describe() const {
    std::string out;
    if (!field.empty()) out += field + ": ";
    if (line > 0) {
      out += "line " + std::to_string(line) + ", column " + std::to_string(column) + ": ";
    }
    return out + message;
  }
};

/// A value or an Error. Deliberately small: C++17 has no std::expected.
template <class T>
class Expected {
 public:
  Expected(T value) : v_(std::move(value)) {}      // NOLINT: implicit on purpose
  Expected(Error error) : v_(std::move(error)) {}  // NOLINT: implicit on purpose

  bool ok() const { return v_.index() == 0; }
  explicit operator bool() const { return ok(); }

  const T& value() const& {
    assert(ok() && "Expected::value() on an error");
    return std::get<0>(v_);
  }
  T& value() & {
    assert(ok() && "Expected::value() on an error");
    return std::get<0>(v_);
  }
  T&& value() && {
    assert(ok() && "Expected::value() on an error");
    return std::get<0>(std::move(v_));
  }
  const T& operator*() const& { return value(); }
  const T* operator->() const { return &value(); }

  const Error& error() const {
    assert(!ok() && "Expected::error() on a value");
    return std::get<1>(v_);
  }

 private:
  std::variant<T, Error> v_;
};

}  // namespace attiscope
