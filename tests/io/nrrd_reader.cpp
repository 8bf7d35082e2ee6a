// Tests of lacuna::io::read_nrrd and write_nrrd: volumes of every accepted sample type, byte
// order and encoding against the same voxels given to cubical_complex directly; the hollow cube
// (chi = 2: one component, one cavity); and every kind of malformed input with its line or byte
// offset — including a hostile 100-byte header claiming 10^12 voxels, which must be refused
// without a large allocation (checked by counting operator new).
#include <lacuna/io/nrrd.hpp>

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

namespace io_nrrd_reader_test {

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
  expect_parse_error([&] { (void)lacuna::io::read_nrrd(data + file, opt); }, line, part);
}

template <std::size_t D>
std::vector<std::size_t> counts(const cubical_complex<D>& c) {
  std::vector<std::size_t> v;
  for (int k = 0; k <= static_cast<int>(D); ++k) v.push_back(c.cell_count(k));
  return v;
}

struct pipe_buf : std::streambuf {
  std::string s;
  explicit pipe_buf(std::string t) : s(std::move(t)) { setg(s.data(), s.data(), s.data() + s.size()); }
};

#ifdef LACUNA_NRRD_GZIP
std::string gzip(const std::string& raw) {
  z_stream zs{};
  REQUIRE(deflateInit2(&zs, 6, Z_DEFLATED, 15 + 16, 8, Z_DEFAULT_STRATEGY) == Z_OK);
  std::string out(deflateBound(&zs, raw.size()) + 32, '\0');
  zs.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(raw.data()));
  zs.avail_in = static_cast<uInt>(raw.size());
  zs.next_out = reinterpret_cast<Bytef*>(out.data());
  zs.avail_out = static_cast<uInt>(out.size());
  REQUIRE(deflate(&zs, Z_FINISH) == Z_STREAM_END);
  out.resize(zs.total_out);
  deflateEnd(&zs);
  return out;
}
#endif

}  // namespace

TEST_CASE("NRRD: the hollow 3x3x3 cube, raw and gzip") {
  const auto c = lacuna::io::read_nrrd(data + "hollow.nrrd");
  CHECK(counts(c) == std::vector<std::size_t>{64, 144, 108, 26});  // by hand: the full block less one open cube
  CHECK(lacuna::euler_characteristic(c) == 2);                     // 1 component - 0 tunnels + 1 cavity
#ifdef LACUNA_NRRD_GZIP
  const auto g = lacuna::io::read_nrrd(data + "hollow_gz.nrrd");
  CHECK(counts(g) == counts(c));
#else
  expect_file_error("hollow_gz.nrrd", 0, "gzip-encoded data needs zlib");
#endif
}

TEST_CASE("NRRD: generated volumes of every sample type, byte order and encoding") {
  std::mt19937 rng(3);
  const char* types[] = {"uint8", "unsigned char", "int8", "uint16", "ushort", "int16", "short"};
  for (int round = 0; round < 28; ++round) {
    const std::string type = types[round % 7];
    const bool wide = type == "uint16" || type == "ushort" || type == "int16" || type == "short";
    const bool is_signed = type == "int8" || type == "int16" || type == "short";
    const bool big = round % 2 == 0;
    const bool two_d = round % 5 == 0;
    const std::array<std::size_t, 3> n{1 + rng() % 9, 1 + rng() % 7, two_d ? 1 : 1 + rng() % 6};
    const std::size_t total = n[0] * n[1] * n[2];
    std::vector<long> samples(total);
    for (auto& v : samples) {
      const long range = wide ? 65536 : 256;
      v = (rng() % 3 == 0) ? 0 : static_cast<long>(rng() % range) - (is_signed ? range / 2 : 0);
    }
    const long threshold = is_signed ? -5 : (wide ? 30000 : 100);
    std::vector<std::uint8_t> nonzero(total), above(total);
    for (std::size_t i = 0; i < total; ++i) {
      nonzero[i] = samples[i] != 0;
      above[i] = samples[i] >= threshold;
    }
    std::string payload;
    for (long v : samples) {
      const auto u = static_cast<std::uint16_t>(v);
      if (!wide) payload.push_back(static_cast<char>(u & 0xff));
      else if (big) payload += {static_cast<char>(u >> 8), static_cast<char>(u & 0xff)};
      else payload += {static_cast<char>(u & 0xff), static_cast<char>(u >> 8)};
    }
    std::string header = "NRRD0005\ntype: " + type + "\ndimension: " + (two_d ? "2" : "3") + "\nsizes: " +
                         std::to_string(n[0]) + " " + std::to_string(n[1]) + (two_d ? "" : " " + std::to_string(n[2])) +
                         "\n" + (wide ? (big ? "endian: big\n" : "endian: little\n") : "") + "space dimension: 3\n";
    std::vector<std::string> files{header + "encoding: raw\n\n" + payload};
#ifdef LACUNA_NRRD_GZIP
    files.push_back(header + "encoding: gzip\n\n" + gzip(payload));
#endif
    for (const auto& f : files) {
      INFO(round << " " << type);
      std::istringstream in(f), in2(f);
      const auto got = lacuna::io::read_nrrd(in, "mem.nrrd");
      CHECK(counts(got) == counts(cubical_complex<3>::from_bytes(n, nonzero)));
      CHECK(got.extents() == n);
      const auto got_t = lacuna::io::read_nrrd(in2, "mem.nrrd", {.threshold = threshold});
      CHECK(counts(got_t) == counts(cubical_complex<3>::from_bytes(n, above)));
      if (two_d) {  // a 2D file read as an image
        std::istringstream in3(f);
        const auto img = lacuna::io::read_nrrd<2>(in3, "mem.nrrd");
        CHECK(counts(img) == counts(cubical_complex<2>::from_bytes({n[0], n[1]}, nonzero)));
      }
    }
  }
}

