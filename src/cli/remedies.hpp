#pragma once
// Engines say what would make a request work in domain words (model/errors.hpp, Remedy); the
// command line names the option that does it.
#include <string>
#include <string_view>
#include <vector>

#include "model/errors.hpp"

namespace bine::cli {

/// The option (or action) that carries out `remedy`, e.g. "lower --split".
std::string_view remedy_text(Remedy remedy);

/// `message` followed by its remedies in parentheses, "why (a, b or c)"; `message` alone when there
/// are none.
std::string with_remedies(std::string_view message, const std::vector<Remedy>& remedies);

}  // namespace bine::cli
