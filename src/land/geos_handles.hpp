// SPDX-License-Identifier: MIT
// Private RAII wrappers around the GEOS C API (thread-safe _r functions). Not installed, not
// included by any public header. Every GEOS handle is owned by exactly one object whose
// destructor frees it; raw pointers never own.
#pragma once

#include "catchpeak/core/error.hpp"

#include <geos_c.h>

#include <algorithm>
#include <cstddef>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace catchpeak::land::geos {

/// A GEOS context handle. GEOS errors are collected into `last_error()`; `check` turns a failed
/// call into an InternalError carrying GEOS's message.
class Context {
  public:
    Context() : handle_(GEOS_init_r()) {
        if (handle_ == nullptr) {
            throw InternalError("GEOS: cannot create a context");
        }
        GEOSContext_setErrorMessageHandler_r(handle_, &Context::on_error, this);
        GEOSContext_setNoticeMessageHandler_r(handle_, &Context::on_notice, this);
    }
    ~Context() {
        if (handle_ != nullptr) {
            GEOS_finish_r(handle_);
        }
    }
    Context(const Context &) = delete;
    Context &operator=(const Context &) = delete;
    Context(Context &&) = delete; // the error handler holds `this`
    Context &operator=(Context &&) = delete;

    [[nodiscard]] GEOSContextHandle_t get() const noexcept { return handle_; }
    [[nodiscard]] const std::string &last_error() const noexcept { return last_error_; }
    void clear_error() noexcept { last_error_.clear(); }

    /// Throws InternalError "<what>: <GEOS message>".
    [[noreturn]] void fail(const std::string &what) const {
        throw InternalError("GEOS: " + what + (last_error_.empty() ? "" : ": " + last_error_));
    }

  private:
    static void on_error(const char *message, void *self) {
        static_cast<Context *>(self)->last_error_ = message != nullptr ? message : "";
    }
    static void on_notice(const char * /*message*/, void * /*self*/) {}

    GEOSContextHandle_t handle_ = nullptr;
    std::string last_error_;
};

/// Frees a geometry with its context.
struct GeometryDeleter {
    GEOSContextHandle_t ctx = nullptr;
    void operator()(GEOSGeometry *g) const noexcept {
        if (g != nullptr) {
            GEOSGeom_destroy_r(ctx, g);
        }
    }
};
using Geometry = std::unique_ptr<GEOSGeometry, GeometryDeleter>;

/// Takes ownership of a geometry returned by GEOS; throws when GEOS returned null.
inline Geometry own(const Context &ctx, GEOSGeometry *g, const char *what) {
    if (g == nullptr) {
        ctx.fail(what);
    }
    return Geometry(g, GeometryDeleter{ctx.get()});
}

struct PreparedDeleter {
    GEOSContextHandle_t ctx = nullptr;
    void operator()(const GEOSPreparedGeometry *g) const noexcept {
        if (g != nullptr) {
            GEOSPreparedGeom_destroy_r(ctx, g);
        }
    }
};
/// A prepared geometry. The geometry it was prepared from must outlive it.
using Prepared = std::unique_ptr<const GEOSPreparedGeometry, PreparedDeleter>;

inline Prepared prepare(const Context &ctx, const GEOSGeometry *g) {
    const GEOSPreparedGeometry *p = GEOSPrepare_r(ctx.get(), g);
    if (p == nullptr) {
        ctx.fail("cannot prepare a geometry");
    }
    return Prepared(p, PreparedDeleter{ctx.get()});
}

/// Reads ISO WKB.
class WkbReader {
  public:
    explicit WkbReader(const Context &ctx)
        : ctx_(&ctx), reader_(GEOSWKBReader_create_r(ctx.get())) {
        if (reader_ == nullptr) {
            ctx.fail("cannot create a WKB reader");
        }
    }
    ~WkbReader() {
        if (reader_ != nullptr) {
            GEOSWKBReader_destroy_r(ctx_->get(), reader_);
        }
    }
    WkbReader(const WkbReader &) = delete;
    WkbReader &operator=(const WkbReader &) = delete;
    WkbReader(WkbReader &&) = delete;
    WkbReader &operator=(WkbReader &&) = delete;

    /// The geometry, or null (with the context's last error) when the bytes are not WKB.
    [[nodiscard]] Geometry read(const std::vector<unsigned char> &wkb) const {
        GEOSGeometry *g = GEOSWKBReader_read_r(ctx_->get(), reader_, wkb.data(), wkb.size());
        return Geometry(g, GeometryDeleter{ctx_->get()});
    }

  private:
    const Context *ctx_;
    GEOSWKBReader *reader_;
};

/// An STRtree over items identified by their index (0..n-1). The tree stores pointers to
/// the geometries' envelopes only; the geometries must outlive the queries.
class StrTree {
  public:
    StrTree(const Context &ctx, std::size_t node_capacity)
        : ctx_(&ctx), tree_(GEOSSTRtree_create_r(ctx.get(), node_capacity)) {
        if (tree_ == nullptr) {
            ctx.fail("cannot create an STRtree");
        }
    }
    ~StrTree() {
        if (tree_ != nullptr) {
            GEOSSTRtree_destroy_r(ctx_->get(), tree_);
        }
    }
    StrTree(const StrTree &) = delete;
    StrTree &operator=(const StrTree &) = delete;
    StrTree(StrTree &&) = delete;
    StrTree &operator=(StrTree &&) = delete;

    /// Inserts item `index` with the envelope of `g`. Insert all items before the first query.
    void insert(const GEOSGeometry *g, std::size_t index) {
        ids_.push_back(index);
        pending_.emplace_back(g, ids_.size() - 1);
    }

    /// Indices of the items whose envelope intersects the envelope of `g`, sorted ascending
    /// (so that results do not depend on the tree's order).
    [[nodiscard]] std::vector<std::size_t> query(const GEOSGeometry *g) {
        flush();
        std::vector<std::size_t> out;
        GEOSSTRtree_query_r(ctx_->get(), tree_, g, &StrTree::collect, &out);
        std::sort(out.begin(), out.end());
        return out;
    }

  private:
    void flush() {
        if (pending_.empty()) {
            return;
        }
        // The tree keeps the item pointers: they point into ids_, whose size is final now.
        for (const auto &[geom, pos] : pending_) {
            GEOSSTRtree_insert_r(ctx_->get(), tree_, geom, &ids_[pos]);
        }
        pending_.clear();
    }
    static void collect(void *item, void *userdata) {
        static_cast<std::vector<std::size_t> *>(userdata)->push_back(
            *static_cast<const std::size_t *>(item));
    }

    const Context *ctx_;
    GEOSSTRtree *tree_;
    std::vector<std::size_t> ids_;
    std::vector<std::pair<const GEOSGeometry *, std::size_t>> pending_;
};

} // namespace catchpeak::land::geos
