// The JSON guard (io/json_guard.hpp) every parse goes through: nesting depth, keys given twice,
// numbers beyond double range; and that a streaming reader can use it with its own SAX handler.
#include "io/json_guard.hpp"

#include <doctest/doctest.h>

#include <string>

#include "io/json_fields.hpp"
#include "model/errors.hpp"

namespace {

std::string nested(std::size_t levels) { return std::string(levels, '[') + std::string(levels, ']'); }

/// The lines parse_json_text reports for `text` ("" when it parses).
std::string problems(const std::string& text) {
  bine::Diagnostics diagnostics("f.json");
  const auto value = bine::parse_json_text(text, diagnostics);
  std::string out;
  for (const auto& line : diagnostics.lines()) out += line + "\n";
  CHECK(value.has_value() == out.empty());
  return out;
}

/// A SAX handler that only counts values: what a streaming reader might plug in.
struct CountingHandler : nlohmann::json_sax<nlohmann::json> {
  int values = 0;
  bool null() override { return ++values > 0; }
  bool boolean(bool) override { return ++values > 0; }
  bool number_integer(number_integer_t) override { return ++values > 0; }
  bool number_unsigned(number_unsigned_t) override { return ++values > 0; }
  bool number_float(number_float_t, const string_t&) override { return ++values > 0; }
  bool string(string_t&) override { return ++values > 0; }
  bool binary(binary_t&) override { return ++values > 0; }
  bool start_object(std::size_t) override { return true; }
  bool key(string_t&) override { return true; }
  bool end_object() override { return true; }
  bool start_array(std::size_t) override { return true; }
  bool end_array() override { return true; }
  bool parse_error(std::size_t, const std::string&, const nlohmann::detail::exception&) override { return false; }
};

}  // namespace

TEST_CASE("nesting up to 64 levels parses and one more is refused with its line and column") {
  CHECK(problems(nested(bine::kMaxJsonDepth)).empty());
  CHECK(problems(nested(bine::kMaxJsonDepth + 1)) ==
        "f.json: nested deeper than 64 levels at line 1, column 65 (bine files need fewer than 10)\n");
  // Line and column of the bracket that opens level 65, on the third line; brackets inside strings
  // do not count.
  const std::string text = "{\"a\": \"[[[\\\"[\",\n\"b\":\n  " + nested(64) + "}";
  CHECK(problems(text) ==
        "f.json: nested deeper than 64 levels at line 3, column 66 (bine files need fewer than 10)\n");
}

TEST_CASE("100,000 levels of nesting are refused, not a crash") {
  CHECK(problems(nested(100000)).find("nested deeper than 64 levels at line 1, column 65") != std::string::npos);
  std::string objects;
  for (int i = 0; i < 100000; ++i) objects += "{\"a\": ";
  CHECK(problems(objects + "1" + std::string(100000, '}')).find("nested deeper") != std::string::npos);
}

TEST_CASE("a key given twice in one object is refused, naming the key and the object") {
  CHECK(problems(R"({"hops": [{"amount": "17 g", "amount": "1.7 kg"}]})") ==
        "f.json: /hops/0: the key \"amount\" appears twice in this object (keep one)\n");
  CHECK(problems(R"({"a": 1, "a": 2})") == "f.json: /: the key \"a\" appears twice in this object (keep one)\n");
  // The same key in two different objects, or escaped differently in two objects, is fine.
  CHECK(problems(R"({"a": {"x": 1}, "b": {"x": 2}, "c": [{"x": 1}, {"x": 2}]})").empty());
  // "\u0061" is "a": the same key once decoded (RFC 8259 compares decoded names).
  CHECK(problems(R"({"a": 1, "\u0061": 2})").find("the key \"a\" appears twice") != std::string::npos);
}

TEST_CASE("numbers beyond double range are refused") {
  CHECK(problems("[1e400]").find("a number is too large to represent") != std::string::npos);
  CHECK(problems("[1e308, -1e308]").empty());
}

TEST_CASE("a streaming reader wraps its own SAX handler in the guard") {
  CountingHandler counter;
  bine::JsonGuard guard(counter);
  const std::string ok = R"({"varieties": [{"name": "A"}, {"name": "B"}]})";
  CHECK(nlohmann::json::sax_parse(ok, &guard));
  CHECK(counter.values == 2);
  CHECK(guard.stop().kind == bine::JsonGuardStop::Kind::none);

  CountingHandler second;
  bine::JsonGuard second_guard(second);
  CHECK_FALSE(
      nlohmann::json::sax_parse(R"({"varieties": [{"name": "A"}, {"name": "B", "name": "C"}]})", &second_guard));
  CHECK(second_guard.stop().kind == bine::JsonGuardStop::Kind::duplicate_key);
  CHECK(second_guard.stop().pointer == "/varieties/1");
  CHECK(second_guard.stop().key == "name");

  CountingHandler third;
  bine::JsonGuard third_guard(third);
  CHECK_FALSE(nlohmann::json::sax_parse(nested(1000), &third_guard));
  CHECK(third_guard.stop().kind == bine::JsonGuardStop::Kind::too_deep);
}
