#pragma once
// Pairs a published model's variable names with the cohort's columns, one row per model variable,
// and checks units where the model file states them (unit_check.h). Columns with the same name are
// paired automatically. Below, every level of a paired text column that the model does not know
// (core/model/category_levels.h) can be read as one of the model's levels; left unmapped, such a
// level stops the validation rather than being scored as the reference.

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
  using LevelMapping = std::map<std::string, std::map<std::string, std::string>>;

  MappingDialog(const Model& model, const Table& table,
                const std::map<std::string, std::string>& current, const LevelMapping& levels,
                QWidget* parent = nullptr);

  // Model variable -> cohort column, for every variable whose column differs from its name.
  std::map<std::string, std::string> mapping() const;
  // Model variable -> (cohort level -> model level), for the levels the user mapped.
  LevelMapping levelMapping() const;

 private:
  void refreshChecks();
  void rebuildLevels();
  std::string pairedColumn(int row) const;

  const Model& model_;
  const Table& table_;
  std::vector<std::string> variables_;
  QTableWidget* grid_ = nullptr;
  QTableWidget* levelGrid_ = nullptr;
  QLabel* levelNote_ = nullptr;
  QLabel* note_ = nullptr;
  LevelMapping levels_;  // the choices so far, kept while the pairings change
};

}  // namespace calivera::ui
