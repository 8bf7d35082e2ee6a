// tests/io/endless_stream.hpp — an input stream that never ends, so a test can check that a
// reader stops at one of its limits instead of reading, and holding, without bound. The text
// comes from a generator called for each next piece (or repeats one text forever, after an
// optional head); the stream counts the bytes it handed out.
#pragma once

#include <cstddef>
#include <functional>
#include <istream>
#include <streambuf>
#include <string>
#include <utility>

namespace io_endless_stream {

class generated_buffer : public std::streambuf {
 public:
  /// `next(piece)` replaces piece with the next part of the text (never empty).
  explicit generated_buffer(std::function<void(std::string&)> next) : next_(std::move(next)) {}
  /// Bytes handed to the reader so far.
  std::size_t served() const noexcept { return served_; }

 protected:
  int_type underflow() override {
    block_.clear();
    while (block_.size() < 4096) {
      next_(piece_);
      block_ += piece_;
    }
    served_ += block_.size();
    setg(block_.data(), block_.data(), block_.data() + block_.size());
    return traits_type::to_int_type(block_[0]);
  }

 private:
  std::function<void(std::string&)> next_;
  std::string block_, piece_;
  std::size_t served_ = 0;
};

/// An istream that never ends.
class endless_stream : public std::istream {
 public:
  explicit endless_stream(std::function<void(std::string&)> next) : std::istream(nullptr), buffer_(std::move(next)) {
    rdbuf(&buffer_);
  }
  /// `head` once, then `body` forever.
  endless_stream(std::string head, std::string body)
      : endless_stream([head = std::move(head), body = std::move(body), first = true](std::string& piece) mutable {
          piece = first && !head.empty() ? head : body;
          first = false;
        }) {}
  std::size_t served() const noexcept { return buffer_.served(); }

 private:
  generated_buffer buffer_;
};

}  // namespace io_endless_stream
