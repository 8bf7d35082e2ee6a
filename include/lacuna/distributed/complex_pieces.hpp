// lacuna/distributed/complex_pieces.hpp — the homology of a simplicial complex given in pieces,
// one piece per MPI rank (optional part: needs MPI, target lacuna::distributed).
//
//   read_piece(comm, files [, options])    this rank's .facets file(s) (io/facets.hpp)
//   make_piece(comm, facets)               this rank's piece from a generator's facets
//   reduce_pieces(comm, piece)             the residual chain complex, on the root (rank 0)
//   pieces_homology<R>(comm, piece, ...)   its homology over R, on the root
//
// The complex. Every rank holds a simplicial complex (its piece); labels are global, so the
// complex is the union of the pieces: a simplex may lie in several pieces, and a piece may be
// empty. Every piece is numbered with its vertices in increasing order of their label texts, so
// that each simplex carries the same orientation (increasing labels) on every rank.
//
// Ownership, and why the union is exact. A simplex is *shared* if it lies in two pieces or
// more, *private* to rank r if it lies in piece r only. The cofaces of a private simplex are
// private to the same rank (a coface in piece s contains it, and pieces are closed), so the
// shared simplices form a subcomplex S and the private ones of rank r an upward-closed set P_r;
// the complex is the disjoint union S ∪ P_0 ∪ ... ∪ P_{n-1}. Which simplex is shared is decided
// by hashing: every vertex label, then every simplex whose vertices are all shared, is sent to
// the rank its hash picks, which counts the ranks that sent it (vertex first, since a simplex
// with a private vertex is private).
//
// The reduction. Each rank eliminates pairs (a, b) of its private cells, a a face of b with
// incidence ±1, by Gaussian elimination of the chain complex (Kaczynski, Mrozek & Ślusarek
// 1998, reductions of chain complexes): a and b go, every other coface c of a gets
// ∂c − ⟨∂c, a⟩ ⟨∂b, a⟩ ∂b, and b is dropped from the boundaries of its cofaces. The complex
// left is chain-homotopy equivalent to the one before, over Z and so over every ring. All cells
// touched are private to the rank: the cofaces of a and of b are private to it, and shared
// cells (whose faces are shared) never see a or b; so the eliminations of different ranks
// commute and are done independently. The elimination keeps an augmentation (ε∂c = 0 is kept
// by the update), so reduced homology is kept too. Coefficients are int64 with overflow
// checks: an elimination that would overflow is not done (the pair stays for the engine).
//
// Errors: every step runs as a phase of distributed/collective_error.hpp: bad input, overflow
// or exhaustion on any rank ends the call on every rank with the same distributed_error naming
// the rank, the phase and the message ("FILE:LINE: problem" for a bad piece file).
//
// The reduction tree (pieces_reduce_options::reduction_tree, on by default; the rounds of
// slab_reduction_tree.hpp, root 0, after Lewis & Zomorodian 2014 and Bauer, Kerber &
// Reininghaus 2014). The hashing also gives, for each shared cell, the lowest and the highest
// rank holding it. Each rank's residual is its remaining private cells and every shared cell it
// holds (with its simplicial boundary and holder range). Round s = 0 .. ceil(log2 P) - 1: rank
// v with v mod 2^(s+1) == 0 receives the residual of rank v + 2^s, glues the two by name (a
// cell both hold is kept once) and reduces again the cells private to the group
// [v, min(v + 2^(s+1), P) - 1], with the re-reduction of slab_reduction_tree.hpp
// (residual_reducer: KMS 1998 unit pairs, int64 with every step checked, a step that would
// overflow not done). A shared cell is private to the group iff all its holders lie in it,
// i.e. its lowest and highest holder do (the group is a run of consecutive ranks). A cell held
// outside the group is never paired and its boundary never changes: a step changes only the
// cofaces of the two cells it pairs, both private to the group, while every face of a cell
// held by rank r is held by r too, so no cell held outside is such a coface. A later merge
// thus glues the same cells the other ranks hold. Each merge is a chain-homotopy equivalence over
// Z, as in the first reduction. An empty residual received holds no cell, so nothing becomes
// private by it and the merge is skipped.
//
// The finish. The root's residual (with the tree: its last merge's; without: the shared cells,
// sent once, by the lowest rank holding them, with their simplicial boundaries, and every
// rank's remaining private cells, gathered in one step) is built into a lacuna::cell_list by
// name (a simplex's name is its labels in increasing order) and handed to lacuna::homology. The groups are those of the union complex, proved by the
// chain-homotopy equivalence above and by the engine's own exactness (homology/routes.hpp).
// The cell counts (for the Euler characteristic and the report) are the union's: each rank
// counts its private cells and the shared cells it sends, summed over the ranks.
#pragma once

