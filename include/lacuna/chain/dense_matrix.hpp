// lacuna/chain/dense_matrix.hpp — a small dense matrix over a ring, row-major.
// The reference layout for small matrices and for the cores left after sparse elimination.
#pragma once

#include <lacuna/ring/concepts.hpp>

#include <cstddef>
#include <stdexcept>
#include <vector>

namespace lacuna {

/// A rows x cols matrix over R (commutative_ring), stored row-major.
template <commutative_ring R>
class dense_matrix {
 public:
  dense_matrix() = default;
  /// The zero matrix of this shape.
  dense_matrix(std::size_t rows, std::size_t cols) : rows_(rows), cols_(cols), data_(rows * cols, zero<R>()) {}
  /// The n x n identity matrix.
  static dense_matrix identity(std::size_t n) {
    dense_matrix m(n, n);
    for (std::size_t i = 0; i < n; ++i) m(i, i) = one<R>();
    return m;
  }
  /// The number of rows.
  std::size_t rows() const { return rows_; }
  /// The number of columns.
  std::size_t cols() const { return cols_; }
  ///@{
  /// Entry (i, j); no bounds check.
  R& operator()(std::size_t i, std::size_t j) { return data_[i * cols_ + j]; }
  const R& operator()(std::size_t i, std::size_t j) const { return data_[i * cols_ + j]; }
  ///@}

  /// Exchanges rows a and b.
  void swap_rows(std::size_t a, std::size_t b) {
    if (a == b) return;
    for (std::size_t j = 0; j < cols_; ++j) std::swap((*this)(a, j), (*this)(b, j));
  }
  /// Exchanges columns a and b.
  void swap_cols(std::size_t a, std::size_t b) {
    if (a == b) return;
    for (std::size_t i = 0; i < rows_; ++i) std::swap((*this)(i, a), (*this)(i, b));
  }
  /// row[dst] += s * row[src]
  void add_row(std::size_t dst, const R& s, std::size_t src) {
    if (s == zero<R>()) return;
    for (std::size_t j = 0; j < cols_; ++j)
      if (!((*this)(src, j) == zero<R>())) (*this)(dst, j) += s * (*this)(src, j);
  }
  /// col[dst] += s * col[src]
  void add_col(std::size_t dst, const R& s, std::size_t src) {
    if (s == zero<R>()) return;
    for (std::size_t i = 0; i < rows_; ++i)
      if (!((*this)(i, src) == zero<R>())) (*this)(i, dst) += s * (*this)(i, src);
  }
  /// row[i] *= s
  void scale_row(std::size_t i, const R& s) {
    for (std::size_t j = 0; j < cols_; ++j) (*this)(i, j) *= s;
  }
  /// col[j] *= s
  void scale_col(std::size_t j, const R& s) {
    for (std::size_t i = 0; i < rows_; ++i) (*this)(i, j) *= s;
  }
  /// Same shape and entries.
  friend bool operator==(const dense_matrix&, const dense_matrix&) = default;

  /// The product a * b; throws std::invalid_argument if the shapes do not match.
  friend dense_matrix operator*(const dense_matrix& a, const dense_matrix& b) {
    if (a.cols_ != b.rows_) throw std::invalid_argument("dense_matrix: shapes do not match for a product");
    dense_matrix c(a.rows_, b.cols_);
    for (std::size_t i = 0; i < a.rows_; ++i)
      for (std::size_t k = 0; k < a.cols_; ++k) {
        const R& x = a(i, k);
        if (x == zero<R>()) continue;
        for (std::size_t j = 0; j < b.cols_; ++j)
          if (!(b(k, j) == zero<R>())) c(i, j) += x * b(k, j);
      }
    return c;
  }

 private:
  std::size_t rows_ = 0, cols_ = 0;
  std::vector<R> data_;
};

}  // namespace lacuna
