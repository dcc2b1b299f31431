#pragma once
// Pairs a published model's variable names with the cohort's columns, one row per model variable,
// and checks units where the model file states them (unit_check.h). Columns with the same name are
// paired automatically.

#include <QDialog>
#include <map>
#include <string>

#include "core/data/table.h"
#include "core/model/model.h"

class QTableWidget;
class QLabel;

namespace calivera::ui {

class MappingDialog : public QDialog {
  Q_OBJECT

 public:
  MappingDialog(const Model& model, const Table& table,
                const std::map<std::string, std::string>& current, QWidget* parent = nullptr);

  // Model variable -> cohort column, for every variable whose column differs from its name.
  std::map<std::string, std::string> mapping() const;

 private:
  void refreshChecks();

  const Model& model_;
  const Table& table_;
  std::vector<std::string> variables_;
  QTableWidget* grid_ = nullptr;
  QLabel* note_ = nullptr;
};

}  // namespace calivera::ui
