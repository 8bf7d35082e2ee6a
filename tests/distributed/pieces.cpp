// A simplicial complex given in pieces, one per rank (lacuna/distributed/complex_pieces.hpp):
// on any number of ranks, the groups of the union complex must be those of the one-process
// engine on the whole complex, and those of the textbooks. Every test case runs on every rank in
// the same order; checks are made on rank 0, where the result is.
#include <lacuna/distributed/complex_pieces.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/rational.hpp>
#include <lacuna/ring/z2.hpp>

#include <doctest/doctest.h>
#include <mpi.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>
#include <vector>

namespace pieces_test {

using facet_list = std::vector<std::vector<std::string>>;

int this_rank() {
  int r = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &r);
  return r;
}
int rank_count() {
  int n = 1;
  MPI_Comm_size(MPI_COMM_WORLD, &n);
  return n;
}

std::string vertex(int i) { return "v" + std::to_string(i); }

/// The torus (Klein bottle with twist) as a 3 x 3 grid of squares, each cut into two
/// triangles, opposite sides identified: Hatcher, Algebraic Topology (2002), §2.1, the
/// Δ-complex of the torus and the Klein bottle, subdivided so that it is simplicial (from memory).
facet_list grid_surface(bool twist) {
  const auto v = [&](int i, int j) {
    j = ((j % 3) + 3) % 3;
    if (i == 3) {
      i = 0;
      if (twist) j = (3 - j) % 3;
    }
    return vertex(3 * i + j);
  };
  facet_list f;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      f.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      f.push_back({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  return f;
}

/// The six-vertex real projective plane, the antipodal quotient of the icosahedron (Munkres,
/// Elements of Algebraic Topology (1984), §6, the minimal triangulation of P², from memory).
facet_list projective_plane() {
  const int t[10][3] = {{1, 2, 3}, {1, 3, 4}, {1, 4, 5}, {1, 5, 6}, {1, 6, 2},
                        {2, 3, 5}, {3, 4, 6}, {4, 5, 2}, {5, 6, 3}, {6, 2, 4}};
  facet_list f;
  for (const auto& x : t) f.push_back({vertex(x[0]), vertex(x[1]), vertex(x[2])});
  return f;
}

/// S^3 as the boundary of the 4-simplex (Hatcher §2.1: ∂Δ^{n+1} is an n-sphere).
facet_list three_sphere() {
  facet_list f;
  for (int skip = 0; skip < 5; ++skip) {
    std::vector<std::string> s;
    for (int i = 0; i < 5; ++i)
      if (i != skip) s.push_back(vertex(i));
    f.push_back(s);
  }
  return f;
}

/// The Moore space M(Z/3, 1): a disk (centre c, a ring of 9 vertices u_i) whose boundary
/// 9-gon wraps three times around a triangle a_0 a_1 a_2 (Hatcher, Example 2.40, a disk
/// attached by a map of degree m to a circle; H_1 = Z/m). Simplicial: the outer annulus has
/// triangles u_i a_{i mod 3} a_{i+1 mod 3} and u_i u_{i+1} a_{i+1 mod 3}.
facet_list moore_space_3() {
  const auto u = [](int i) { return "u" + std::to_string(((i % 9) + 9) % 9); };
  const auto a = [](int i) { return "a" + std::to_string(((i % 3) + 3) % 3); };
  facet_list f;
  for (int i = 0; i < 9; ++i) {
    f.push_back({"c", u(i), u(i + 1)});
    f.push_back({u(i), a(i), a(i + 1)});
    f.push_back({u(i), u(i + 1), a(i + 1)});
  }
  return f;
}

/// A random complex: `facets` facets of 1..max_size vertices out of n, from `seed`.
facet_list random_complex(unsigned seed, int n, int facets, int max_size) {
  std::mt19937 rng(seed);
  std::uniform_int_distribution<int> size(1, max_size), pick(0, n - 1);
  facet_list f;
  for (int i = 0; i < facets; ++i) {
    std::vector<std::string> s;
    const int m = size(rng);
    while (static_cast<int>(s.size()) < m) {
      const auto v = vertex(pick(rng));
      if (std::find(s.begin(), s.end(), v) == s.end()) s.push_back(v);
    }
    f.push_back(s);
  }
  return f;
}

/// How the facets are dealt to the ranks.
enum class split {
  round_robin,   // facet i to rank i mod n
  blocks,        // contiguous blocks
  overlapping,   // round robin, and every facet also to the next rank
  first_only,    // everything on rank 0, the other pieces empty
  two_pieces,    // two pieces (ranks 0 and 1), the others empty: more ranks than pieces
  three_holders, // round robin, and every facet also to the next two ranks: cells shared by 3
  ends_only,     // round robin over the first and last ranks; the pieces between are empty
};

facet_list my_piece(const facet_list& all, split how) {
  const int r = this_rank(), n = rank_count();
  facet_list mine;
  for (std::size_t i = 0; i < all.size(); ++i) {
    const int to = static_cast<int>(i % static_cast<std::size_t>(n));
    bool take = false;
    switch (how) {
      case split::round_robin: take = to == r; break;
      case split::blocks: take = static_cast<int>(i * static_cast<std::size_t>(n) / all.size()) == r; break;
      case split::overlapping: take = to == r || (to + 1) % n == r; break;
      case split::first_only: take = r == 0; break;
      case split::two_pieces: take = static_cast<int>(i % static_cast<std::size_t>(std::min(n, 2))) == r; break;
      case split::three_holders: take = to == r || (to + 1) % n == r || (to + 2) % n == r; break;
      case split::ends_only: take = (i % 2 == 0) ? r == 0 : r == n - 1; break;
    }
    if (take) mine.push_back(all[i]);
  }
  return mine;
}

const split all_splits[] = {split::round_robin, split::blocks, split::overlapping, split::first_only,
                            split::two_pieces};

/// The groups of the pieces' union over R (rank 0; empty elsewhere), with its cell counts.
template <class R>
lacuna::homology_result<R> in_pieces(const facet_list& all, split how, const R& unit,
                                     lacuna::distributed::pieces_residual* residual = nullptr,
                                     lacuna::homology_options options = {}, bool tree = true) {
  const auto piece = lacuna::distributed::make_piece(MPI_COMM_WORLD, my_piece(all, how));
  return lacuna::distributed::pieces_homology<R>(MPI_COMM_WORLD, piece, options, lacuna::sparse_elimination{}, unit,
                                                 residual, {.reduction_tree = tree});
}

/// On rank 0: the same groups (rank and torsion in every degree) as the one-process engine on
/// the whole complex, and the same cell counts.
template <class R>
void check_against_one_process(const facet_list& all, split how, const R& unit, lacuna::homology_options options = {}) {
  lacuna::distributed::pieces_residual residual;
  const auto h = in_pieces(all, how, unit, &residual, options);
  if (this_rank() != 0) return;
  const auto whole = lacuna::simplicial_complex<std::string>::from_facets(all);
  const auto expected = lacuna::homology<R>(whole, options, lacuna::sparse_elimination{}, unit);
  REQUIRE(h.groups.size() == expected.groups.size());
  for (std::size_t k = 0; k < h.groups.size(); ++k) {
    CAPTURE(k);
    CHECK(h.groups[k].dimension == expected.groups[k].dimension);
    CHECK(h.groups[k].rank == expected.groups[k].rank);
    CHECK(h.groups[k].torsion == expected.groups[k].torsion);
  }
  REQUIRE(residual.cells.size() == static_cast<std::size_t>(whole.top_dimension() + 1));
  for (int k = 0; k <= whole.top_dimension(); ++k) CHECK(residual.cells[static_cast<std::size_t>(k)] == whole.cell_count(k));
}

struct expected_group {
  std::size_t rank;
  std::vector<std::int64_t> torsion;
};

/// On rank 0: the groups over Z are the textbook's.
void check_integral(const lacuna::homology_result<lacuna::integer>& h, const std::vector<expected_group>& want) {
  if (this_rank() != 0) return;
  REQUIRE(h.groups.size() == want.size());
  for (std::size_t k = 0; k < want.size(); ++k) {
    CAPTURE(k);
    CHECK(h.groups[k].rank == want[k].rank);
    std::vector<lacuna::integer> t;
    for (auto x : want[k].torsion) t.emplace_back(x);
    CHECK(h.groups[k].torsion == t);
  }
}

TEST_CASE("pieces: textbook surfaces and S^3 over Z, however the facets are dealt") {
  const lacuna::integer one = lacuna::one<lacuna::integer>();
  for (const auto how : all_splits) {
    CAPTURE(static_cast<int>(how));
    // Hatcher §2.1 (from memory): H(T^2) = Z, Z^2, Z; H(Klein bottle) = Z, Z ⊕ Z/2, 0;
    // H(RP^2) = Z, Z/2, 0; H(S^3) = Z, 0, 0, Z; Example 2.40: H(M(Z/3, 1)) = Z, Z/3, 0.
    check_integral(in_pieces(grid_surface(false), how, one), {{1, {}}, {2, {}}, {1, {}}});
    check_integral(in_pieces(grid_surface(true), how, one), {{1, {}}, {1, {2}}, {0, {}}});
    check_integral(in_pieces(projective_plane(), how, one), {{1, {}}, {0, {2}}, {0, {}}});
    check_integral(in_pieces(three_sphere(), how, one), {{1, {}}, {0, {}}, {0, {}}, {1, {}}});
    check_integral(in_pieces(moore_space_3(), how, one), {{1, {}}, {0, {3}}, {0, {}}});
  }
}

TEST_CASE("pieces: the union's groups equal the one-process engine's, over Z, Q, Z/2, Z/3") {
  for (const auto how : all_splits) {
    CAPTURE(static_cast<int>(how));
    for (const auto& all : {grid_surface(true), projective_plane(), moore_space_3()}) {
      check_against_one_process(all, how, lacuna::one<lacuna::integer>());
      check_against_one_process(all, how, lacuna::one<lacuna::rational>());
      check_against_one_process(all, how, lacuna::one<lacuna::z2>());
      check_against_one_process(all, how, lacuna::mod_p_dynamic(1, 3));
    }
  }
}

TEST_CASE("pieces: random complexes against the one-process engine, reduced homology too") {
  for (unsigned seed = 1; seed <= 12; ++seed) {
    CAPTURE(seed);
    const auto all = random_complex(seed, 9 + static_cast<int>(seed % 4), 14 + static_cast<int>(seed), 5);
    for (const auto how : all_splits) {
      CAPTURE(static_cast<int>(how));
      check_against_one_process(all, how, lacuna::one<lacuna::integer>());
      check_against_one_process(all, how, lacuna::one<lacuna::z2>());
      check_against_one_process(all, how, lacuna::one<lacuna::integer>(), {.reduced = true});
    }
  }
}

TEST_CASE("pieces: a larger complex (the pieces reduce most cells away)") {
  // a 12 x 12 grid torus: the union has 144 vertices; what reaches the root is the shared
  // cells and few private ones
  facet_list f;
  const int n = 12;
  const auto v = [&](int i, int j) { return vertex(((i + n) % n) * n + (j + n) % n); };
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j) {
      f.push_back({v(i, j), v(i + 1, j), v(i + 1, j + 1)});
      f.push_back({v(i, j), v(i, j + 1), v(i + 1, j + 1)});
    }
  lacuna::distributed::pieces_residual residual;
  const auto h = in_pieces(f, split::blocks, lacuna::one<lacuna::integer>(), &residual);
  check_integral(h, {{1, {}}, {2, {}}, {1, {}}});  // Hatcher §2.1, the torus (from memory)
  if (this_rank() == 0) {
    // Euler characteristic of the torus, 0 (Hatcher Theorem 2.44), from the union's counts
    CHECK(residual.cells[0] - residual.cells[1] + residual.cells[2] == 0);
    CHECK(residual.residual_cells < residual.cells[0] + residual.cells[1] + residual.cells[2]);
  }
}

TEST_CASE("pieces: the empty complex, and empty pieces") {
  const auto h = in_pieces(facet_list{}, split::round_robin, lacuna::one<lacuna::integer>());
  if (this_rank() == 0) CHECK(h.groups.empty());
  // a single vertex on the last rank
  const auto piece = lacuna::distributed::make_piece(
      MPI_COMM_WORLD, this_rank() == rank_count() - 1 ? facet_list{{"p"}} : facet_list{});
  const auto g = lacuna::distributed::pieces_homology<lacuna::integer>(MPI_COMM_WORLD, piece);
  check_integral(g, {{1, {}}});
}

TEST_CASE("pieces: a malformed piece file fails on every rank, naming the rank, file and line") {
  const int r = this_rank(), n = rank_count();
  const auto dir = std::filesystem::temp_directory_path();
  // one name for the run: rank 0's process id, shared
  long id = static_cast<long>(::getpid());
  MPI_Bcast(&id, 1, MPI_LONG, 0, MPI_COMM_WORLD);
  const auto file = dir / ("lacuna-pieces-" + std::to_string(id) + "-" + std::to_string(r) + ".facets");
  {
    std::ofstream out(file);
    out << "a b c\n";
    if (r == n - 1) out << "c d c\n";  // a label repeated within one simplex, line 2
  }
  std::string what;
  int failing = -1;
  try {
    lacuna::distributed::read_piece(MPI_COMM_WORLD, file);
  } catch (const lacuna::distributed::distributed_error& e) {
    what = e.what();
    failing = e.failing_rank();
  }
  std::filesystem::remove(file);
  CHECK(failing == n - 1);
  const auto bad = dir / ("lacuna-pieces-" + std::to_string(id) + "-" + std::to_string(n - 1) + ".facets");
  CHECK(what.rfind("lacuna: rank " + std::to_string(n - 1) + " of " + std::to_string(n) + " failed while reading its piece: " +
                       bad.string() + ":2: ",
                   0) == 0);
  CHECK(what.find("is repeated within one simplex") != std::string::npos);
  // a file that does not exist, on rank 0
  failing = -1;
  try {
    lacuna::distributed::read_piece(MPI_COMM_WORLD, r == 0 ? dir / "lacuna-no-such-piece.facets" : std::filesystem::path{});
  } catch (const lacuna::distributed::distributed_error& e) {
    failing = e.failing_rank();
    what = e.message();
  }
  CHECK(failing == 0);
  CHECK(what.find("cannot open the file") != std::string::npos);
}

TEST_CASE("pieces: generators are refused, on every rank") {
  const auto piece = lacuna::distributed::make_piece(MPI_COMM_WORLD, my_piece(projective_plane(), split::round_robin));
  CHECK_THROWS_AS(lacuna::distributed::pieces_homology<lacuna::integer>(MPI_COMM_WORLD, piece, {.generators = true}),
                  lacuna::distributed::distributed_error);
}

// The reduction tree (complex_pieces.hpp): the residuals merged pairwise and reduced again,
// where cells are held by two or three ranks and pieces between are empty.

const split tree_splits[] = {split::round_robin, split::blocks, split::overlapping, split::three_holders,
                             split::ends_only, split::two_pieces};

/// On rank 0: the same groups with the tree on and off.
template <class R>
void check_tree_against_gather(const facet_list& all, split how, const R& unit, lacuna::homology_options options = {}) {
  lacuna::distributed::pieces_residual on, off;
  const auto a = in_pieces(all, how, unit, &on, options, true);
  const auto b = in_pieces(all, how, unit, &off, options, false);
  if (this_rank() != 0) return;
  REQUIRE(a.groups.size() == b.groups.size());
  for (std::size_t k = 0; k < a.groups.size(); ++k) {
    CAPTURE(k);
    CHECK(a.groups[k].rank == b.groups[k].rank);
    CHECK(a.groups[k].torsion == b.groups[k].torsion);
  }
  CHECK(on.cells == off.cells);
  // with two ranks or more the root's last merge covers every rank, so no cell is kept for a
  // rank outside and the re-reduction runs until no unit pair is left (its loop ends only
  // when a pass finds none; int64 overflow cannot occur on these small complexes)
  if (rank_count() > 1)
    for (int k = 1; k <= on.residual.top_dimension(); ++k)
      for (std::size_t i = 0; i < on.residual.cell_count(k); ++i)
        for (const auto& t : on.residual.small_boundary(k, i)) {
          CAPTURE(on.residual.cell_name(k, i));
          CHECK(t.coefficient != 1);
          CHECK(t.coefficient != -1);
        }
}

TEST_CASE("pieces tree: textbook groups when cycles and torsion span several pieces") {
  const lacuna::integer one = lacuna::one<lacuna::integer>();
  for (const auto how : tree_splits) {
    CAPTURE(static_cast<int>(how));
    // Hatcher §2.1 (from memory): H(T^2) = Z, Z^2, Z; H(Klein bottle) = Z, Z ⊕ Z/2, 0;
    // H(RP^2) = Z, Z/2, 0; Example 2.40: H(M(Z/3, 1)) = Z, Z/3, 0.
    for (const bool tree : {true, false}) {
      CAPTURE(tree);
      check_integral(in_pieces(grid_surface(false), how, one, nullptr, {}, tree), {{1, {}}, {2, {}}, {1, {}}});
      check_integral(in_pieces(grid_surface(true), how, one, nullptr, {}, tree), {{1, {}}, {1, {2}}, {0, {}}});
      check_integral(in_pieces(projective_plane(), how, one, nullptr, {}, tree), {{1, {}}, {0, {2}}, {0, {}}});
      check_integral(in_pieces(moore_space_3(), how, one, nullptr, {}, tree), {{1, {}}, {0, {3}}, {0, {}}});
      check_integral(in_pieces(three_sphere(), how, one, nullptr, {}, tree), {{1, {}}, {0, {}}, {0, {}}, {1, {}}});
    }
  }
}

TEST_CASE("pieces tree: the one-process engine's groups, and the same with the tree on and off") {
  for (const auto how : tree_splits) {
    CAPTURE(static_cast<int>(how));
    for (const auto& all : {grid_surface(false), grid_surface(true), projective_plane(), moore_space_3()}) {
      check_against_one_process(all, how, lacuna::one<lacuna::integer>());
      check_against_one_process(all, how, lacuna::mod_p_dynamic(1, 3));
      check_tree_against_gather(all, how, lacuna::one<lacuna::integer>());
      check_tree_against_gather(all, how, lacuna::one<lacuna::z2>());
    }
  }
  for (unsigned seed = 21; seed <= 30; ++seed) {
    CAPTURE(seed);
    const auto all = random_complex(seed, 10 + static_cast<int>(seed % 3), 18, 5);
    for (const auto how : tree_splits) {
      CAPTURE(static_cast<int>(how));
      check_against_one_process(all, how, lacuna::one<lacuna::integer>());
      check_tree_against_gather(all, how, lacuna::one<lacuna::integer>(), {.reduced = true});
    }
  }
}

}  // namespace pieces_test
