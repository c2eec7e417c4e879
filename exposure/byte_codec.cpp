#include "byte_codec.hpp"

#include <bit>
#include <cstring>

namespace crewdose::exposure {

void ByteWriter::u64(std::uint64_t v) {
    char b[8];
    for (int i = 0; i < 8; ++i) {
        b[i] = static_cast<char>((v >> (8 * i)) & 0xffU);
    }
    bytes_.append(b, 8);
}

void ByteWriter::f64(double v) {
    u64(std::bit_cast<std::uint64_t>(v));
}

void ByteWriter::text(std::string_view s) {
    u64(s.size());
    bytes_.append(s);
}

void ByteWriter::f64s(std::span<const double> v) {
    u64(v.size());
    auto zero = [](double x) {
        return std::bit_cast<std::uint64_t>(x) == 0;
    };
    std::size_t i = 0;
    while (i < v.size()) {
        std::size_t skip = 0;
        while (i + skip < v.size() && zero(v[i + skip])) {
            ++skip;
        }
        std::size_t run = 0;
        while (i + skip + run < v.size() && !zero(v[i + skip + run])) {
            ++run;
        }
        u64(skip);
        u64(run);
        for (std::size_t k = 0; k < run; ++k) {
            f64(v[i + skip + k]);
        }
        i += skip + run;
    }
}

void ByteWriter::u64s(std::span<const std::size_t> v) {
    u64(v.size());
    for (const std::size_t x : v) {
        u64(x);
    }
}

std::string_view ByteReader::take(std::size_t n) {
    if (n > bytes_.size() - at_) {
        throw CodecError("payload ends early");
    }
    const std::string_view s = bytes_.substr(at_, n);
    at_ += n;
    return s;
}

std::uint64_t ByteReader::u64() {
    const std::string_view b = take(8);
    std::uint64_t v = 0;
    for (int i = 0; i < 8; ++i) {
        v |= static_cast<std::uint64_t>(static_cast<unsigned char>(b[static_cast<std::size_t>(i)]))
             << (8 * i);
    }
    return v;
}

double ByteReader::f64() {
    return std::bit_cast<double>(u64());
}

std::size_t ByteReader::count(std::size_t most) {
    const std::uint64_t n = u64();
    if (n > most) {
        throw CodecError("count past what the payload can hold");
    }
    return static_cast<std::size_t>(n);
}

std::string ByteReader::text() {
    const std::size_t n = count(bytes_.size() - at_);
    return std::string(take(n));
}

std::vector<double> ByteReader::f64s() {
    // A run of zeros costs 16 bytes however long: the count is bounded by kMaxValues instead
    // of by the bytes left.
    const std::size_t n = count(kMaxValues);
    std::vector<double> v(n, 0.0);
    std::size_t i = 0;
    while (i < n) {
        const std::size_t skip = count(n - i);
        const std::size_t run = count(n - i - skip);
        if (skip + run == 0) {
            throw CodecError("empty run");
        }
        i += skip;
        for (std::size_t k = 0; k < run; ++k) {
            v[i + k] = f64();
        }
        i += run;
    }
    return v;
}

std::vector<std::size_t> ByteReader::u64s() {
    const std::size_t n = count((bytes_.size() - at_) / 8);
    std::vector<std::size_t> v(n);
    for (auto& x : v) {
        x = static_cast<std::size_t>(u64());
    }
    return v;
}

void ByteReader::finish() const {
    if (at_ != bytes_.size()) {
        throw CodecError("bytes left over after the payload");
    }
}

} // namespace crewdose::exposure
