// Tests of the exact blend QP solver: hand-worked small cases, and 200 random problems checked
// against SciPy's SLSQP (tests/engine/qp_reference.py, Debian python3-scipy) to 1e-6 in objective.
#include "engine/blend_solver.hpp"

#include <doctest/doctest.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <random>
#include <string>

#include "cli/run_binary.hpp"

namespace {

using bine::BlendQp;
using bine::qp_from_least_squares;
using bine::solve_blend_qp;

Eigen::MatrixXd row_matrix(std::initializer_list<double> values) {
  Eigen::MatrixXd m(1, static_cast<Eigen::Index>(values.size()));
  Eigen::Index i = 0;
  for (double v : values) m(0, i++) = v;
  return m;
}

/// The reference script's standard output (SciPy SLSQP on the same problems).
std::string run_reference(const std::string& input) {
  const auto run =
      bine::test::run_program(BINE_PYTHON, {std::string(BINE_TEST_DIR) + "/engine/qp_reference.py", input});
  INFO(run.err);
  REQUIRE(run.exited);
  REQUIRE(run.status == 0);
  return run.out;
}

nlohmann::json matrix_json(const Eigen::MatrixXd& m) {
  nlohmann::json rows = nlohmann::json::array();
  for (Eigen::Index r = 0; r < m.rows(); ++r) {
    nlohmann::json row = nlohmann::json::array();
    for (Eigen::Index c = 0; c < m.cols(); ++c) row.push_back(m(r, c));
    rows.push_back(row);
  }
  return rows;
}

nlohmann::json vector_json(const Eigen::VectorXd& v) { return std::vector<double>(v.data(), v.data() + v.size()); }

}  // namespace

TEST_CASE("one axis, two varieties: the exact mix and a binding limit (hand arithmetic)") {
  // Profiles 0 and 4 on one axis, target 3: P = 4 x2, so x2 = 3/4, x1 = 1/4 and J = 0.
  BlendQp qp =
      qp_from_least_squares(row_matrix({0.0, 4.0}), Eigen::VectorXd::Constant(1, 3.0), Eigen::VectorXd::Ones(1));
  auto free = solve_blend_qp(qp);
  REQUIRE(free.feasible);
  CHECK(free.shares[0] == doctest::Approx(0.25));
  CHECK(free.shares[1] == doctest::Approx(0.75));
  CHECK(free.objective == doctest::Approx(0.0).epsilon(1e-12));
  // Limit x2 <= 0.5 (an IBU-like row): best is x2 = 0.5, P = 2, J = (2 - 3)^2 = 1.
  qp.inequality = row_matrix({0.0, 1.0});
  qp.inequality_bound = Eigen::VectorXd::Constant(1, 0.5);
  auto limited = solve_blend_qp(qp);
  REQUIRE(limited.feasible);
  CHECK(limited.shares[1] == doctest::Approx(0.5));
  CHECK(limited.objective == doctest::Approx(1.0));
}

TEST_CASE("an equality that pins the shares (hand arithmetic)") {
  // Profiles 2 and 5, target 5 would want x2 = 1, but 3 x1 + 1 x2 = 2 with x1 + x2 = 1 gives
  // x1 = 1/2, x2 = 1/2: P = 3.5, J = 1.5^2 = 2.25.
  BlendQp qp =
      qp_from_least_squares(row_matrix({2.0, 5.0}), Eigen::VectorXd::Constant(1, 5.0), Eigen::VectorXd::Ones(1));
  qp.equality = Eigen::Vector2d(3.0, 1.0);
  qp.equality_bound = 2.0;
  auto solution = solve_blend_qp(qp);
  REQUIRE(solution.feasible);
  CHECK(solution.shares[0] == doctest::Approx(0.5));
  CHECK(solution.objective == doctest::Approx(2.25));
}

TEST_CASE("identical profiles (singular Hessian) still give the exact minimum") {
  // Two lots of one variety, profile 4, target 4: J = 0 for any split; a limit x1 <= 0.2 holds.
  BlendQp qp =
      qp_from_least_squares(row_matrix({4.0, 4.0}), Eigen::VectorXd::Constant(1, 4.0), Eigen::VectorXd::Ones(1));
  qp.inequality = row_matrix({1.0, 0.0});
  qp.inequality_bound = Eigen::VectorXd::Constant(1, 0.2);
  auto solution = solve_blend_qp(qp);
  REQUIRE(solution.feasible);
  CHECK(solution.objective == doctest::Approx(0.0).epsilon(1e-12));
  CHECK(solution.shares[0] <= 0.2 + 1e-9);
}

TEST_CASE("contradictory limits are reported infeasible") {
  // x1 <= -0.1 cannot hold with x >= 0.
  BlendQp qp =
      qp_from_least_squares(row_matrix({1.0, 2.0}), Eigen::VectorXd::Constant(1, 1.0), Eigen::VectorXd::Ones(1));
  qp.inequality = row_matrix({1.0, 0.0});
  qp.inequality_bound = Eigen::VectorXd::Constant(1, -0.1);
  CHECK_FALSE(solve_blend_qp(qp).feasible);
}

