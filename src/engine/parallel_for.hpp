#pragma once
// Internal: runs body(i) for i in [0, count) on up to `threads` threads (0: every hardware thread),
// each index exactly once; every result goes to the caller's own slot, so results do not depend on
// the thread count. The first exception is rethrown after every thread has joined, and no new
// index is started once one has failed.
#include <algorithm>
#include <atomic>
#include <cstddef>
#include <exception>
#include <thread>
#include <vector>

namespace wickgrid::detail {

template <class Body>
void parallel_for(std::size_t count, unsigned threads, const Body& body) {
    std::atomic<std::size_t> next{0};
    std::atomic<bool> failed{false};
    std::exception_ptr failure;
    auto work = [&] {
        for (std::size_t i; !failed && (i = next++) < count;) try {
                body(i);
            } catch (...) {
                if (!failed.exchange(true)) failure = std::current_exception();
            }
    };
    const unsigned wanted = threads ? threads : std::max(1u, std::thread::hardware_concurrency());
    const unsigned used = static_cast<unsigned>(std::max<std::size_t>(1, std::min<std::size_t>(wanted, count)));
    std::vector<std::thread> pool;
    for (unsigned t = 1; t < used; ++t) pool.emplace_back(work);
    work();
    for (auto& t : pool) t.join();
    if (failure) std::rethrow_exception(failure);
}

}  // namespace wickgrid::detail
