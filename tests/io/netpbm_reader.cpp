// Tests of lacuna::io::read_netpbm and write_pgm: P1/P2/P4/P5 images against the same pixels
// given to cubical_complex directly, Euler numbers by hand, the threshold rule, round trips,
// and every kind of malformed input with its line or byte offset — including lying headers,
// which must be refused without a large allocation (checked by counting operator new).
#include <lacuna/io/netpbm.hpp>

#include <doctest/doctest.h>

#include <fstream>
#include <iterator>
#include <random>

#include <algorithm>
#include <cstdlib>
#include <new>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace {
std::size_t largest_allocation = 0;
}

// GCC pairs the inlined free() with the new-expression and warns falsely (-Wmismatched-new-delete)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmismatched-new-delete"
void* operator new(std::size_t n) {
  largest_allocation = std::max(largest_allocation, n);
  if (void* p = std::malloc(n == 0 ? 1 : n)) return p;
  throw std::bad_alloc();
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }
void* operator new(std::size_t n, const std::nothrow_t&) noexcept {
  largest_allocation = std::max(largest_allocation, n);
  return std::malloc(n == 0 ? 1 : n);
}
void operator delete(void* p, const std::nothrow_t&) noexcept { std::free(p); }
#pragma GCC diagnostic pop

namespace io_netpbm_reader_test {

namespace {

const std::string data = std::string(LACUNA_TEST_DATA_DIR) + "/image/";
using lacuna::cubical_complex;
using lacuna::io::image_options;

template <class F>
void expect_parse_error(F&& f, std::size_t line, const std::string& part) {
  try {
    f();
    FAIL("no error; expected: " << part);
  } catch (const lacuna::parse_error& e) {
    CHECK_MESSAGE(e.line() == line, std::string(e.what()));
    CHECK_MESSAGE(e.message().find(part) != std::string::npos, std::string(e.what()));
  }
}

void expect_file_error(const std::string& file, std::size_t line, const std::string& part,
                       const image_options& opt = {}) {
  INFO(file);
  expect_parse_error([&] { (void)lacuna::io::read_netpbm(data + file, opt); }, line, part);
}

std::vector<std::size_t> counts(const cubical_complex<2>& c) { return {c.cell_count(0), c.cell_count(1), c.cell_count(2)}; }

cubical_complex<2> from_string(const std::string& s, const image_options& opt = {}) {
  std::istringstream in(s);
  return lacuna::io::read_netpbm(in, "mem.pgm", opt);
}

// A stream that cannot tell its size, as a pipe.
struct pipe_buf : std::streambuf {
  std::string s;
  explicit pipe_buf(std::string t) : s(std::move(t)) { setg(s.data(), s.data(), s.data() + s.size()); }
};

}  // namespace

TEST_CASE("PBM and PGM files: counts and Euler numbers by hand") {
  const auto ring = lacuna::io::read_netpbm(data + "ring.pbm");
  CHECK(counts(ring) == std::vector<std::size_t>{16, 24, 8});  // 3x3 ring of closed squares
  CHECK(lacuna::euler_characteristic(ring) == 0);              // one component, one hole
  CHECK_FALSE(ring.is_foreground({1, 1}));

  const auto g = lacuna::io::read_netpbm(data + "gradient.pgm");
  CHECK(g.cell_count(2) == 9);  // every sample but the first is non-zero
  CHECK_FALSE(g.is_foreground({0, 0}));
  const auto t = lacuna::io::read_netpbm(data + "gradient.pgm", {.threshold = 5});
  // samples >= 5: the second row, a 5x1 strip: 12 vertices, 16 edges, 5 squares (by hand)
  CHECK(counts(t) == std::vector<std::size_t>{12, 16, 5});
  CHECK(t.is_foreground({0, 1}));
  CHECK_FALSE(t.is_foreground({4, 0}));

  // P4: two rows 1010101010 / 0101010101 — a zigzag joined at corners, no hole
  const auto c = lacuna::io::read_netpbm(data + "checker.pbm");
  CHECK(c.cell_count(2) == 10);
  CHECK(lacuna::euler_characteristic(c) == 1);
  for (std::size_t x = 0; x < 10; ++x) {
    CHECK(c.is_foreground({x, 0}) == (x % 2 == 0));
    CHECK(c.is_foreground({x, 1}) == (x % 2 == 1));
  }
}

TEST_CASE("P5 8- and 16-bit, P2 and P4 from a generator agree with the pixels given directly") {
  std::mt19937 rng(5);
  for (int round = 0; round < 12; ++round) {
    const std::size_t w = 1 + rng() % 19, h = 1 + rng() % 13;
    const unsigned maxval = round % 3 == 0 ? 255 : round % 3 == 1 ? 65535 : 1000;
    std::vector<unsigned> px(w * h);
    for (auto& v : px) v = (rng() % 3 == 0) ? 0 : static_cast<unsigned>(rng() % (maxval + 1));
    const unsigned threshold = maxval / 2;
    std::vector<std::uint8_t> nonzero(w * h), above(w * h);
    for (std::size_t i = 0; i < px.size(); ++i) {
      nonzero[i] = px[i] != 0;
      above[i] = px[i] >= threshold;
    }
    const auto want = cubical_complex<2>::from_bytes({w, h}, nonzero);
    const auto want_t = cubical_complex<2>::from_bytes({w, h}, above);

    std::string p5 = "P5\n# generated\n" + std::to_string(w) + " " + std::to_string(h) + "\n" + std::to_string(maxval) + "\n";
    std::string p2 = "P2\n" + std::to_string(w) + " " + std::to_string(h) + " " + std::to_string(maxval) + "\n";
    for (std::size_t i = 0; i < px.size(); ++i) {
      if (maxval > 255) p5.push_back(static_cast<char>(px[i] >> 8));
      p5.push_back(static_cast<char>(px[i] & 0xff));
      p2 += std::to_string(px[i]) + (i % w == w - 1 ? "\n" : " ");
    }
    std::string p4 = "P4 " + std::to_string(w) + " " + std::to_string(h) + "\n";
    for (std::size_t y = 0; y < h; ++y)
      for (std::size_t b = 0; b < (w + 7) / 8; ++b) {
        unsigned byte = 0;
        for (std::size_t k = 0; k < 8; ++k)
          if (b * 8 + k < w && nonzero[y * w + b * 8 + k]) byte |= 0x80u >> k;
        p4.push_back(static_cast<char>(byte));
      }
    for (const auto* s : {&p5, &p2, &p4}) {
      const auto got = from_string(*s);
      CHECK(counts(got) == counts(want));
      for (std::size_t y = 0; y < h; ++y)
        for (std::size_t x = 0; x < w; ++x) REQUIRE(got.is_foreground({x, y}) == (nonzero[y * w + x] != 0));
    }
    CHECK(counts(from_string(p5, {.threshold = threshold})) == counts(want_t));
    CHECK(counts(from_string(p2, {.threshold = threshold})) == counts(want_t));

    // round trips through the writers
    std::ostringstream out;
    lacuna::io::write_pgm(out, want);
    const auto back = from_string(out.str());
    CHECK(counts(back) == counts(want));
    std::vector<std::uint16_t> samples(px.begin(), px.end());
    std::ostringstream out2;
    lacuna::io::write_pgm(out2, w, h, samples, static_cast<std::uint16_t>(maxval));
    CHECK(out2.str() == p5.substr(0, 3) + p5.substr(p5.find('\n', 3) + 1));  // same bytes, less the comment
  }
}

TEST_CASE("Netpbm: malformed files name their line or byte offset") {
  expect_file_error("bad_magic.pgm", 1, "not a Netpbm image");
  expect_file_error("colour.ppm", 1, "P6 (colour) images are not supported");
  expect_file_error("bad_width.pgm", 2, "bad width '2x'");
  expect_file_error("zero_width.pbm", 2, "the image has no pixels");
  expect_file_error("bad_maxval.pgm", 3, "maxval 70000 is out of range 1..65535");
  expect_file_error("sample_above_maxval.pgm", 5, "sample 11 exceeds maxval 10");
  expect_file_error("bad_pixel.pbm", 4, "bad pixel '2' (PBM pixels are 0 or 1)");
  expect_file_error("truncated_plain.pbm", 2, "the file is too short to hold them");
  expect_file_error("overflow.pgm", 2, "exceeds the limit of");
  expect_file_error("truncated.pgm", 0, "byte offset 21: pixel data truncated: the header promises 16 bytes, the file holds 10");
  expect_file_error("truncated16.pgm", 0, "byte offset 23: pixel data truncated");
  expect_file_error("sample_above_maxval16.pgm", 0, "byte offset 14: sample 1001 exceeds maxval 1000");
  expect_file_error("ring.pbm", 3, "exceeds the limit of 20 grid cells", {.limits = {.max_cells = 20}});
  expect_parse_error([] { (void)from_string("P2\n2 2\n"); }, 3, "the file ends before the maxval");
  expect_parse_error([] { (void)from_string("P2 2 2 9 1 2 # comment\n 3 x"); }, 2, "bad sample 'x'");
  expect_parse_error([] { (void)from_string("P5 2 2 255"); }, 1, "the file ends before the pixel data");
  expect_parse_error([] { (void)from_string(""); }, 1, "not a Netpbm image");
  expect_parse_error([] { (void)lacuna::io::read_netpbm(std::string(data + "missing.pgm")); }, 0, "cannot open");
}

TEST_CASE("Netpbm: a lying header is refused before any large allocation") {
  const image_options open_limits{.limits = {.max_cells = std::uint64_t{1} << 60, .max_bytes = std::uint64_t{1} << 60}};
  // default limits: 10^12 pixels is beyond max_cells
  largest_allocation = 0;
  expect_file_error("lying.pbm", 2, "exceeds the limit of 4294967296 grid cells");
  // with the limits lifted, the file's size gives the lie away
  expect_file_error("lying.pbm", 0, "pixel data truncated: the header promises 125000000000 bytes, the file holds 20", open_limits);
  expect_file_error("huge.pgm", 0, "the header promises 1000000000000 bytes, the file holds 20", open_limits);
  // a stream that cannot tell its size: the bitmap grows only with the data
  pipe_buf buf("P5\n1000000 1000000\n255\n" + std::string(100, '\1'));
  std::istream in(&buf);
  expect_parse_error([&] { (void)lacuna::io::read_netpbm(in, "pipe", open_limits); }, 0, "byte offset 123: pixel data truncated in row 0");
  CHECK(largest_allocation < (std::size_t{1} << 21));
  // a plain image cut short, on a stream that cannot be measured beforehand
  pipe_buf plain("P1\n4 4\n0101\n");
  std::istream pin(&plain);
  expect_parse_error([&] { (void)lacuna::io::read_netpbm(pin, "pipe.pbm"); }, 4, "the file ends after 4 of 16 pixels");  // a row buffer of 1 MB at most, no pixel-sized block
}

namespace {
// Random damage to a valid input: flipped bytes, a cut, an inserted or deleted run (fixed seed).
std::string mutate(const std::string& s, std::mt19937& rng) {
  std::string t = s;
  const int kind = static_cast<int>(rng() % 4);
  if (t.empty()) return "\x01";
  const std::size_t at = rng() % t.size();
  if (kind == 0) {
    for (int i = 0; i < 1 + static_cast<int>(rng() % 4); ++i) t[rng() % t.size()] = static_cast<char>(rng() % 256);
  } else if (kind == 1) {
    t.resize(at);
  } else if (kind == 2) {
    const char* pieces[] = {"9", "99999999999999999999", "-1", " ", "\n", "#", "0", "4294967296", "\n\n", "x"};
    t.insert(at, pieces[rng() % 10]);
  } else {
    t.erase(at, 1 + rng() % 8);
  }
  return t;
}
}  // namespace

TEST_CASE("Netpbm: damaged inputs give a result or a parse_error, nothing else") {
  std::mt19937 rng(2024);
  for (const std::string& path : {data + "ring.pbm", data + "gradient.pgm", data + "checker.pbm", data + "truncated16.pgm"}) {
    std::ifstream f(path, std::ios::binary);
    const std::string original((std::istreambuf_iterator<char>(f)), std::istreambuf_iterator<char>());
    REQUIRE(!original.empty());
    std::size_t errors = 0;
    for (int round = 0; round < 400; ++round) {
      std::istringstream in(mutate(original, rng));
      try {
        (void)lacuna::io::read_netpbm(in, "mutant.pgm");
      } catch (const lacuna::parse_error& e) {
        ++errors;
        CHECK(std::string(e.what()).rfind("mutant.", 0) == 0);  // always names the input
      }  // any other exception, a crash or a hang fails the test
    }
    CHECK(errors > 0);  // the damage is noticed at least sometimes
  }
}

}  // namespace io_netpbm_reader_test
