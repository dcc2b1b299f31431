#include "core/fit/irls_pass.h"

#include <algorithm>
#include <cmath>
#include <thread>
#include <vector>

namespace calivera::detail {
namespace {

constexpr Eigen::Index kChunkRows = 4096;
constexpr Eigen::Index kBlockRows = 16 * kChunkRows;

// log(1 + exp(v)) without overflow.
double softplus(double v) { return std::max(v, 0.0) + std::log1p(std::exp(-std::abs(v))); }

}  // namespace

double logistic(double eta) {
  if (eta >= 0) return 1.0 / (1.0 + std::exp(-eta));
  const double e = std::exp(eta);
  return e / (1.0 + e);
}

double devianceTerm(double y, double eta) {
  // -2 [y log mu + (1 - y) log(1 - mu)], log mu = -softplus(-eta), log(1 - mu) = -softplus(eta).
  return 2.0 * (y * softplus(-eta) + (1.0 - y) * softplus(eta));
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
    for (Eigen::Index c = begin; c < end; c += kChunkRows) {
      const Eigen::Index m = std::min(kChunkRows, end - c);
      const auto rows = x_.middleRows(c, m);
      auto eta = eta_.segment(c, m);
      eta.noalias() = rows * beta;
      if (offset_) eta += offset_->segment(c, m);
      for (Eigen::Index i = 0; i < m; ++i) {
        const double e = eta[i];
        if (!std::isfinite(e)) out.finite = false;
        const double mu = logistic(e);
        const double y = y_[c + i];
        out.deviance += devianceTerm(y, e);
        residual[i] = y - mu;
        const double root = std::sqrt(mu * (1.0 - mu));
        for (Eigen::Index j = 0; j < p; ++j) scaled(i, j) = rows(i, j) * root;
      }
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
      Eigen::VectorXd mu(m);
      for (Eigen::Index i = 0; i < m; ++i) {
        mu[i] = logistic(eta_[c + i]);
        const double root = std::sqrt(mu[i] * (1.0 - mu[i]));
        for (Eigen::Index j = 0; j < p; ++j) scaled(i, j) = rows(i, j) * root;
      }
      // Rows of W^(1/2) X L^(-T): their squared norms are the hat diagonal.
      auto z = scaled.topRows(m);
      upper.triangularView<Eigen::Upper>().solveInPlace<Eigen::OnTheRight>(z);
      for (Eigen::Index i = 0; i < m; ++i) {
        weight[i] = z.row(i).squaredNorm() * (0.5 - mu[i]);
      }
      out.noalias() += rows.transpose() * weight.head(m);
    }
  });
  Eigen::VectorXd total = partial[0];
  for (std::size_t b = 1; b < partial.size(); ++b) total += partial[b];
  return total;
}

}  // namespace calivera::detail