TEST_CASE("200 random blend QPs agree with SciPy SLSQP to 1e-6 in objective") {
  std::mt19937 random(20261202u);  // fixed seed: the test is deterministic
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::uniform_int_distribution<int> share_count(1, 4);
  std::uniform_int_distribution<int> intensity(0, 5);
  const Eigen::Index axes = 14;
  std::vector<BlendQp> problems;
  nlohmann::json documents = nlohmann::json::array();
  for (int p = 0; p < 200; ++p) {
    const Eigen::Index n = share_count(random);
    Eigen::MatrixXd a(axes, n);
    for (Eigen::Index i = 0; i < axes; ++i)
      for (Eigen::Index j = 0; j < n; ++j)
        a(i, j) = unit(random) < 0.5 ? 0.0 : intensity(random) * (0.5 + unit(random));
    if (n >= 2 && unit(random) < 0.15) a.col(1) = a.col(0);  // two lots of one variety
    Eigen::VectorXd b(axes), w(axes);
    for (Eigen::Index i = 0; i < axes; ++i) {
      const bool named = unit(random) < 0.3;
      b[i] = named ? intensity(random) : 0.0;
      w[i] = named ? 1.0 : 0.25;
    }
    BlendQp qp = qp_from_least_squares(a, b, w);
    // A feasible point x0, then limits that x0 satisfies (often tightly).
    Eigen::VectorXd x0(n);
    for (Eigen::Index j = 0; j < n; ++j) x0[j] = -std::log(unit(random) + 1e-12);
    x0 /= x0.sum();
    std::vector<Eigen::VectorXd> rows;
    std::vector<double> bounds;
    if (unit(random) < 0.8) {  // an IBU-like limit with non-negative coefficients
      Eigen::VectorXd c(n);
      for (Eigen::Index j = 0; j < n; ++j) c[j] = 10.0 * unit(random);
      rows.push_back(c);
      bounds.push_back(c.dot(x0) * (1.0 + 0.3 * unit(random)));
    }
    const int homogeneous = std::uniform_int_distribution<int>(0, 2)(random);
    for (int h = 0; h < homogeneous; ++h) {  // stock-like rows r x <= 0
      Eigen::VectorXd r(n);
      for (Eigen::Index j = 0; j < n; ++j) r[j] = 2.0 * unit(random) - 1.0;
      if (r.dot(x0) > 0.0) r -= Eigen::VectorXd::Constant(n, r.dot(x0) * (1.0 + unit(random)));
      rows.push_back(r);
      bounds.push_back(0.0);
    }
    qp.inequality.resize(static_cast<Eigen::Index>(rows.size()), n);
    qp.inequality_bound.resize(static_cast<Eigen::Index>(rows.size()));
    for (std::size_t r = 0; r < rows.size(); ++r) {
      qp.inequality.row(static_cast<Eigen::Index>(r)) = rows[r].transpose();
      qp.inequality_bound[static_cast<Eigen::Index>(r)] = bounds[r];
    }
    nlohmann::json document{{"A", matrix_json(a)},
                            {"b", vector_json(b)},
                            {"w", vector_json(w)},
                            {"C", matrix_json(qp.inequality)},
                            {"d", vector_json(qp.inequality_bound)}};
    if (n >= 2 && unit(random) < 0.2) {  // no bittering charge: late IBU pinned
      Eigen::VectorXd e(n);
      for (Eigen::Index j = 0; j < n; ++j) e[j] = 10.0 * unit(random);
      qp.equality = e;
      qp.equality_bound = e.dot(x0);
      document["e"] = vector_json(e);
      document["e0"] = qp.equality_bound;
    }
    problems.push_back(qp);
    documents.push_back(document);
  }
  const auto input =
      std::filesystem::temp_directory_path() / ("bine-qp-problems-" + std::to_string(::getpid()) + ".json");
  std::ofstream(input) << documents.dump();
  const std::string output = run_reference(input.string());
  std::filesystem::remove(input);
  const auto reference = nlohmann::json::parse(output, nullptr, false);
  REQUIRE(reference.is_array());
  REQUIRE(reference.size() == problems.size());
  int compared = 0;
  for (std::size_t p = 0; p < problems.size(); ++p) {
    CAPTURE(p);
    const auto ours = solve_blend_qp(problems[p]);
    REQUIRE(ours.feasible);  // every problem was built around a feasible point
    // Our answer is feasible to 1e-8 and its objective matches the reference.
    CHECK(ours.shares.minCoeff() >= -1e-12);
    CHECK(std::abs(ours.shares.sum() - 1.0) <= 1e-9);
    if (problems[p].inequality.rows() > 0)
      CHECK((problems[p].inequality * ours.shares - problems[p].inequality_bound).maxCoeff() <= 1e-8);
    REQUIRE_FALSE(reference[p].is_null());
    CHECK(std::abs(ours.objective - reference[p].get<double>()) <= 1e-6);
    ++compared;
  }
  CHECK(compared == 200);
}