#include <lacuna/distributed/collective_error.hpp>
#include <lacuna/distributed/slab_reduction_tree.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/homology/homology.hpp>
#include <lacuna/io/facets.hpp>
#include <lacuna/ring/checked.hpp>

#include <mpi.h>

#include <algorithm>
#include <climits>
#include <cstdint>
#include <exception>
#include <filesystem>
#include <functional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <unordered_map>
#include <utility>
#include <vector>

namespace lacuna::distributed {

// ---- pieces -----------------------------------------------------------------------------

/// A piece: a simplicial complex with text labels, numbered in increasing label order.
using piece_complex = simplicial_complex<std::string>;

namespace pieces_detail {

/// The same complex with its vertices numbered in increasing order of their labels, so that
/// the orientation of each simplex (increasing vertex number) is the same on every rank.
inline piece_complex sorted_by_label(const piece_complex& c, std::size_t max_cells) {
  if (std::is_sorted(c.labels().begin(), c.labels().end())) return c;
  std::vector<std::string> labels = c.labels();
  std::sort(labels.begin(), labels.end());
  piece_complex::builder b;
  b.max_cells(max_cells);
  for (const auto& l : labels) b.add_facet(std::vector<std::string>{l});
  for (const auto& [k, i] : c.facets()) {
    std::vector<std::string> f;
    for (const auto v : c.vertices(k, i)) f.push_back(c.label(v));
    b.add_facet(f);
  }
  return std::move(b).finalize();
}

/// 64-bit FNV-1a: the same on every rank and every build (std::hash need not be).
inline std::uint64_t stable_hash(std::string_view s) {
  std::uint64_t h = 14695981039346656037ull;
  for (const char ch : s) {
    h ^= static_cast<unsigned char>(ch);
    h *= 1099511628211ull;
  }
  return h;
}

/// An int count for MPI, or a clear error when the exchange is too big for one message.
inline int message_size(std::size_t n, const char* what) {
  if (n > static_cast<std::size_t>(INT_MAX))
    throw std::length_error(std::string("lacuna: ") + what + " exceeds 2^31 bytes for one rank; run on more ranks");
  return static_cast<int>(n);
}

/// The lowest and the highest rank holding a simplex; {-1, -1} if it is private.
struct holder_range {
  int lowest = -1;
  int highest = -1;
};

/// Who holds each key: for every key of this rank (distinct on the rank, none holding '\n'),
/// the lowest and highest ranks holding it if two ranks or more do, else {-1, -1}. Collective.
inline std::vector<holder_range> shared_holders(MPI_Comm comm, const std::vector<std::string>& keys) {
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  const auto P = static_cast<std::size_t>(size);
  std::vector<std::vector<std::size_t>> sent(P);  // key indices by destination, in order
  std::vector<std::string> out(P);
  std::string failure;
  for (std::size_t i = 0; i < keys.size(); ++i) {
    const auto d = static_cast<std::size_t>(stable_hash(keys[i]) % P);
    sent[d].push_back(i);
    out[d] += keys[i];
    out[d] += '\n';
  }
  std::vector<int> send_counts(P), recv_counts(P), send_at(P), recv_at(P);
  std::string send_buffer;
  collective_phase(comm, "exchanging simplex names", [&] {
    std::size_t total = 0;
    for (std::size_t d = 0; d < P; ++d) {
      send_counts[d] = message_size(out[d].size(), "the exchange of simplex names");
      total += out[d].size();
    }
    message_size(total, "the exchange of simplex names");
  });
  for (std::size_t d = 0; d < P; ++d) {
    send_at[d] = static_cast<int>(send_buffer.size());
    send_buffer += out[d];
    std::string().swap(out[d]);
  }
  MPI_Alltoall(send_counts.data(), 1, MPI_INT, recv_counts.data(), 1, MPI_INT, comm);
  std::size_t received = 0;
  for (std::size_t s = 0; s < P; ++s) received += static_cast<std::size_t>(recv_counts[s]);
  collective_phase(comm, "exchanging simplex names", [&] { message_size(received, "the exchange of simplex names"); });
  for (std::size_t s = 0, at = 0; s < P; ++s) {
    recv_at[s] = static_cast<int>(at);
    at += static_cast<std::size_t>(recv_counts[s]);
  }
  std::string recv_buffer(received, '\0');
  MPI_Alltoallv(send_buffer.data(), send_counts.data(), send_at.data(), MPI_CHAR, recv_buffer.data(),
                recv_counts.data(), recv_at.data(), MPI_CHAR, comm);
  // this rank as the home of the keys hashed to it: how many ranks sent each, and the lowest
  struct tally {
    int ranks = 0;
    int lowest = INT_MAX;
    int highest = -1;
  };
  std::unordered_map<std::string_view, tally> home;
  std::vector<std::vector<std::string_view>> from(P);
  for (std::size_t s = 0; s < P; ++s) {
    std::string_view part(recv_buffer.data() + recv_at[s], static_cast<std::size_t>(recv_counts[s]));
    while (!part.empty()) {
      const auto end = part.find('\n');
      const auto key = part.substr(0, end);
      part.remove_prefix(end + 1);
      from[s].push_back(key);
      auto& t = home[key];
      ++t.ranks;
      t.lowest = std::min(t.lowest, static_cast<int>(s));
      t.highest = std::max(t.highest, static_cast<int>(s));
    }
  }
  std::vector<int> answer_counts(P), answer_at(P), reply_counts(P), reply_at(P);
  std::vector<int> answers;
  for (std::size_t s = 0; s < P; ++s) {
    answer_at[s] = static_cast<int>(answers.size());
    for (const auto key : from[s]) {
      const auto& t = home[key];
      answers.push_back(t.ranks > 1 ? t.lowest : -1);
      answers.push_back(t.ranks > 1 ? t.highest : -1);
    }
    answer_counts[s] = static_cast<int>(2 * from[s].size());
  }
  std::vector<int> replies(2 * keys.size());
  for (std::size_t d = 0, at = 0; d < P; ++d) {
    reply_counts[d] = static_cast<int>(2 * sent[d].size());
    reply_at[d] = static_cast<int>(at);
    at += 2 * sent[d].size();
  }
  MPI_Alltoallv(answers.data(), answer_counts.data(), answer_at.data(), MPI_INT, replies.data(), reply_counts.data(),
                reply_at.data(), MPI_INT, comm);
  std::vector<holder_range> holders(keys.size());
  for (std::size_t d = 0; d < P; ++d)
    for (std::size_t j = 0; j < sent[d].size(); ++j) {
      const auto at = static_cast<std::size_t>(reply_at[d]) + 2 * j;
      holders[sent[d][j]] = {replies[at], replies[at + 1]};
    }
  return holders;
}

/// One term of a boundary: a (k-1)-cell of the piece and its coefficient.
struct term {
  std::uint32_t face;
  std::int64_t coefficient;
};

/// ∂c − λ ∂b on sorted term lists; false (and c unchanged) if a coefficient would overflow.
inline bool subtract_multiple(std::vector<term>& c, std::int64_t lambda, const std::vector<term>& b) {
  std::vector<term> r;
  r.reserve(c.size() + b.size());
  std::size_t i = 0, j = 0;
  while (i < c.size() || j < b.size()) {
    if (j == b.size() || (i < c.size() && c[i].face < b[j].face)) {
      r.push_back(c[i++]);
      continue;
    }
    std::int64_t m = 0;
    if (lacuna::checked_mul(lambda, b[j].coefficient, m) || m == INT64_MIN) return false;
    std::int64_t x = -m;
    if (i < c.size() && c[i].face == b[j].face) {
      if (lacuna::checked_add(c[i].coefficient, -m, x)) return false;
      ++i;
    }
    if (x != 0) r.push_back({b[j].face, x});
    ++j;
  }
  c = std::move(r);
  return true;
}

inline std::int64_t coefficient_of(const std::vector<term>& c, std::uint32_t face) {
  const auto it = std::lower_bound(c.begin(), c.end(), face, [](const term& t, std::uint32_t f) { return t.face < f; });
  return it != c.end() && it->face == face ? it->coefficient : 0;
}

inline void erase_face(std::vector<term>& c, std::uint32_t face) {
  const auto it = std::lower_bound(c.begin(), c.end(), face, [](const term& t, std::uint32_t f) { return t.face < f; });
  if (it != c.end() && it->face == face) c.erase(it);
}

/// One record of a residual in text: dimension, name, holder range, boundary (coefficient,
/// face name). Written as lines "k", "name", "lowest highest", "n", then n lines "c face".
struct record {
  std::size_t k = 0;
  std::string_view name;
  holder_range holders;
  std::vector<std::pair<std::int64_t, std::string_view>> terms;
};

inline void write_record(std::string& out, std::size_t k, std::string_view name, holder_range h) {
  out += std::to_string(k);
  out += '\n';
  out += name;
  out += '\n';
  out += std::to_string(h.lowest) + ' ' + std::to_string(h.highest) + '\n';
}

/// The records of `text` (views into it).
inline std::vector<record> parse_records(std::string_view rest) {
  std::vector<record> out;
  const auto line = [&rest] {
    const auto end = rest.find('\n');
    if (end == std::string_view::npos) throw std::runtime_error("lacuna: a residual record is cut short");
    const auto l = rest.substr(0, end);
    rest.remove_prefix(end + 1);
    return l;
  };
  const auto number = [](std::string_view s) { return std::stoll(std::string(s)); };
  while (!rest.empty()) {
    record r;
    r.k = static_cast<std::size_t>(number(line()));
    r.name = line();
    const auto h = line();
    const auto space = h.find(' ');
    r.holders = {static_cast<int>(number(h.substr(0, space))), static_cast<int>(number(h.substr(space + 1)))};
    const auto n = static_cast<std::size_t>(number(line()));
    for (std::size_t j = 0; j < n; ++j) {
      const auto l = line();
      const auto sp = l.find(' ');
      r.terms.emplace_back(number(l.substr(0, sp)), l.substr(sp + 1));
    }
    out.push_back(std::move(r));
  }
  return out;
}

/// A merge of the reduction tree: the residual records `text` of the ranks [lo, hi] (a cell
/// held twice is kept once) reduced again by the re-reduction of slab_reduction_tree.hpp
/// (Kaczynski–Mrozek–Ślusarek unit pairs, int64 with overflow checks), keeping every cell a
/// rank outside [lo, hi] holds (a shared cell with a holder below lo or above hi). Such a
/// cell's faces are held by the same ranks, so they are kept too and its boundary is never
/// changed: the ranks outside still see it as it is (the argument of the file comment).
inline std::string merge_records(const std::string& text, int lo, int hi, int top) {
  const auto records = parse_records(text);
  std::unordered_map<std::string_view, std::uint64_t> id;
  std::vector<const record*> cell;  // by id
  for (const auto& r : records)
    if (id.emplace(r.name, cell.size()).second) cell.push_back(&r);
  std::vector<std::int64_t> words;
  for (std::size_t i = 0; i < cell.size(); ++i) {
    const auto& r = *cell[i];
    words.push_back(static_cast<std::int64_t>(r.k));
    words.push_back(static_cast<std::int64_t>(i));
    words.push_back(0);
    words.push_back(static_cast<std::int64_t>(r.terms.size()));
    for (const auto& [c, f] : r.terms) {
      const auto it = id.find(f);
      if (it == id.end())
        throw std::logic_error("lacuna: reduce_pieces: the face '" + std::string(f) + "' of '" + std::string(r.name) +
                               "' reached no residual of the merge (please report this)");
      words.push_back(static_cast<std::int64_t>(it->second));
      words.push_back(c);
    }
  }
  lacuna::distributed::detail::residual_reducer red(
      words,
      [&](std::uint64_t i) {
        const auto h = cell[static_cast<std::size_t>(i)]->holders;
        return h.lowest >= 0 && (h.lowest < lo || h.highest > hi);
      },
      top);
  red.reduce();
  std::vector<std::int64_t> left;
  red.write(left);
  std::string out;
  lacuna::distributed::detail::for_each_record(
      left,
      [&](std::size_t at) {
        const auto& r = *cell[static_cast<std::size_t>(left[at + 1])];
        write_record(out, r.k, r.name, r.holders);
        const auto n = static_cast<std::size_t>(left[at + 3]);
        out += std::to_string(n) + '\n';
        for (std::size_t t = 0; t < n; ++t)
          out += std::to_string(left[at + 5 + 2 * t]) + ' ' + std::string(cell[static_cast<std::size_t>(left[at + 4 + 2 * t])]->name) + '\n';
      },
      top);
  return out;
}

}  // namespace pieces_detail

/// Limits and choices of the piece readers.
struct piece_options {
  /// The limits of the .facets reader (io/facets.hpp), per piece.
  io::facets_read_options read = {};
};

/// This rank's piece: the union of the .facets files `files` (io/facets.hpp; none: an empty
/// piece). Collective: if any rank's file is missing or malformed, every rank throws
/// distributed_error naming that rank, the file, the line and the problem.
inline piece_complex read_piece(MPI_Comm comm, const std::vector<std::filesystem::path>& files,
                                const piece_options& options = {}) {
  return collective_phase(comm, "reading its piece", [&] {
    if (files.empty()) return piece_complex{};
    if (files.size() == 1) return pieces_detail::sorted_by_label(io::read_facets(files[0], options.read), options.read.max_cells);
    piece_complex::builder b;
    b.max_cells(options.read.max_cells);
    for (const auto& f : files) {
      const auto c = io::read_facets(f, options.read);
      for (const auto& [k, i] : c.facets()) {
        std::vector<std::string> labels;
        for (const auto v : c.vertices(k, i)) labels.push_back(c.label(v));
        b.add_facet(labels);
      }
    }
    return pieces_detail::sorted_by_label(std::move(b).finalize(), options.read.max_cells);
  });
}

/// This rank's piece from the one .facets file at `path` (an empty path: an empty piece).
inline piece_complex read_piece(MPI_Comm comm, const std::filesystem::path& path, const piece_options& options = {}) {
  return read_piece(comm, path.empty() ? std::vector<std::filesystem::path>{} : std::vector<std::filesystem::path>{path},
                    options);
}

/// This rank's piece from facets a generator made (each a range of labels), collectively:
/// a bad facet on any rank throws distributed_error on every rank.
template <class Facets>
piece_complex make_piece(MPI_Comm comm, Facets&& facets, const piece_options& options = {}) {
  piece_complex piece;
  collective_phase(comm, "building its piece", [&] {
    piece_complex::builder b;
    b.max_cells(options.read.max_cells);
    for (auto&& f : facets) {
      std::vector<std::string> labels;
      for (auto&& l : f) labels.push_back(lacuna::detail::label_to_string(l));
      b.add_facet(labels);
    }
    piece = pieces_detail::sorted_by_label(std::move(b).finalize(), options.read.max_cells);
  });
  return piece;
}

/// How reduce_pieces merges the residuals.
struct pieces_reduce_options {
  /// true: merge the residuals pairwise in a reduction tree, reducing again at each merge;
  /// false: gather them on the root in one step (the engine reduces the rest).
  bool reduction_tree = true;
};

/// What reduce_pieces leaves: the residual complex (on the root; empty elsewhere) and the cell
/// counts of the union complex (on every rank).
struct pieces_residual {
  /// The shared cells and every rank's remaining private cells, named by their labels in
  /// increasing order; chain-homotopy equivalent to the union complex. Root only.
  cell_list residual;
  /// The number of k-simplices of the union complex, k = 0 .. its top dimension.
  std::vector<std::uint64_t> cells;
  /// The cells each rank left, summed over the ranks (the residual's size).
  std::uint64_t residual_cells = 0;
};

/// Reduces the union of the pieces (one per rank of comm) to a residual complex on rank 0; see
/// the top of this header. `piece` must be numbered in label order (read_piece and make_piece
/// do that). Collective; errors are distributed_error on every rank.
inline pieces_residual reduce_pieces(MPI_Comm comm, const piece_complex& piece, const pieces_reduce_options& options = {}) {
  using pieces_detail::term;
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  collective_phase(comm, "checking its piece", [&] {
    if (!std::is_sorted(piece.labels().begin(), piece.labels().end()))
      throw std::invalid_argument("lacuna: reduce_pieces: the piece is not numbered in label order (use read_piece or make_piece)");
  });
  int top = piece.top_dimension(), global_top = -1;
  MPI_Allreduce(&top, &global_top, 1, MPI_INT, MPI_MAX, comm);
  const auto dims = static_cast<std::size_t>(top + 1);
  // holder[k][i]: the lowest rank holding the simplex if it is shared, else -1; range[k][i]:
  // the lowest and highest
  std::vector<std::vector<int>> holder(dims);
  std::vector<std::vector<pieces_detail::holder_range>> range(dims);
  {
    std::vector<std::string> keys(piece.labels());
    if (dims > 0) range[0] = pieces_detail::shared_holders(comm, keys);
    else pieces_detail::shared_holders(comm, {});
    if (dims > 0)
      for (const auto& h : range[0]) holder[0].push_back(h.lowest);
    for (std::size_t k = 1; k < static_cast<std::size_t>(global_top + 1); ++k) {
      keys.clear();
      std::vector<std::size_t> asked;
      if (k < dims) {
        holder[k].assign(piece.cell_count(static_cast<int>(k)), -1);
        range[k].assign(piece.cell_count(static_cast<int>(k)), {});
        for (std::size_t i = 0; i < holder[k].size(); ++i) {
          const auto vs = piece.vertices(static_cast<int>(k), i);
          if (std::all_of(vs.begin(), vs.end(), [&](auto v) { return holder[0][v] >= 0; })) {
            asked.push_back(i);
            keys.push_back(piece.cell_name(static_cast<int>(k), i));
          }
        }
      }
      const auto h = pieces_detail::shared_holders(comm, keys);  // every rank, every dimension
      for (std::size_t j = 0; j < asked.size(); ++j) {
        holder[k][asked[j]] = h[j].lowest;
        range[k][asked[j]] = h[j];
      }
    }
  }
  pieces_residual out;
  std::string records;  // this rank's cells (pieces_detail::record)
  std::vector<std::uint64_t> counted(static_cast<std::size_t>(global_top + 1), 0);
  collective_phase(comm, "reducing its piece", [&] {
    // private cells: boundaries (private and shared faces), cofaces among private cells
    std::vector<std::vector<std::vector<term>>> bd(dims);
    std::vector<std::vector<std::vector<std::uint32_t>>> cob(dims);
    std::vector<std::vector<char>> alive(dims);
    for (std::size_t k = 0; k < dims; ++k) {
      const auto n = piece.cell_count(static_cast<int>(k));
      bd[k].resize(n);
      cob[k].resize(n);
      alive[k].resize(n);
      for (std::size_t i = 0; i < n; ++i) alive[k][i] = holder[k][i] < 0;
    }
    for (std::size_t k = 1; k < dims; ++k)
      for (std::size_t i = 0; i < bd[k].size(); ++i) {
        if (!alive[k][i]) continue;
        for (const auto& t : piece.boundary(static_cast<int>(k), i)) {
          bd[k][i].push_back({static_cast<std::uint32_t>(t.face), t.coefficient});
          if (alive[k - 1][t.face]) cob[k - 1][t.face].push_back(static_cast<std::uint32_t>(i));
        }
        std::sort(bd[k][i].begin(), bd[k][i].end(), [](const term& a, const term& b) { return a.face < b.face; });
      }
    // Gaussian elimination of unit pairs (a, b), both private; a chosen among the faces of b
    // with the fewest cofaces, to keep the fill small.
    for (std::size_t k = 1; k < dims; ++k)
      for (std::size_t b = 0; b < bd[k].size(); ++b) {
        if (!alive[k][b]) continue;
        std::uint32_t a = 0;
        std::size_t best = SIZE_MAX;
        for (const auto& t : bd[k][b])
          if ((t.coefficient == 1 || t.coefficient == -1) && holder[k - 1][t.face] < 0 && alive[k - 1][t.face] &&
              cob[k - 1][t.face].size() < best) {
            best = cob[k - 1][t.face].size();
            a = t.face;
          }
        if (best == SIZE_MAX) continue;
        const std::int64_t u = pieces_detail::coefficient_of(bd[k][b], a);  // ±1, its own inverse
        auto& co = cob[k - 1][a];
        std::sort(co.begin(), co.end());
        co.erase(std::unique(co.begin(), co.end()), co.end());
        // the updates first, committed only if none overflows
        std::vector<std::pair<std::uint32_t, std::vector<term>>> updated;
        bool fits = true;
        for (const auto c : co) {
          if (c == b || !alive[k][c]) continue;
          const std::int64_t lambda = pieces_detail::coefficient_of(bd[k][c], a);
          if (lambda == 0) continue;
          auto next = bd[k][c];
          std::int64_t factor = 0;
          if (lacuna::checked_mul(lambda, u, factor) || !pieces_detail::subtract_multiple(next, factor, bd[k][b])) {
            fits = false;
            break;
          }
          updated.emplace_back(c, std::move(next));
        }
        if (!fits) continue;
        for (auto& [c, next] : updated) {
          for (const auto& t : next)
            if (alive[k - 1][t.face] && pieces_detail::coefficient_of(bd[k][c], t.face) == 0)
              cob[k - 1][t.face].push_back(c);
          bd[k][c] = std::move(next);
        }
        if (k + 1 < dims)
          for (const auto d : cob[k][b])
            if (alive[k + 1][d]) pieces_detail::erase_face(bd[k + 1][d], static_cast<std::uint32_t>(b));
        alive[k][b] = 0;
        alive[k - 1][a] = 0;
        std::vector<term>().swap(bd[k][b]);
        std::vector<std::uint32_t>().swap(co);
      }
    // what this rank sends: its remaining private cells and the shared cells it holds first
    // (with the tree: every shared cell it holds; the merges keep each once)
    for (std::size_t k = 0; k < dims; ++k)
      for (std::size_t i = 0; i < bd[k].size(); ++i) {
        const bool shared = holder[k][i] >= 0;
        const bool first = !shared || holder[k][i] == rank;
        if (first) ++counted[k];
        if (!shared && !alive[k][i]) continue;
        if (!first && !options.reduction_tree) continue;
        if (first) ++out.residual_cells;
        pieces_detail::write_record(records, k, piece.cell_name(static_cast<int>(k), i), range[k][i]);
        if (shared) {
          const auto sb = piece.boundary(static_cast<int>(k), i);
          records += std::to_string(sb.size()) + '\n';
          for (const auto& t : sb)
            records += std::to_string(t.coefficient) + ' ' + piece.cell_name(static_cast<int>(k) - 1, t.face) + '\n';
        } else {
          records += std::to_string(bd[k][i].size()) + '\n';
          for (const auto& t : bd[k][i])
            records += std::to_string(t.coefficient) + ' ' + piece.cell_name(static_cast<int>(k) - 1, t.face) + '\n';
        }
      }
    pieces_detail::message_size(records.size(), "the residual complex");
  });
  out.cells.assign(counted.size(), 0);
  MPI_Allreduce(counted.data(), out.cells.data(), static_cast<int>(counted.size()), MPI_UINT64_T, MPI_SUM, comm);
  std::uint64_t left = out.residual_cells;
  MPI_Allreduce(&left, &out.residual_cells, 1, MPI_UINT64_T, MPI_SUM, comm);
  std::string all;
  if (options.reduction_tree) {
    // the reduction tree (the rounds of slab_reduction_tree.hpp, root 0): at round s the rank
    // v with v mod 2^(s+1) == 0 receives the residual of v + 2^s and merges the two, its group
    // becoming the ranks [v, min(v + 2^(s+1), size) - 1]
    for (int step = 1; step < size; step *= 2) {
      const bool sender = rank % (2 * step) == step;
      const bool receiver = rank % (2 * step) == 0 && rank + step < size;
      const int partner = sender ? rank - step : rank + step;
      std::uint64_t count = records.size();
      collective_phase(comm, "sending its residual up the reduction tree", [&] {
        if (sender) pieces_detail::message_size(records.size(), "the residual complex sent up the reduction tree");
      });
      if (sender) check_mpi(MPI_Send(&count, 1, MPI_UINT64_T, partner, 0, comm), "MPI_Send (residual size)");
      if (receiver) check_mpi(MPI_Recv(&count, 1, MPI_UINT64_T, partner, 0, comm, MPI_STATUS_IGNORE), "MPI_Recv (residual size)");
      std::string child;
      collective_phase(comm, "receiving a residual in the reduction tree", [&] {
        if (receiver) child.resize(static_cast<std::size_t>(count));
      });
      if (sender) {
        check_mpi(MPI_Send(records.data(), static_cast<int>(count), MPI_CHAR, partner, 1, comm), "MPI_Send (residual)");
        std::string().swap(records);
      }
      if (receiver)
        check_mpi(MPI_Recv(child.data(), static_cast<int>(count), MPI_CHAR, partner, 1, comm, MPI_STATUS_IGNORE), "MPI_Recv (residual)");
      collective_phase(comm, "merging residuals in the reduction tree", [&] {
        // an empty child holds no cell, so no cell of this group becomes private by the merge
        if (!receiver || child.empty()) return;
        records += child;
        std::string().swap(child);
        records = pieces_detail::merge_records(records, rank, std::min(rank + 2 * step, size) - 1, global_top);
      });
    }
    if (rank == 0) all = std::move(records);
  } else {
  // the gather to the root
  const int mine = static_cast<int>(records.size());
  std::vector<int> lengths(static_cast<std::size_t>(size)), at(static_cast<std::size_t>(size));
  MPI_Gather(&mine, 1, MPI_INT, lengths.data(), 1, MPI_INT, 0, comm);
  std::size_t total = 0;
  if (rank == 0)
    for (std::size_t s = 0; s < lengths.size(); ++s) {
      at[s] = static_cast<int>(std::min<std::size_t>(total, INT_MAX));
      total += static_cast<std::size_t>(lengths[s]);
    }
  collective_phase(comm, "gathering the residual complexes", [&] { pieces_detail::message_size(total, "the residual complex gathered on rank 0"); });
  all.assign(rank == 0 ? total : 0, '\0');
  MPI_Gatherv(records.data(), mine, MPI_CHAR, all.data(), lengths.data(), at.data(), MPI_CHAR, 0, comm);
  }
  collective_phase(comm, "gluing the residual complexes", [&] {
    if (rank != 0) return;
    // records by dimension, then cells added dimension by dimension (faces first)
    std::vector<std::vector<pieces_detail::record>> by_dim(static_cast<std::size_t>(global_top + 1));
    for (auto& r : pieces_detail::parse_records(all)) by_dim.at(r.k).push_back(std::move(r));
    std::unordered_map<std::string_view, std::size_t> below, here;
    for (std::size_t k = 0; k < by_dim.size(); ++k) {
      here.clear();
      for (const auto& r : by_dim[k]) {
        std::vector<incidence> terms;
        for (const auto& [c, f] : r.terms) {
          const auto it = below.find(f);
          if (it == below.end())
            throw std::logic_error("lacuna: reduce_pieces: the face '" + std::string(f) + "' of '" + std::string(r.name) +
                                   "' reached no rank's residual (please report this)");
          terms.push_back({it->second, c});
        }
        here.emplace(r.name, out.residual.add_cell(static_cast<int>(k), std::string(r.name), std::move(terms)));
      }
      below.swap(here);
    }
  });
  return out;
}

/// The homology over R of the union of the pieces, on rank 0 (other ranks: an empty result):
/// the residual of reduce_pieces handed to lacuna::homology, with zero groups added up to the
/// union's top dimension (cells the reduction removed entirely). Generators are not offered
/// (options.generators is refused): they would be cycles of the residual, not of the union.
/// `residual`, if given, receives the residual's cell counts and the union's. Collective.
template <euclidean_domain R, homology_algorithm Algorithm = sparse_elimination>
homology_result<R> pieces_homology(MPI_Comm comm, const piece_complex& piece, homology_options options = {},
                                   const Algorithm& algorithm = {}, const R& ring_one = one<R>(),
                                   pieces_residual* residual = nullptr, const pieces_reduce_options& reduce = {}) {
  int rank = 0;
  MPI_Comm_rank(comm, &rank);
  collective_phase(comm, "checking the options", [&] {
    if (options.generators || options.witnesses || options.keep_basis.value_or(false))
      throw std::invalid_argument("lacuna: generators are not offered for a complex in pieces");
  });
  auto r = reduce_pieces(comm, piece, reduce);
  homology_result<R> h;
  collective_phase(comm, "computing the homology of the residual complex", [&] {
    if (rank != 0) return;
    h = lacuna::homology<R>(r.residual, options, algorithm, ring_one);
    for (int k = static_cast<int>(h.groups.size()); k < static_cast<int>(r.cells.size()); ++k) {
      homology_group<R> g;
      g.dimension = k;
      h.groups.push_back(std::move(g));
    }
  });
  if (residual) *residual = std::move(r);
  return h;
}

}  // namespace lacuna::distributed
