#pragma once
// "Where does the threshold fall among patients' values": pick one numeric predictor to see the
// model's risk curve against it, or two to see the boundary where predicted risk equals the
// threshold over the cohort's patients. The other predictors are held at values the user sets
// (default: medians / reference levels).

#include <QWidget>
#include <map>
#include <memory>
#include <string>
#include <vector>

#include "core/model/model.h"
#include "core/study/predictor_space.h"
#include "core/study/study_analysis.h"
#include "core/study/threshold_state.h"

class QComboBox;
class QLabel;
class QTableWidget;

namespace calivera::ui {

class ChartPanel;

class PredictorView : public QWidget {
  Q_OBJECT

 public:
  explicit PredictorView(QWidget* parent = nullptr);

  // model may be null (clears the view). `chosen`: up to two variables; `held`: saved values.
  void setData(const Model* model, std::shared_ptr<const CohortData> cohort,
               const std::map<std::string, std::string>& mapping,
               const std::vector<std::string>& chosen,
               const std::map<std::string, std::string>& held);
  void setThreshold(const ThresholdSnapshot& snapshot);
  void choose(const QString& first, const QString& second);  // second empty: risk curve

  std::vector<ChartPanel*> chartPanels() const;
  ChartPanel* panel() const { return panel_; }

 signals:
  void thresholdPicked(double threshold);
  void settingsChanged(const std::vector<std::string>& chosen,
                       const std::map<std::string, std::string>& held);

 private:
  void rebuildHeldTable();
  // `userChoice`: the user changed a variable or a held value, so settingsChanged() tells the
  // study; a rebuild from the study's own choices does not.
  void rebuildChart(bool userChoice = true);
  std::map<std::string, std::string> heldValues() const;

  std::optional<Model> model_;
  std::shared_ptr<const CohortData> cohort_;
  std::map<std::string, std::string> mapping_;
  std::vector<PredictorInfo> predictors_;
  std::map<std::string, std::string> held_;
  ThresholdSnapshot snapshot_;
  bool hasSnapshot_ = false;
  bool updating_ = false;

  QComboBox* first_ = nullptr;
  QComboBox* second_ = nullptr;
  QTableWidget* heldTable_ = nullptr;
  QLabel* note_ = nullptr;
  ChartPanel* panel_ = nullptr;
};

}  // namespace calivera::ui
