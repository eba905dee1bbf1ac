#pragma once
// The guard every JSON parse in bine goes through. nlohmann's parser itself is iterative, but
// copying, printing and destroying a document recurse once per level, so a file nested 100,000
// levels deep would overflow the stack after a successful parse. The guard is a SAX filter: it
// counts the nesting depth and stops the parse at kMaxJsonDepth levels, refuses a key given twice in
// one object (JSON leaves that to the reader; nlohmann keeps the last value silently, which hides a
// typo such as two "amount" keys) and refuses numbers that overflow a double (nlohmann turns them
// into infinity). It also bounds how many elements one array holds, by where the array is
// (kJsonArrayLimits): a few megabytes of "{}," are a million records, and the document, the records
// built from it and their error messages would take hundreds of megabytes before anything could be
// refused, so the parse stops at the first element past the limit instead. It forwards every event
// to an inner SAX handler: parse_json_text builds a DOM with it, and a streaming reader can use it
// with its own handler (JsonGuard<MyHandler>), getting the same limits.
#include <cmath>
#include <cstddef>
#include <nlohmann/json.hpp>
#include <span>
#include <string>
#include <string_view>
#include <unordered_set>
#include <vector>

namespace bine {

/// Deepest nesting of objects and arrays accepted in an input file. Our files need 6 levels; 64
/// leaves room for anything a person or a program writes and stays far from the stack's limit.
inline constexpr std::size_t kMaxJsonDepth = 64;

/// The most elements one array may hold, by where it is in a file. `pointer` is a JSON pointer in
/// which "*" stands for any array index ("/varieties/*/tags"); `noun` names the elements in messages.
struct JsonArrayLimit {
  std::string_view pointer;
  std::size_t max;
  std::string_view noun;
};

/// The arrays of bine's files and the most elements each holds (the README's Reliability section and
/// the schemas' maxItems say the same). The bounds are far above real use: a brewery's stock or a
/// catalog of 100,000 entries loads (there are a few hundred hop varieties), a recipe has a few
/// dozen additions. Top-level keys differ between the file types, so one table serves them all.
inline constexpr JsonArrayLimit kJsonArrayLimits[] = {
    {"/hops", 1000, "hop additions"},              // recipe
    {"/lots", 250000, "lots"},                     // stock
    {"/varieties", 250000, "varieties"},           // catalog
    {"/changes", 250000, "lot changes"},           // stock journal entry (one per lot received)
    {"/batches", 100000, "batches"},               // batch log
    {"/batches_used", 100000, "batch names"},      // brewhouse profile
    {"/batches_left_out", 100000, "batch names"},  // brewhouse profile
    {"/brews", 10000, "brews"},                    // brewing schedule
};

/// The most elements of an array not in kJsonArrayLimits: tags, ranges, lexicon axes and compounds,
/// and any array a file holds where bine reads none.
inline constexpr std::size_t kMaxJsonArrayElements = 1000;

/// Why the guard stopped a parse (kind none: it did not).
struct JsonGuardStop {
  enum class Kind { none, too_deep, duplicate_key, not_finite, too_many } kind = Kind::none;
  std::string pointer;  // JSON pointer of the object holding the duplicate key, or of the value
  std::string key;      // the duplicate key
  std::size_t max = 0;  // too_many: the array's limit
  std::string noun;     // too_many: what its elements are ("lots"; empty for an array not in the table)
};

/// Line and column (from 1) of the first byte that opens nesting level `depth` in `text`, found by a
/// scan that skips strings. Used to place a too-deep error.
struct TextPosition {
  std::size_t line = 1;
  std::size_t column = 1;
};
TextPosition position_of_depth(std::string_view text, std::size_t depth);

/// Appends an escaped key to a JSON pointer ("/hops" + "0" -> "/hops/0"), RFC 6901.
std::string pointer_join(const std::string& pointer, std::string_view key);

/// SAX filter (nlohmann::json::sax_parse) that forwards to `Inner` and stops the parse on input the
/// guard refuses; stop() says why. `Inner` is any nlohmann SAX handler.
template <typename Inner>
class JsonGuard {
 public:
  using json = nlohmann::json;
  /// `limits` and `other_max` bound the arrays (kJsonArrayLimits and kMaxJsonArrayElements unless a
  /// test gives others).
  explicit JsonGuard(Inner& inner, std::span<const JsonArrayLimit> limits = kJsonArrayLimits,
                     std::size_t other_max = kMaxJsonArrayElements)
      : inner_(inner), limits_(limits), other_max_(other_max) {}

