// bine: hop substitution, aroma blending and bitterness arithmetic for brewers.
// This file only hands argv to the dispatcher (src/cli/app.cpp); every computation lives in bine_core.
#include <iostream>

#include "cli/app.hpp"

int main(int argc, char** argv) { return bine::cli::run(argc, argv, std::cout, std::cerr); }
