// The JSON guard (io/json_guard.hpp) every parse goes through: nesting depth, keys given twice,
// numbers beyond double range, elements per array; and that a streaming reader can use it with its
// own SAX handler.
#include "io/json_guard.hpp"

#include <doctest/doctest.h>

#include <string>

#include "io/json_fields.hpp"
#include "model/errors.hpp"

namespace {

std::string nested(std::size_t levels) { return std::string(levels, '[') + std::string(levels, ']'); }

/// `count` copies of `element`, comma-separated, in brackets.
std::string array_of(std::size_t count, const std::string& element) {
  std::string out = "[";
  for (std::size_t i = 0; i < count; ++i) out += (i ? "," : "") + element;
  return out + "]";
}

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

TEST_CASE("an array holds at most its limit, by where it is: the first element past it is refused") {
  // The limits are the table's own (io/json_guard.hpp); the element refused is the first past the
  // limit, whose index (from 0) is the limit itself: hand arithmetic, 1,000 elements are 0-999.
  CHECK(problems("{\"hops\": " + array_of(1000, "{}") + "}").empty());
  CHECK(problems("{\"hops\": " + array_of(1001, "{}") + "}") ==
        "f.json: /hops/1000: more than 1,000 hop additions (one file holds at most 1,000)\n");
  // Any other array, at any depth: the default, named by its place.
  CHECK(problems("{\"varieties\": [{\"tags\": " + array_of(1000, "\"t\"") + "}]}").empty());
  CHECK(problems("{\"varieties\": [{\"tags\": " + array_of(1001, "\"t\"") + "}]}") ==
        "f.json: /varieties/0/tags/1000: more than 1,000 elements (an array here holds at most 1,000)\n");
  // "hops" below the top level is not a recipe's list of additions: the default holds there too.
  CHECK(problems("{\"x\": {\"hops\": " + array_of(1001, "0") + "}}").find("/x/hops/1000: more than 1,000 elements") !=
        std::string::npos);
  // A whole document that is one long array.
  CHECK(problems(array_of(1001, "0")) ==
        "f.json: /1000: more than 1,000 elements (an array here holds at most 1,000)\n");
  // 250,000 lots pass the guard (the loader then reads them); one more does not.
  CHECK(problems("{\"lots\": " + array_of(250000, "0") + "}").empty());
  CHECK(problems("{\"lots\": " + array_of(250001, "0") + "}") ==
        "f.json: /lots/250000: more than 250,000 lots (one file holds at most 250,000)\n");
}

TEST_CASE("array limits match pointers with * for any index, and a streaming reader gets them too") {
  // A table of our own, small enough to count by hand.
  static constexpr bine::JsonArrayLimit kLimits[] = {{"/a", 2, "as"}, {"/b/*/c", 1, "cs"}};
  const auto stop_of = [](const std::string& text) {
    CountingHandler counter;
    bine::JsonGuard guard(counter, kLimits, 3);
    const bool parsed = nlohmann::json::sax_parse(text, &guard);
    CHECK(parsed == (guard.stop().kind == bine::JsonGuardStop::Kind::none));
    return guard.stop();
  };
  CHECK(stop_of(R"({"a": [1, 2], "b": [{"c": [1]}, {"c": [2]}], "d": [1, 2, 3]})").kind ==
        bine::JsonGuardStop::Kind::none);
  const auto a = stop_of(R"({"a": [1, 2, 3]})");
  CHECK(a.kind == bine::JsonGuardStop::Kind::too_many);
  CHECK(a.pointer == "/a/2");
  CHECK(a.max == 2);
  CHECK(a.noun == "as");
  const auto c = stop_of(R"({"b": [{"c": [1]}, {"c": [1, 2]}]})");
  CHECK(c.pointer == "/b/1/c/1");
  CHECK(c.noun == "cs");
  // Not in the table: the default of 3, and no noun.
  const auto d = stop_of(R"({"b": [{"e": [1, 2, 3, 4]}]})");
  CHECK(d.pointer == "/b/0/e/3");
  CHECK(d.max == 3);
  CHECK(d.noun.empty());
  // The count is per array: /a holds two arrays (its limit), each of three (the default at /a/*).
  CHECK(stop_of(R"({"a": [[1, 2, 3], [1, 2, 3]]})").kind == bine::JsonGuardStop::Kind::none);
}
