#pragma once
// Exact binary encoding of computed data for a DataCache (data_cache.hpp): integers as 8 bytes
// little-endian, doubles as their IEEE 754 bit patterns (so a value read back is the value
// written, bit for bit: NaN payloads, -0.0 and subnormals included), arrays of doubles with runs
// of +0.0 left out. A reader checks every length against what is left and throws
// CodecError on anything malformed, so that a damaged payload is never half-read into data.
#include <cstdint>
#include <span>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::exposure {

/// A payload that does not decode: too short, a length past its end, bytes left over, or a
/// value that the data cannot hold.
class CodecError : public std::runtime_error {
  public:
    using std::runtime_error::runtime_error;
};

class ByteWriter {
  public:
    void u64(std::uint64_t v);
    void f64(double v);
    void text(std::string_view s);
    /// The count, then alternating runs: how many +0.0 (all bits zero) to skip, how many values
    /// follow, the values. A sparse matrix costs its non-zero entries.
    void f64s(std::span<const double> v);
    void u64s(std::span<const std::size_t> v);
    [[nodiscard]] const std::string& bytes() const noexcept { return bytes_; }
    [[nodiscard]] std::string take() noexcept { return std::move(bytes_); }

  private:
    std::string bytes_;
};

class ByteReader {
  public:
    /// Most doubles one array may hold (128 MiB of them; the largest the cache keeps has about
    /// 50,000).
    static constexpr std::size_t kMaxValues = std::size_t{1} << 24;

    explicit ByteReader(std::string_view bytes) : bytes_(bytes) {}
    [[nodiscard]] std::uint64_t u64();
    [[nodiscard]] double f64();
    [[nodiscard]] std::string text();
    [[nodiscard]] std::vector<double> f64s();
    [[nodiscard]] std::vector<std::size_t> u64s();
    /// A count that must not exceed `most` (CodecError otherwise).
    [[nodiscard]] std::size_t count(std::size_t most);
    /// Bytes not read yet.
    [[nodiscard]] std::size_t remaining() const noexcept { return bytes_.size() - at_; }
    /// CodecError unless every byte has been read.
    void finish() const;

  private:
    std::string_view take(std::size_t n);
    std::string_view bytes_;
    std::size_t at_ = 0;
};

} // namespace crewdose::exposure