TEST_CASE("NRRD: writers round-trip") {
  std::mt19937 rng(9);
  const std::array<std::size_t, 3> n{5, 4, 3};
  std::vector<std::uint8_t> vox(60);
  for (auto& v : vox) v = rng() % 2;
  const auto c = cubical_complex<3>::from_bytes(n, vox);
  std::stringstream s;
  lacuna::io::write_nrrd(s, c);
  const auto back = lacuna::io::read_nrrd(s, "round.nrrd");
  CHECK(counts(back) == counts(c));
  for (std::size_t i = 0; i < 60; ++i) CHECK(back.is_foreground({i % 5, i / 5 % 4, i / 20}) == (vox[i] != 0));
  std::vector<std::uint16_t> samples(60);
  for (std::size_t i = 0; i < 60; ++i) samples[i] = vox[i] ? static_cast<std::uint16_t>(300 + i) : 0;
  for (bool big : {false, true}) {
    std::stringstream t;
    const std::array<std::size_t, 3> sz{5, 4, 3};
    lacuna::io::write_nrrd(t, sz, samples, big);
    CHECK(counts(lacuna::io::read_nrrd(t, "samples.nrrd")) == counts(c));
  }
}

TEST_CASE("NRRD: malformed files name their line or byte offset") {
  expect_file_error("bad_magic.nrrd", 1, "not a NRRD file");
  expect_file_error("truncated.nrrd", 0, "byte offset 92: data truncated: the sizes need 27 bytes, the file holds 20 after the header");
  expect_file_error("lying_header.nrrd", 5, "a volume of 1000000000000 voxels exceeds the limit of 4294967296 grid cells");
  expect_file_error("overflow.nrrd", 5, "the sizes overflow");
  expect_file_error("bad_size.nrrd", 5, "bad size '-3'");
  expect_file_error("sizes_mismatch.nrrd", 5, "2 sizes for dimension 3");
  expect_file_error("bad_type.nrrd", 3, "type 'float' is not supported");
  expect_file_error("no_endian.nrrd", 7, "the header has no 'endian' field");
  expect_file_error("detached.nrrd", 7, "detached data ('data file') is not supported");
  expect_file_error("no_blank_line.nrrd", 5, "the header does not end with an empty line");
  expect_file_error("extra_data.nrrd", 0, "byte offset 90: more data than the sizes describe (18 bytes)");
  expect_file_error("duplicate_field.nrrd", 5, "field 'type' given twice");
  expect_file_error("ascii.nrrd", 6, "encoding 'ascii' is not supported");
  expect_file_error("hollow.nrrd", 5, "exceeds the limit of 100 grid cells", {.limits = {.max_cells = 100}});
#ifdef LACUNA_NRRD_GZIP
  expect_file_error("gzip_garbage.nrrd", 0, "gzip data corrupt");
  expect_file_error("gzip_truncated.nrrd", 0, "gzip data truncated");
#else
  expect_file_error("gzip_garbage.nrrd", 0, "gzip-encoded data needs zlib");
#endif
  expect_parse_error([] {
    std::istringstream in("NRRD0004\ntype: uint8\ndimension: 3\nsizes: 2 2 2\nencoding: raw\n\n" + std::string(8, '\1'));
    (void)lacuna::io::read_nrrd<2>(in, "vol.nrrd");
  }, 3, "dimension 3 is not supported here (at most 2)");
  expect_parse_error([] {
    std::istringstream in("NRRD0004\ntype: uint8\nnot a field\n");
    (void)lacuna::io::read_nrrd(in, "x.nrrd");
  }, 3, "expected 'field: value'");
  expect_parse_error([] {
    std::istringstream in("NRRD0004\ntype: uint8\ndimension: 1\nsizes: 4\nencoding: raw\nendian: middle\n\n");
    (void)lacuna::io::read_nrrd(in, "x.nrrd");
  }, 6, "bad endian 'middle'");
  expect_parse_error([] { (void)lacuna::io::read_nrrd(std::string(data + "missing.nrrd")); }, 0, "cannot open");
}

