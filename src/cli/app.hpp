#pragma once
// The whole command line as one function, so that main, the end-to-end tests and the CLI fuzzer
// all run the same dispatcher.
#include <ostream>

namespace bine::cli {

/// Parses argv, runs the chosen command and returns the exit status (0 ok, 2 bad input,
/// 3 infeasible, 70 internal error). Command output goes to `out`, every error line (prefixed
/// "bine: ") to `err`. Never throws.
int run(int argc, char** argv, std::ostream& out, std::ostream& err);

}  // namespace bine::cli
