#pragma once
// A variety's aroma as intensities 0-5 on the lexicon's axes, from the best data it has:
//  1. explicit "aroma" intensities (axes not named are 0);
//  2. else its free-text "tags" through the lexicon: an axis named by one tag scores 3 (moderate),
//     each further tag on the same axis adds 1, capped at 5; tags the lexicon does not know are
//     ignored and listed;
//  3. else its oil composition through the lexicon's compound associations (a coarse fallback, see
//     aroma_from_oils);
//  4. else nothing: the profile is empty and engines must say the variety lacks aroma data.
#include <Eigen/Dense>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

enum class AromaSource { explicit_values, tags, oils, rub_test, none };
std::string_view to_string(AromaSource source);

struct AromaProfile {
  Eigen::VectorXd intensity;  // one entry per lexicon axis, 0-5; all 0 when source is none
  AromaSource source = AromaSource::none;
  std::vector<std::string> ignored_tags;  // tags the lexicon does not know
};

/// The aroma profile of a variety (see the rules above).
AromaProfile aroma_profile(const Variety& variety, const Lexicon& lexicon);

/// A lot's own aroma from the brewer's rub test (scores 0-5 on named axes, the rest 0), or nullopt
/// when the lot has none. Throws InputError naming `file` and /lots/INDEX/rub_test/scores/NAME for
/// a name that is not an axis of the lexicon (with did-you-mean).
std::optional<AromaProfile> lot_aroma(const Lot& lot, std::size_t index, std::string_view file, const Lexicon& lexicon);

/// "lot CODE: aroma from the brewer's rub test of DATE, not VARIETY's catalog profile".
std::string rub_test_note(const Lot& lot, std::string_view code);

/// Coarse aroma estimate from oil composition: each compound's share is divided by its typical
/// share (docs/methods.md#hop-chemistry-bounds typical ranges, midpoints: myrcene 45, humulene 24, caryophyllene 9,
/// farnesene 10, linalool 0.8, geraniol 0.5 % of oil), multiplied by the lexicon's axis weights for
/// that compound, summed per axis, and scaled so the strongest axis is 3. Empty when no oils.
Eigen::VectorXd aroma_from_oils(const Variety& variety, const Lexicon& lexicon);

/// Parses a target profile such as "floral=4,citrus=4,tropical=1" into axis intensities. A name
/// may also be one of the lexicon's tags ("lemon=4" is citrus=4); `read_as` (if given) then receives
/// one line per tag saying which axis it was read as. Throws InputError naming `where` for a name
/// that is neither an axis nor a tag (with did-you-mean), an axis given twice (directly or through
/// a tag) or a value outside 0-5. `named` receives true for each axis the spec names.
Eigen::VectorXd parse_aroma_spec(std::string_view spec, const Lexicon& lexicon, std::string_view where,
                                 std::vector<bool>* named = nullptr, std::vector<std::string>* read_as = nullptr);

}  // namespace bine