TEST_CASE("NRRD: a hostile 100-byte header claiming 10^12 voxels does not allocate") {
  const std::string hostile = "NRRD0004\ntype: uint16\ndimension: 3\nsizes: 10000 10000 10000\nendian: big\nencoding: raw\n\n";
  const image_options open_limits{.limits = {.max_cells = std::uint64_t{1} << 62, .max_bytes = std::uint64_t{1} << 62}};
  largest_allocation = 0;
  {  // default limits: refused at the sizes line
    std::istringstream in(hostile + std::string(10, '\1'));
    expect_parse_error([&] { (void)lacuna::io::read_nrrd(in, "hostile.nrrd"); }, 4, "exceeds the limit");
  }
  {  // limits lifted, a measurable stream: the file's size gives the lie away
    std::istringstream in(hostile + std::string(10, '\1'));
    expect_parse_error([&] { (void)lacuna::io::read_nrrd(in, "hostile.nrrd", open_limits); }, 0,
                       "data truncated: the sizes need 2000000000000 bytes, the file holds 10 after the header");
  }
  {  // limits lifted, a pipe: storage grows only with the data that arrives
    pipe_buf buf(hostile + std::string(10, '\1'));
    std::istream in(&buf);
    expect_parse_error([&] { (void)lacuna::io::read_nrrd(in, "pipe", open_limits); }, 0,
                       "byte offset " + std::to_string(hostile.size() + 10) + ": data truncated");
  }
#ifdef LACUNA_NRRD_GZIP
  {  // gzip data on a pipe
    pipe_buf buf("NRRD0004\ntype: uint8\ndimension: 3\nsizes: 10000 10000 10000\nencoding: gzip\n\n" + gzip(std::string(1000, '\1')));
    std::istream in(&buf);
    expect_parse_error([&] { (void)lacuna::io::read_nrrd(in, "pipe", open_limits); }, 0, "gzip data truncated");
  }
#endif
  CHECK(hostile.size() < 100);
  CHECK(largest_allocation < (std::size_t{1} << 20));  // no voxel-sized block
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

TEST_CASE("NRRD: damaged inputs give a result or a parse_error, nothing else") {
  std::mt19937 rng(2024);
  for (const std::string& path : {data + "hollow.nrrd", data + "hollow_gz.nrrd"}) {
    std::ifstream f(path, std::ios::binary);
    const std::string original((std::istreambuf_iterator<char>(f)), std::istreambuf_iterator<char>());
    REQUIRE(!original.empty());
    std::size_t errors = 0;
    for (int round = 0; round < 400; ++round) {
      std::istringstream in(mutate(original, rng));
      try {
        (void)lacuna::io::read_nrrd(in, "mutant.nrrd");
      } catch (const lacuna::parse_error& e) {
        ++errors;
        CHECK(std::string(e.what()).rfind("mutant.", 0) == 0);  // always names the input
      }  // any other exception, a crash or a hang fails the test
    }
    CHECK(errors > 0);  // the damage is noticed at least sometimes
  }
}

}  // namespace io_nrrd_reader_test
