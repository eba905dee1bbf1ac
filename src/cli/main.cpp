// bine: hop substitution, aroma blending and bitterness arithmetic for brewers.
// This file only hands argv to the dispatcher (src/cli/app.cpp); every computation lives in bine_core.
#include <dlfcn.h>

#include <iostream>

#include "cli/app.hpp"

namespace {

/// OpenBLAS (behind faiss) starts a worker thread per core that spins while waiting; bine answers
/// one question at a time, so one BLAS thread does the work with less CPU. Looked up at run time, so
/// a build against another BLAS needs nothing.
void use_one_blas_thread() {
  using SetThreads = void (*)(int);
  if (void* symbol = dlsym(RTLD_DEFAULT, "openblas_set_num_threads")) reinterpret_cast<SetThreads>(symbol)(1);
}

}  // namespace

int main(int argc, char** argv) {
  use_one_blas_thread();
  return bine::cli::run(argc, argv, std::cout, std::cerr);
}
