#include "core/fit/irls_pass.h"

#include <algorithm>
#include <cmath>
#include <thread>
#include <vector>

namespace calivera::detail {
namespace {

// log(1 + e) for e in [0, 1], accurate to a few ulps with one log and one division (Goldberg,
// ACM Computing Surveys 1991, theorem 4); glibc's log1p costs several times more, and this runs
// once per row per iteration.
inline double log1pSmall(double e) {
  const double u = 1.0 + e;
  return u == 1.0 ? e : std::log(u) * e / (u - 1.0);
}

// Sum of log(1 + e_i), e_i in [0, 1], with one log per 512 rows instead of one per row: the
// factors 1 + e_i are multiplied (at most 2^512, no overflow) and the product's log taken. Each
// factor carries a rounding error of half an ulp, so the sum is as accurate as adding
// individually computed logs would be except for tiny e, where 1 + e loses e; those (e < 1e-4,
// |eta| > 9.2) take the series e - e^2/2 + e^3/3 - e^4/4 (relative error below 3e-17), which
// keeps the deviance exact as fitted risks approach 0 or 1 (separation).
class SoftplusSum {
 public:
  void add(double e) {
    if (e < 1e-4) {
      series_ += e * (1.0 - e * (0.5 - e * (1.0 / 3.0 - e * 0.25)));
      return;
    }
    product_ *= 1.0 + e;
    if (++factors_ == 512) flush();
  }
  double total() {
    flush();
    return logs_ + series_;
  }

