#include "core/study/predictor_space.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <set>

#include "core/model/linear_predictor.h"
#include "core/util/errors.h"

namespace calivera {

namespace {

Model mappedModel(const Model& model, const std::map<std::string, std::string>& mapping) {
  Model m = model;
  for (const auto& [from, to] : mapping) m.columnMapping[from] = to;
  return m;
}

std::string columnFor(const Model& m, const std::string& variable) {
  const auto it = m.columnMapping.find(variable);
  return it == m.columnMapping.end() ? variable : it->second;
}

std::string unitOf(const Term& t, const std::string& variable) {
  if (t.variable == variable && t.unit) return *t.unit;
  for (const Term& f : t.factors) {
    if (std::string u = unitOf(f, variable); !u.empty()) return u;
  }
  return {};
}

void indicatorLevels(const Term& t, const std::string& variable, std::set<std::string>& out) {
  if (t.kind == TransformKind::Indicator && t.variable == variable) out.insert(t.level);
  for (const Term& f : t.factors) indicatorLevels(f, variable, out);
}

double parseHeld(const std::string& text, const std::string& variable) {
  double v = 0.0;
  const char* end = text.data() + text.size();
  const auto r = std::from_chars(text.data(), end, v);
  if (r.ec != std::errc() || r.ptr != end || !std::isfinite(v)) {
    throw InputError("held value for " + variable + " is not a number: '" + text + "'");
  }
  return v;
}

std::string heldDescription(const std::vector<PredictorInfo>& predictors,
                            const std::map<std::string, std::string>& held,
                            const std::set<std::string>& varying) {
  std::string text;
  for (const PredictorInfo& p : predictors) {
    if (varying.count(p.variable)) continue;
    const auto it = held.find(p.variable);
    text += (text.empty() ? "" : ", ") + p.variable + " = " +
            (it == held.end() ? p.defaultValue : it->second);
  }
  return text;
}

// A table of `rows` synthetic patients: every predictor column at its held value, except the
// varying ones, which the caller fills in.
Table syntheticTable(const CohortData& cohort, const std::vector<PredictorInfo>& predictors,
                     const std::map<std::string, std::string>& held, std::size_t rows) {
  Table t;
  t.sourceName = cohort.table()->sourceName + " (model evaluation grid)";
  t.rowCount = rows;
  for (const PredictorInfo& p : predictors) {
    if (t.find(p.column) != nullptr) continue;
    Column c;
    c.name = p.column;
    const auto it = held.find(p.variable);
    const std::string value = it == held.end() ? p.defaultValue : it->second;
    if (p.numeric) {
      c.kind = ColumnKind::Numeric;
      c.numbers.assign(rows, parseHeld(value, p.variable));
    } else {
      c.kind = ColumnKind::Text;
      c.levels = p.levels;
      auto level = std::find(c.levels.begin(), c.levels.end(), value);
      if (level == c.levels.end()) {
        throw InputError("held value for " + p.variable + " is not one of its levels: '" + value +
                         "'");
      }
      c.codes.assign(rows, static_cast<std::int32_t>(level - c.levels.begin()));
    }
    t.columns.push_back(std::move(c));
  }
  return t;
}

const PredictorInfo& find(const std::vector<PredictorInfo>& predictors, const std::string& v) {
  for (const PredictorInfo& p : predictors) {
    if (p.variable == v) {
      if (!p.numeric) throw InputError(v + " is not numeric; choose a numeric predictor");
      return p;
    }
  }
  throw InputError("the model has no variable " + v);
}

std::vector<double> gridBetween(double lo, double hi, int n) {
  std::vector<double> g(static_cast<std::size_t>(n));
  for (int i = 0; i < n; ++i) g[i] = n == 1 ? lo : lo + (hi - lo) * i / (n - 1);
  return g;
}

std::vector<double> risks(const Model& model, const Table& t) {
  std::vector<std::uint32_t> rows(t.rowCount);
  for (std::size_t i = 0; i < rows.size(); ++i) rows[i] = static_cast<std::uint32_t>(i);
  std::vector<double> lp = linearPredictor(model, t, rows);
  for (double& v : lp) v = logisticRisk(v);
  return lp;
}

double logit(double p) {
  const double q = std::clamp(p, 1e-15, 1.0 - 1e-15);
  return std::log(q / (1.0 - q));
}

Column& columnNamed(Table& t, const std::string& name) {
  for (Column& c : t.columns) {
    if (c.name == name) return c;
  }
  throw InputError("no column " + name);
}

}  // namespace

std::vector<PredictorInfo> describePredictors(const Model& model,
                                              const std::map<std::string, std::string>& mapping,
                                              const CohortData& cohort) {
  std::vector<PredictorInfo> out;
  if (!cohort.table()) return out;
  const Model m = mappedModel(model, mapping);
  for (const std::string& variable : modelVariables(m)) {
    PredictorInfo p;
    p.variable = variable;
    p.column = columnFor(m, variable);
    const Column* c = cohort.table()->find(p.column);
    if (c == nullptr) continue;
    p.numeric = c->kind == ColumnKind::Numeric;
    for (const Term& t : m.terms) {
      if (p.unit.empty()) p.unit = unitOf(t, variable);
    }
    if (p.numeric) {
      std::vector<double> values;
      values.reserve(cohort.rows().size());
      for (std::uint32_t r : cohort.rows()) {
        if (!std::isnan(c->numbers[r])) values.push_back(c->numbers[r]);
      }
      if (values.empty()) continue;
      const auto mid = values.begin() + static_cast<std::ptrdiff_t>(values.size() / 2);
      std::nth_element(values.begin(), mid, values.end());
      p.median = *mid;
      if (values.size() % 2 == 0) {
        p.median = (p.median + *std::max_element(values.begin(), mid)) / 2.0;
      }
      const auto [lo, hi] = std::minmax_element(values.begin(), values.end());
      p.lo = *lo;
      p.hi = *hi;
      char buffer[64];
      std::snprintf(buffer, sizeof buffer, "%.6g", p.median);
      p.defaultValue = buffer;
    } else {
      p.levels = c->levels;
      std::set<std::string> named;
      for (const Term& t : m.terms) indicatorLevels(t, variable, named);
      p.defaultValue = p.levels.empty() ? std::string() : p.levels.front();
      for (const std::string& level : p.levels) {
        if (named.count(level) == 0) {
          p.defaultValue = level;
          break;
        }
      }
    }
    out.push_back(std::move(p));
  }
  return out;
}

RiskCurveData riskCurve(const Model& model, const std::map<std::string, std::string>& mapping,
                        const CohortData& cohort, const std::vector<PredictorInfo>& predictors,
                        const std::string& variable, const std::map<std::string, std::string>& held,
                        int points) {
  const PredictorInfo& p = find(predictors, variable);
  const Model m = mappedModel(model, mapping);
  RiskCurveData out;
  out.variable = variable;
  out.unit = p.unit;
  out.x = gridBetween(p.lo, p.hi, points);
  Table t = syntheticTable(cohort, predictors, held, out.x.size());
  columnNamed(t, p.column).numbers = out.x;
  out.risk = risks(m, t);
  out.heldText = heldDescription(predictors, held, {variable});

  const Column& c = *cohort.table()->find(p.column);
  std::vector<double> values;
  values.reserve(cohort.rows().size());
  for (std::uint32_t r : cohort.rows()) values.push_back(c.numbers[r]);
  std::sort(values.begin(), values.end());
  if (values.size() <= kMaxRug) {
    out.rug = values;
  } else {
    for (std::size_t k = 0; k < kMaxRug; ++k) {
      out.rug.push_back(values[k * (values.size() - 1) / (kMaxRug - 1)]);
    }
  }
  out.rug.erase(std::unique(out.rug.begin(), out.rug.end()), out.rug.end());
  return out;
}

BoundaryData riskSurface(const Model& model, const std::map<std::string, std::string>& mapping,
                         const CohortData& cohort, const std::vector<PredictorInfo>& predictors,
                         const std::string& xVariable, const std::string& yVariable,
                         const std::map<std::string, std::string>& held, int gridPoints) {
  const PredictorInfo& px = find(predictors, xVariable);
  const PredictorInfo& py = find(predictors, yVariable);
  if (px.column == py.column) throw InputError("choose two different predictors");
  const Model m = mappedModel(model, mapping);
  BoundaryData out;
  out.xVariable = xVariable;
  out.yVariable = yVariable;
  out.xUnit = px.unit;
  out.yUnit = py.unit;
  out.xs = gridBetween(px.lo, px.hi, gridPoints);
  out.ys = gridBetween(py.lo, py.hi, gridPoints);
  const std::size_t n = out.xs.size() * out.ys.size();
  Table t = syntheticTable(cohort, predictors, held, n);
  std::vector<double>& xc = columnNamed(t, px.column).numbers;
  std::vector<double>& yc = columnNamed(t, py.column).numbers;
  for (std::size_t j = 0; j < out.ys.size(); ++j) {
    for (std::size_t i = 0; i < out.xs.size(); ++i) {
      xc[j * out.xs.size() + i] = out.xs[i];
      yc[j * out.xs.size() + i] = out.ys[j];
    }
  }
  out.risk = risks(m, t);
  out.heldText = heldDescription(predictors, held, {xVariable, yVariable});

  const Column& cx = *cohort.table()->find(px.column);
  const Column& cy = *cohort.table()->find(py.column);
  out.patientStride =
      std::max<std::size_t>(1, (cohort.rows().size() + kMaxPatients - 1) / kMaxPatients);
  for (std::size_t k = 0; k < cohort.rows().size(); k += out.patientStride) {
    const std::uint32_t r = cohort.rows()[k];
    out.patients.push_back({cx.numbers[r], cy.numbers[r], cohort.outcome()[k] > 0.5});
  }
  return out;
}

std::vector<Polyline> contourAt(const BoundaryData& s, double level) {
  const std::size_t nx = s.xs.size(), ny = s.ys.size();
  if (nx < 2 || ny < 2) return {};
  auto value = [&](std::size_t i, std::size_t j) { return s.risk[j * nx + i]; };
  // Edge ids: horizontal edge (i,j)-(i+1,j) -> 2*(j*nx+i); vertical (i,j)-(i,j+1) -> 2*(j*nx+i)+1.
  auto hEdge = [&](std::size_t i, std::size_t j) { return 2 * (j * nx + i); };
  auto vEdge = [&](std::size_t i, std::size_t j) { return 2 * (j * nx + i) + 1; };
  auto point = [&](std::size_t edge) {
    const std::size_t cell = edge / 2;
    const std::size_t i = cell % nx, j = cell / nx;
    const bool horizontal = edge % 2 == 0;
    const double a = value(i, j);
    const double b = horizontal ? value(i + 1, j) : value(i, j + 1);
    // Interpolate on the logit scale: the linear predictor is linear along an edge for terms
    // linear in the plotted predictors, so the traced boundary is then exact.
    const double la = logit(a), lb = logit(b), ll = logit(level);
    const double f = la == lb ? 0.5 : std::clamp((ll - la) / (lb - la), 0.0, 1.0);
    return horizontal ? std::pair{s.xs[i] + f * (s.xs[i + 1] - s.xs[i]), s.ys[j]}
                      : std::pair{s.xs[i], s.ys[j] + f * (s.ys[j + 1] - s.ys[j])};
  };
  std::vector<std::pair<std::size_t, std::size_t>> segments;
  for (std::size_t j = 0; j + 1 < ny; ++j) {
    for (std::size_t i = 0; i + 1 < nx; ++i) {
      const bool a = value(i, j) >= level, b = value(i + 1, j) >= level;
      const bool c = value(i + 1, j + 1) >= level, d = value(i, j + 1) >= level;
      std::vector<std::size_t> cut;  // edges in order bottom, right, top, left
      if (a != b) cut.push_back(hEdge(i, j));
      if (b != c) cut.push_back(vEdge(i + 1, j));
      if (d != c) cut.push_back(hEdge(i, j + 1));
      if (a != d) cut.push_back(vEdge(i, j));
      if (cut.size() == 2) {
        segments.emplace_back(cut[0], cut[1]);
      } else if (cut.size() == 4) {
        // Saddle: pair the edges around the corners that are on the same side as the centre.
        const double centre =
            (value(i, j) + value(i + 1, j) + value(i + 1, j + 1) + value(i, j + 1)) / 4;
        if ((centre >= level) == a) {
          segments.emplace_back(cut[0], cut[1]);
          segments.emplace_back(cut[2], cut[3]);
        } else {
          segments.emplace_back(cut[0], cut[3]);
          segments.emplace_back(cut[1], cut[2]);
        }
      }
    }
  }
  std::map<std::size_t, std::vector<std::size_t>> byEdge;
  for (std::size_t k = 0; k < segments.size(); ++k) {
    byEdge[segments[k].first].push_back(k);
    byEdge[segments[k].second].push_back(k);
  }
  std::vector<bool> used(segments.size(), false);
  auto extend = [&](std::vector<std::size_t>& chain) {
    while (true) {
      const std::size_t end = chain.back();
      bool grown = false;
      for (std::size_t k : byEdge[end]) {
        if (used[k]) continue;
        used[k] = true;
        chain.push_back(segments[k].first == end ? segments[k].second : segments[k].first);
        grown = true;
        break;
      }
      if (!grown) return;
    }
  };
  std::vector<Polyline> out;
  for (std::size_t k = 0; k < segments.size(); ++k) {
    if (used[k]) continue;
    used[k] = true;
    std::vector<std::size_t> forward{segments[k].first, segments[k].second};
    extend(forward);
    std::vector<std::size_t> backward{segments[k].first};
    extend(backward);
    Polyline line;
    for (auto it = backward.rbegin(); it != backward.rend(); ++it) line.push_back(point(*it));
    for (std::size_t e = 1; e < forward.size(); ++e) line.push_back(point(forward[e]));
    out.push_back(std::move(line));
  }
  return out;
}

std::vector<double> crossings(const RiskCurveData& curve, double level) {
  std::vector<double> out;
  for (std::size_t i = 0; i + 1 < curve.x.size(); ++i) {
    const double a = curve.risk[i], b = curve.risk[i + 1];
    if ((a < level) != (b < level)) {
      out.push_back(curve.x[i] + (level - a) / (b - a) * (curve.x[i + 1] - curve.x[i]));
    }
  }
  return out;
}

}  // namespace calivera
