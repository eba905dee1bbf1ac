#pragma once
// Invented varieties in bulk, for the index benchmark and the index recall test. Not brewing data.
#include <cstddef>
#include <cstdint>

#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

/// `count` invented varieties ("Synthetic 0000001" ...), deterministic for a seed. Each belongs to
/// one of ~count/50 families (a base aroma on 2-5 axes, oil shares and chemistry inside the typical
/// ranges of docs/methods.md#hop-chemistry-bounds) plus per-variety noise, so neighbourhoods exist as in real catalogs;
/// about 5 % lack oil data and 5 % have tags instead of intensities, so missing-data paths are exercised.
/// Every value is inside the loaders' bounds, so the catalog can be written as a catalog file and read back.
Catalog synthetic_catalog(std::size_t count, const Lexicon& lexicon, std::uint64_t seed = 42);

}  // namespace bine