 private:
  void flush() {
    logs_ += std::log(product_);
    product_ = 1.0;
    factors_ = 0;
  }
  double product_ = 1.0;
  int factors_ = 0;
  double logs_ = 0.0;
  double series_ = 0.0;
};

constexpr Eigen::Index kChunkRows = 4096;
constexpr Eigen::Index kBlockRows = 16 * kChunkRows;

}  // namespace

double logistic(double eta) {
  if (eta >= 0) return 1.0 / (1.0 + std::exp(-eta));
  const double e = std::exp(eta);
  return e / (1.0 + e);
}

double devianceTerm(double y, double eta) {
  // -2 [y log mu + (1 - y) log(1 - mu)], log mu = -softplus(-eta), log(1 - mu) = -softplus(eta),
  // and softplus(v) = max(v, 0) + log(1 + exp(-|v|)).
  const double shared = log1pSmall(std::exp(-std::abs(eta)));
  return 2.0 * (shared + y * std::max(-eta, 0.0) + (1.0 - y) * std::max(eta, 0.0));
}

LogisticPass::LogisticPass(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                           const Eigen::VectorXd* offset, unsigned threads)
    : x_(X), y_(y), offset_(offset), eta_(X.rows()) {
  threads_ = threads == 0 ? std::max(1u, std::thread::hardware_concurrency()) : threads;
}

template <typename Body>
void LogisticPass::forEachBlock(Body&& body) {
  const Eigen::Index n = x_.rows();
  const Eigen::Index blocks = std::max<Eigen::Index>(1, (n + kBlockRows - 1) / kBlockRows);
  const unsigned workers = static_cast<unsigned>(std::min<Eigen::Index>(threads_, blocks));
  const auto run = [&](unsigned worker) {
    for (Eigen::Index b = worker; b < blocks; b += workers) {
      body(b, b * kBlockRows, std::min(n, (b + 1) * kBlockRows));
    }
  };
  if (workers <= 1) {
    run(0);
    return;
  }
  std::vector<std::thread> pool;
  for (unsigned w = 1; w < workers; ++w) pool.emplace_back(run, w);
  run(0);
  for (std::thread& thread : pool) thread.join();
}

PassResult LogisticPass::evaluate(const Eigen::VectorXd& beta) {
  const Eigen::Index n = x_.rows();
  const Eigen::Index p = x_.cols();
  const Eigen::Index blocks = std::max<Eigen::Index>(1, (n + kBlockRows - 1) / kBlockRows);
  std::vector<PassResult> partial(static_cast<std::size_t>(blocks));
  forEachBlock([&](Eigen::Index block, Eigen::Index begin, Eigen::Index end) {
    PassResult& out = partial[static_cast<std::size_t>(block)];
    out.score = Eigen::VectorXd::Zero(p);
    out.information = Eigen::MatrixXd::Zero(p, p);
    Eigen::MatrixXd scaled(kChunkRows, p);
    Eigen::VectorXd residual(kChunkRows);
    Eigen::VectorXd root(kChunkRows);
    for (Eigen::Index c = begin; c < end; c += kChunkRows) {
      const Eigen::Index m = std::min(kChunkRows, end - c);
      const auto rows = x_.middleRows(c, m);
      auto eta = eta_.segment(c, m);
      eta.noalias() = rows * beta;
      if (offset_) eta += offset_->segment(c, m);
      SoftplusSum softplus;
      double linear = 0.0;
      for (Eigen::Index i = 0; i < m; ++i) {
        const double v = eta[i];
        if (!std::isfinite(v)) out.finite = false;
        // With e = exp(-|eta|): log(1 + e) serves both softplus(eta) and softplus(-eta), and
        // mu(1 - mu) = e / (1 + e)^2.
        const double e = std::exp(-std::abs(v));
        const double y = y_[c + i];
        const double inverse = 1.0 / (1.0 + e);
        const double mu = v >= 0 ? inverse : e * inverse;
        softplus.add(e);
        linear += y * std::max(-v, 0.0) + (1.0 - y) * std::max(v, 0.0);
        residual[i] = y - mu;
        root[i] = std::sqrt(e) * inverse;
      }
      out.deviance += 2.0 * (softplus.total() + linear);
      scaled.topRows(m).noalias() = root.head(m).asDiagonal() * rows;
      out.score.noalias() += rows.transpose() * residual.head(m);
      const auto block = scaled.topRows(m);
      out.information.selfadjointView<Eigen::Lower>().rankUpdate(block.transpose());
    }
  });
  PassResult total = std::move(partial[0]);
  for (std::size_t b = 1; b < partial.size(); ++b) {
    total.deviance += partial[b].deviance;
    total.score += partial[b].score;
    total.information += partial[b].information;
    total.finite = total.finite && partial[b].finite;
  }
  total.information = total.information.selfadjointView<Eigen::Lower>();
  if (!std::isfinite(total.deviance)) total.finite = false;
  return total;
}

double LogisticPass::deviance(const Eigen::VectorXd& beta) {
  const Eigen::Index n = x_.rows();
  const Eigen::Index blocks = std::max<Eigen::Index>(1, (n + kBlockRows - 1) / kBlockRows);
  std::vector<double> partial(static_cast<std::size_t>(blocks), 0.0);
  forEachBlock([&](Eigen::Index block, Eigen::Index begin, Eigen::Index end) {
    Eigen::VectorXd eta(kChunkRows);
    double sum = 0.0;
    for (Eigen::Index c = begin; c < end; c += kChunkRows) {
      const Eigen::Index m = std::min(kChunkRows, end - c);
      eta.head(m).noalias() = x_.middleRows(c, m) * beta;
      if (offset_) eta.head(m) += offset_->segment(c, m);
      for (Eigen::Index i = 0; i < m; ++i) sum += devianceTerm(y_[c + i], eta[i]);
    }
    partial[static_cast<std::size_t>(block)] = sum;
  });
  double total = 0.0;
  for (const double value : partial) total += value;
  return total;
}

Eigen::VectorXd LogisticPass::firthAdjustment(const Eigen::MatrixXd& lower) {
  const Eigen::Index n = x_.rows();
  const Eigen::Index p = x_.cols();
  const Eigen::Index blocks = std::max<Eigen::Index>(1, (n + kBlockRows - 1) / kBlockRows);
  std::vector<Eigen::VectorXd> partial(static_cast<std::size_t>(blocks));
  const auto upper = lower.transpose();
  forEachBlock([&](Eigen::Index block, Eigen::Index begin, Eigen::Index end) {
    Eigen::VectorXd& out = partial[static_cast<std::size_t>(block)];
    out = Eigen::VectorXd::Zero(p);
    Eigen::MatrixXd scaled(kChunkRows, p);
    Eigen::VectorXd weight(kChunkRows);
    for (Eigen::Index c = begin; c < end; c += kChunkRows) {
      const Eigen::Index m = std::min(kChunkRows, end - c);
      const auto rows = x_.middleRows(c, m);
      Eigen::VectorXd mu(m), root(m);
      for (Eigen::Index i = 0; i < m; ++i) {
        mu[i] = logistic(eta_[c + i]);
        root[i] = std::sqrt(mu[i] * (1.0 - mu[i]));
      }
      scaled.topRows(m).noalias() = root.asDiagonal() * rows;
      // Rows of W^(1/2) X L^(-T): their squared norms are the hat diagonal.
      auto z = scaled.topRows(m);
      upper.triangularView<Eigen::Upper>().solveInPlace<Eigen::OnTheRight>(z);
      weight.head(m) = z.cwiseAbs2().rowwise().sum().cwiseProduct((0.5 - mu.array()).matrix());
      out.noalias() += rows.transpose() * weight.head(m);
    }
  });
  Eigen::VectorXd total = partial[0];
  for (std::size_t b = 1; b < partial.size(); ++b) total += partial[b];
  return total;
}

}  // namespace calivera::detail