  const JsonGuardStop& stop() const { return stop_; }

  bool null() { return value() && inner_.null(); }
  bool boolean(bool v) { return value() && inner_.boolean(v); }
  bool number_integer(json::number_integer_t v) { return value() && inner_.number_integer(v); }
  bool number_unsigned(json::number_unsigned_t v) { return value() && inner_.number_unsigned(v); }
  bool number_float(json::number_float_t v, const json::string_t& s) {
    if (!value()) return false;
    if (!std::isfinite(v)) return halt(JsonGuardStop::Kind::not_finite, "");
    return inner_.number_float(v, s);
  }
  bool string(json::string_t& v) { return value() && inner_.string(v); }
  bool binary(json::binary_t& v) { return value() && inner_.binary(v); }
  bool start_object(std::size_t n) { return value() && open(true) && inner_.start_object(n); }
  bool key(json::string_t& k) {
    Level& level = levels_.back();
    if (!level.keys.insert(k).second) return halt(JsonGuardStop::Kind::duplicate_key, k);
    level.key = k;
    return inner_.key(k);
  }
  bool end_object() {
    levels_.pop_back();
    return inner_.end_object();
  }
  bool start_array(std::size_t n) { return value() && open(false) && inner_.start_array(n); }
  bool end_array() {
    levels_.pop_back();
    return inner_.end_array();
  }
  // A template, as in nlohmann's own handlers, so the DOM builder rethrows the exact exception type
  // (json::parse_error, json::out_of_range), not a sliced copy of its base.
  template <typename Exception>
  bool parse_error(std::size_t position, const std::string& token, const Exception& error) {
    return inner_.parse_error(position, token, error);
  }

 private:
  struct Level {
    bool object = false;
    std::size_t index = 0;  // arrays: the next element's index
    std::string key;        // objects: the last key
    std::unordered_set<std::string> keys;
    const JsonArrayLimit* limit = nullptr;  // arrays: their entry in the table, if any
    std::size_t max = 0;                    // arrays: the most elements
  };

  // Called before every value: moves an array's index on, and stops at the first element past its
  // limit (the pointer then names that element).
  bool value() {
    if (levels_.empty() || levels_.back().object) return true;
    Level& array = levels_.back();
    if (++array.index <= array.max) return true;
    stop_.max = array.max;
    stop_.noun = array.limit != nullptr ? std::string(array.limit->noun) : "";
    return halt(JsonGuardStop::Kind::too_many, "");
  }
  bool open(bool object) {
    if (levels_.size() >= kMaxJsonDepth) return halt(JsonGuardStop::Kind::too_deep, "");
    const JsonArrayLimit* limit = object ? nullptr : limit_here();
    levels_.push_back(Level{object, 0, {}, {}, limit, limit != nullptr ? limit->max : other_max_});
    return true;
  }
  // The table's entry for an array opened now (the value of the innermost level's current member).
  const JsonArrayLimit* limit_here() const {
    for (const JsonArrayLimit& limit : limits_)
      if (at_pointer(limit.pointer)) return &limit;
    return nullptr;
  }
  // Whether the open levels lead to `pattern` ("/varieties/*/tags": a key per object, "*" per array).
  bool at_pointer(std::string_view pattern) const {
    for (const Level& level : levels_) {
      if (pattern.empty() || pattern.front() != '/') return false;
      pattern.remove_prefix(1);
      const std::string_view segment = pattern.substr(0, pattern.find('/'));
      if (level.object ? segment != level.key : segment != "*") return false;
      pattern.remove_prefix(segment.size());
    }
    return pattern.empty() && !levels_.empty();
  }
  bool halt(JsonGuardStop::Kind kind, std::string duplicate) {
    stop_.kind = kind;
    stop_.key = std::move(duplicate);
    stop_.pointer = current_pointer(kind != JsonGuardStop::Kind::duplicate_key);
    return false;
  }
  // The pointer of the innermost open container; with `with_member`, of its current member.
  std::string current_pointer(bool with_member) const {
    std::string pointer;
    for (std::size_t i = 0; i < levels_.size(); ++i) {
      const Level& level = levels_[i];
      if (i + 1 == levels_.size() && !with_member) break;
      pointer =
          level.object ? pointer_join(pointer, level.key) : pointer_join(pointer, std::to_string(level.index - 1));
    }
    return pointer;
  }

  Inner& inner_;
  std::span<const JsonArrayLimit> limits_;
  std::size_t other_max_;
  std::vector<Level> levels_;
  JsonGuardStop stop_;
};

}  // namespace bine
