#pragma once
// The whole command line as one function, so that main, the end-to-end tests and the CLI fuzzer
// all run the same dispatcher.
#include <ostream>

namespace bine::cli {

/// Exit status when the output could not be written (full disk, closed stdout); 74 as in sysexits.h.
inline constexpr int kExitOutputFailed = 74;

/// Parses argv, runs the chosen command and returns the exit status (0 ok, 2 bad input,
/// 3 infeasible, 70 internal error, 74 output not written). Command output goes to `out`, every
/// error line (prefixed "bine: ") to `err`. Never throws.
int run(int argc, char** argv, std::ostream& out, std::ostream& err);

}  // namespace bine::cli
