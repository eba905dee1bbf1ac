#pragma once
// Hard bounds that loaders enforce. Hop chemistry bounds are the "reject outside" values of
// docs/methods.md#hop-chemistry-bounds (ranges from memory and general literature).
// Brewing bounds are common practice, wide enough for any real brewhouse.
#include "io/json_fields.hpp"

namespace bine::limits {

inline constexpr double kHuge = 1e308;

inline constexpr Bounds alpha_acid{0.5, 22.0, "alpha acid"};
inline constexpr Bounds beta_acid{0.5, 12.0, "beta acid"};
inline constexpr Bounds cohumulone{10.0, 55.0, "cohumulone (% of alpha)"};
inline constexpr Bounds total_oil{0.1, 5.0, "total oil"};
inline constexpr Bounds oil_fraction{0.0, 100.0, "an oil compound (% of total oil)"};
inline constexpr Bounds stability{1.0, 100.0, "storage stability (% of alpha left after 6 months at 20 C)"};
inline constexpr Bounds aroma_intensity{0.0, 5.0, "an aroma intensity"};
inline constexpr Bounds hsi{0.15, 2.0, "Hop Storage Index"};

inline constexpr Bounds hop_mass{0.0, 1e7, "a hop amount", true};  // up to 10 t
inline constexpr Bounds stock_mass{0.0, 1e8, "an amount on hand"};
inline constexpr Bounds batch_volume{0.0, 1e6, "batch volume", true};  // up to 10,000 hL
inline constexpr Bounds gravity{1.0, 1.2, "original gravity"};
inline constexpr Bounds boil_time{0.0, 600.0, "boil time"};
inline constexpr Bounds addition_time{0.0, 60.0 * 24.0 * 60.0, "an addition time"};  // up to 60 days
inline constexpr Bounds whirlpool_temperature{20.0, 100.0, "a whirlpool temperature"};
inline constexpr Bounds cooling_constant{0.0, 1.0, "a cooling constant (per minute)", true};  // 1/min: chilled
inline constexpr Bounds ambient_temperature{-20.0, 60.0, "an ambient temperature"};
inline constexpr Bounds storage_temperature{-40.0, 40.0, "a storage temperature"};
inline constexpr Bounds target_ibu{0.0, 200.0, "target IBU"};

// Command-line settings (common practice where not said otherwise).
inline constexpr Bounds late_hop_rate{0.0, 40.0, "a late-hop rate", true};  // very heavy dry hop is 10-20 g/L
inline constexpr Bounds oil_dose{0.0, 100.0, "an oil dose", true};
inline constexpr Bounds share{0.0, 1.0, "a share"};
inline constexpr Bounds axis_weight{0.0, 1.0, "an axis weight"};
inline constexpr Bounds pellet_factor{0.5, 2.0, "the pellet factor"};
inline constexpr Bounds calibration{0.0, 5.0, "a calibration factor", true};
inline constexpr Bounds lab_ibu{0.0, 200.0, "a lab IBU"};
inline constexpr Bounds factor_standard_error{0.0, 5.0, "a factor's standard error"};
inline constexpr Bounds factor_bound{-5.0, 10.0, "a factor's interval bound"};
inline constexpr Bounds degrees_of_freedom{1.0, 1e6, "degrees of freedom"};
inline constexpr Bounds profile_version{1.0, 1e6, "a profile version"};
inline constexpr Bounds alpha_tolerance{0.0, 50.0, "a certificate alpha tolerance (% of the value)"};
inline constexpr Bounds blend_varieties{1.0, 6.0, "varieties in a blend"};
inline constexpr Bounds substitutes_listed{1.0, 100.0, "substitutes listed"};
inline constexpr Bounds stale_below{0.0, 100.0, "a share of the certificate alpha (%)"};
inline constexpr Bounds batches{1.0, 1000.0, "batches"};

}  // namespace bine::limits
