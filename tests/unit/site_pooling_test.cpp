// Validation across sites (core/sites/site_pooling.h): the sites a measure cannot use are listed
// with a reason and left out of that measure only, patients without a site are never a site, one
// site is refused, and the net-benefit variance is checked against an independent computation.
// Patients: the Aids2 cohort of tests/reference/data/aids2_sites.csv (Debian r-cran-mass), with
// sites relabelled where a case needs it.
#include "core/sites/site_pooling.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/report/site_forest.h"
#include "core/util/errors.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

struct Aids2 {
  ValidationInput input;
  std::vector<std::string> state;
};

Aids2 readAids2() {
  auto columns = testing::readColumns(testing::referencePath("aids2_sites.csv"));
  Aids2 d;
  for (std::size_t i = 0; i < columns["dead"].size(); ++i) {
    d.input.outcome.push_back(std::stod(columns["dead"][i]));
    d.input.risk.push_back(std::stod(columns["risk"][i]));
  }
  d.state = columns["state"];
  return d;
}

const PooledMeasure& measure(const SiteAnalysis& a, const std::string& key) {
  for (const PooledMeasure& m : a.measures) {
    if (m.key == key) return m;
  }
  throw std::logic_error("no measure " + key);
}

TEST(SitePooling, AOneClassSiteIsListedWithItsReasonAndLeftOut) {
  Aids2 d = readAids2();
  // The first 30 deaths in Victoria become their own site "VIC-deaths": one outcome class.
  int moved = 0;
  for (std::size_t i = 0; i < d.state.size() && moved < 30; ++i) {
    if (d.state[i] == "VIC" && d.input.outcome[i] > 0.5) {
      d.state[i] = "VIC-deaths";
      ++moved;
    }
  }
  const SiteAnalysis a = validateSites("state", d.state, d.input, ValidationOptions{}, {0.2});
  ASSERT_EQ(a.sites.size(), 5u);
  for (const char* key : kPooledMeasureKeys) {
    const PooledMeasure& m = measure(a, key);
    ASSERT_EQ(m.excluded.size(), 1u) << key;
    EXPECT_EQ(m.excluded[0].site, "VIC-deaths");
    EXPECT_NE(m.excluded[0].reason.find("one outcome class"), std::string::npos)
        << m.excluded[0].reason;
    ASSERT_TRUE(m.pooled.pool.has_value());
    EXPECT_EQ(m.pooled.pool->k, 4u) << key;
  }
  // Its patients still count in the net benefit from summed counts, and a site of deaths only
  // has a net-benefit variance whenever it is flagged at all, so it is pooled there.
  ASSERT_EQ(a.netBenefit.size(), 1u);
  EXPECT_EQ(a.netBenefit[0].n, d.state.size());
}

TEST(SitePooling, PatientsWithoutASiteAreShownButNeverPooled) {
  Aids2 d = readAids2();
  for (std::size_t i = 0; i < 40; ++i) d.state[i] = kMissingLevel;
  const SiteAnalysis a = validateSites("state", d.state, d.input, ValidationOptions{}, {0.2});
  EXPECT_EQ(a.sites.back().name, kMissingLevel);
  EXPECT_TRUE(a.sites.back().missingLevel);
  EXPECT_EQ(a.sites.back().n, 40u);
  const PooledMeasure& c = measure(a, "c_statistic");
  EXPECT_EQ(c.pooled.pool->k, 4u);
  ASSERT_EQ(c.excluded.size(), 1u);
  EXPECT_EQ(c.excluded[0].site, kMissingLevel);
  EXPECT_EQ(a.netBenefit[0].n, d.state.size() - 40);
}

TEST(SitePooling, ForestPlotsWriteOutControlCharactersInSiteNames) {
  Aids2 d = readAids2();
  const std::string hostile = "QLD\x1b[2J\u202Egpj.exe";
  for (std::string& s : d.state) {
    if (s == "QLD") s = hostile;
  }
  const SiteAnalysis a = validateSites("state", d.state, d.input, ValidationOptions{}, {0.2});
  for (const ForestPlot& plot : forestPlots(a)) {
    for (const ForestRow& row : plot.sites) {
      EXPECT_EQ(row.label.find('\x1b'), std::string::npos) << row.label;
      EXPECT_EQ(row.label.find("\u202E"), std::string::npos) << row.label;
    }
  }
}

TEST(SitePooling, OneSiteIsRefused) {
  Aids2 d = readAids2();
  const std::vector<std::string> one(d.state.size(), "NSW");
  try {
    validateSites("state", one, d.input, ValidationOptions{}, {0.2});
    FAIL() << "one site was pooled";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("at least two"), std::string::npos) << e.what();
  }
}

TEST(SitePooling, NetBenefitVarianceIsTheVarianceOfTheMeanOfPatientScores) {
  // Independent check of the multinomial formula: net benefit is the mean over patients of
  // s = 1[true positive] - w 1[false positive]; its variance is the population variance of s / n.
  const Aids2 d = readAids2();
  for (const double t : {0.1, 0.3, 0.6}) {
    const double w = t / (1.0 - t);
    std::size_t tp = 0, fp = 0;
    double sum = 0.0, sumSquares = 0.0;
    const std::size_t n = d.input.risk.size();
    for (std::size_t i = 0; i < n; ++i) {
      double s = 0.0;
      if (d.input.risk[i] >= t) {
        const bool event = d.input.outcome[i] > 0.5;
        s = event ? 1.0 : -w;
        (event ? tp : fp) += 1;
      }
      sum += s;
      sumSquares += s * s;
    }
    const double mean = sum / static_cast<double>(n);
    const double populationVariance = sumSquares / static_cast<double>(n) - mean * mean;
    EXPECT_NEAR(netBenefitVariance(t, tp, fp, n), populationVariance / static_cast<double>(n),
                1e-15)
        << t;
  }
}

}  // namespace
}  // namespace calivera
