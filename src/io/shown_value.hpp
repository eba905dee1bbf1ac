#pragma once
// A value from a file as an error message shows it: in double quotes, on one line (control
// characters become spaces), cut after 40 characters (never inside one), so a hostile value cannot
// break the one-line rule.
#include <string>
#include <string_view>

#include "model/errors.hpp"

namespace bine {

inline std::string shown_value(std::string_view value) {
  const std::string_view kept = first_characters(value, 40);
  std::string out;
  for (char c : kept) out += static_cast<unsigned char>(c) < 0x20 || c == 0x7f ? ' ' : c;
  return "\"" + out + (kept.size() < value.size() ? "...\"" : "\"");
}

}  // namespace bine
