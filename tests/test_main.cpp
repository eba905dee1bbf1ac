// The doctest main for every layer's test executable. CTest runs each test case by name
// (doctest_discover_tests); a filter that matches no test case would pass having run nothing (a
// name with ';' is split into two CTest entries that each match nothing), so such a run fails here.
#define DOCTEST_CONFIG_IMPLEMENT
#include <doctest/doctest.h>

#include <iostream>
#include <string_view>

namespace {

int test_cases_started = 0;

/// Counts the test cases that actually ran.
struct RunCounter : doctest::IReporter {
  explicit RunCounter(const doctest::ContextOptions&) {}
  void report_query(const doctest::QueryData&) override {}
  void test_run_start() override {}
  void test_run_end(const doctest::TestRunStats&) override {}
  void test_case_start(const doctest::TestCaseData&) override { ++test_cases_started; }
  void test_case_reenter(const doctest::TestCaseData&) override {}
  void test_case_end(const doctest::CurrentTestCaseStats&) override {}
  void test_case_exception(const doctest::TestCaseException&) override {}
  void subcase_start(const doctest::SubcaseSignature&) override {}
  void subcase_end() override {}
  void log_assert(const doctest::AssertData&) override {}
  void log_message(const doctest::MessageData&) override {}
  void test_case_skipped(const doctest::TestCaseData&) override {}
};

REGISTER_LISTENER("run-counter", 1, RunCounter);

}  // namespace

int main(int argc, char** argv) {
  doctest::Context context(argc, argv);
  const int status = context.run();
  if (context.shouldExit() || status != 0) return status;
  bool filtered = false;
  for (int i = 1; i < argc; ++i)
    filtered = filtered || std::string_view(argv[i]).rfind("--test-case=", 0) == 0 ||
               std::string_view(argv[i]).rfind("-tc=", 0) == 0;
  if (filtered && test_cases_started == 0) {
    std::cerr << "no test case matches the filter (a ';' in a TEST_CASE name splits it in CTest: use ',')\n";
    return 1;
  }
  return status;
}
