// lacuna/chain/term.hpp — one term of a sparse vector: an index and the value there.
//
// The one internal type for (index, coefficient): the entries of sparse_matrix columns and of
// the elimination workspace's boundaries (sparse_entry), the chains of one level that the
// elimination log lifts (level_chain), the columns of the field column reductions. Its
// members are `index` and `value` whatever the index counts (a row, a cell, a face).
//
// The public faces stay as they are, because users read their members by name: chain_term
// (`.cell`, `.coefficient`, the terms of a chain<R>), incidence and exact_incidence (`.face`,
// `.coefficient`, the terms a user's complex returns from boundary()). They differ from term
// in those names only; docs/complexes.md says so.
#pragma once

#include <cstdint>

namespace lacuna {

/// A term of a sparse vector: position `index` holds `value`. Index is an unsigned integer
/// type; Value is any regular type (a ring element, an incidence number).
template <class Index, class Value>
struct term {
  /// The position (a row, a cell, a face: local to the vector's level or matrix).
  Index index;
  /// The value there (non-zero in a normalized vector).
  Value value;
  /// Same index and value.
  friend bool operator==(const term&, const term&) = default;
};

}  // namespace lacuna
