// lacuna/io/reader_arguments.hpp — what the readers take: a stream, or a path to open.
//
// Every reader is a function template over these two concepts, so that a translation unit
// compiles only the readers it calls: a non-template inline function is compiled, and the
// templates it uses are instantiated, in every translation unit that includes its header,
// called or not (DEVELOPERS.md, *Compile cost of the headers*). A call reads as before:
// `read_facets(std::cin, "stdin")`, `read_facets("k.facets")`, `read_facets(path, {...})`.
// The stream overloads pass their stream on as a std::istream&, so that every stream class
// shares one instantiation of a reader's body.
#pragma once

#include <concepts>
#include <filesystem>
#include <istream>

namespace lacuna::io {

/// A stream a reader reads from: std::istream or a class derived from it (std::ifstream,
/// std::istringstream, ...).
template <class S>
concept input_stream = std::derived_from<S, std::istream>;

/// A file a reader opens: anything that converts to std::filesystem::path (a path, a
/// std::string, a C string, a std::string_view).
template <class P>
concept path_argument = std::convertible_to<const P&, std::filesystem::path>;

}  // namespace lacuna::io
