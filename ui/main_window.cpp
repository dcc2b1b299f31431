#include "ui/main_window.h"

#include <QAction>
#include <QApplication>
#include <QCheckBox>
#include <QCloseEvent>
#include <QFileInfo>
#include <QGridLayout>
#include <QGuiApplication>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMenuBar>
#include <QProgressBar>
#include <QPushButton>
#include <QScreen>
#include <QScrollArea>
#include <QScrollBar>
#include <QSettings>
#include <QShortcut>
#include <QSortFilterProxyModel>
#include <QSpinBox>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
#include <QTableView>
#include <QTextBrowser>
#include <QToolBar>
#include <QUndoStack>
#include <QVBoxLayout>
#include <algorithm>

#include "core/report/result_table.h"
#include "core/study/limits.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/help_dialog.h"
#include "ui/dialogs/reproduce_dialog.h"
#include "ui/models/record_table_model.h"
#include "ui/views/caution_text.h"
#include "ui/views/chart_panel.h"
#include "ui/views/comparison_view.h"
#include "ui/views/confusion_panel.h"
#include "ui/views/predictor_view.h"
#include "ui/views/result_table_view.h"
#include "ui/views/sites_view.h"
#include "ui/views/subgroup_view.h"
#include "ui/views/threshold_bar.h"

namespace calivera::ui {

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent) {
  setObjectName(QStringLiteral("mainWindow"));
  setWindowTitle(tr("Calivera workstation"));
  setAcceptDrops(true);  // study, model or cohort files (openDroppedFile)
  controller_ = new StudyController(this);
  BackgroundJob* job = controller_->job();

  auto* central = new QWidget;
  central->setObjectName(QStringLiteral("centralArea"));
  auto* layout = new QVBoxLayout(central);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->setSpacing(0);
  buildBanner(central);
  layout->addWidget(banner_);

  messageBar_ = new QWidget;
  messageBar_->setObjectName(QStringLiteral("messageBar"));
  auto* messageLayout = new QHBoxLayout(messageBar_);
  messageLayout->setContentsMargins(8, 4, 8, 4);
  messageText_ = new QLabel;
  messageText_->setObjectName(QStringLiteral("messageText"));
  messageText_->setWordWrap(true);
  messageText_->setTextFormat(Qt::PlainText);  // file and model names are never markup
  messageText_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  auto* dismiss = new QPushButton(tr("Dismiss"));
  dismiss->setObjectName(QStringLiteral("messageDismiss"));
  connect(dismiss, &QPushButton::clicked, this, &MainWindow::clearMessage);
  messageLayout->addWidget(messageText_, 1);
  messageLayout->addWidget(dismiss);
  messageBar_->hide();
  layout->addWidget(messageBar_);

  thresholdBar_ = new ThresholdBar;
  layout->addWidget(thresholdBar_);
  connect(thresholdBar_, &ThresholdBar::thresholdEdited, controller_,
          &StudyController::setThreshold);
  connect(thresholdBar_, &ThresholdBar::entryRefused, this, [this](const QString& reason) {
    showMessage(tr("Threshold not changed: %1").arg(reason), true);
  });
  connect(thresholdBar_, &ThresholdBar::reasonableRangeEdited, controller_,
          &StudyController::setReasonableRange);

  tabs_ = new QTabWidget;
  tabs_->setObjectName(QStringLiteral("mainTabs"));
  tabs_->addTab(buildLinkedViewsTab(), tr("&Linked views"));
  summary_ = new QTextBrowser;
  summary_->setObjectName(QStringLiteral("summaryPanel"));
  summary_->setOpenLinks(false);
  tabs_->addTab(summary_, tr("&Summary"));
  tabs_->addTab(buildTablesTab(), tr("&Tables"));
  tabs_->addTab(buildModelTab(), tr("&Model"));
  predictorView_ = new PredictorView;
  connect(predictorView_, &PredictorView::thresholdPicked, controller_,
          &StudyController::setThreshold);
  connect(predictorView_, &PredictorView::settingsChanged, controller_,
          &StudyController::setPredictorViewChoices);
  tabs_->addTab(predictorView_, tr("&Predictor space"));
  comparisonView_ = new ComparisonView;
  tabs_->addTab(comparisonView_, tr("&Comparison"));
  subgroupView_ = new SubgroupView;
  connect(subgroupView_, &SubgroupView::thresholdPicked, controller_,
          &StudyController::setThreshold);
  connectChartMenu(subgroupView_->chartPanel());
  connect(subgroupView_->chartPanel(), &ChartPanel::nudgeRequested, this,
          &MainWindow::nudgeThreshold);
  connectChartMenu(predictorView_->panel());
  tabs_->addTab(subgroupView_, tr("S&ubgroups"));
  sitesView_ = new SitesView;
  connect(sitesView_, &SitesView::thresholdPicked, controller_, &StudyController::setThreshold);
  connectChartMenu(sitesView_->chartPanel());
  connect(sitesView_->chartPanel(), &ChartPanel::nudgeRequested, this, &MainWindow::nudgeThreshold);
  tabs_->addTab(sitesView_, tr("S&ites"));
  layout->addWidget(tabs_, 1);

  status_ = new QLabel;
  status_->setObjectName(QStringLiteral("studyStatus"));
  status_->setTextFormat(Qt::PlainText);  // names from files are never markup
  statusBar()->setObjectName(QStringLiteral("statusBar"));
  statusBar()->addWidget(status_, 1);

  setCentralWidget(central);
  buildMenus();
  buildToolBar();

  connect(job, &BackgroundJob::progressChanged, this,
          [this](int permille) { progress_->setValue(permille); });
  connect(job, &BackgroundJob::started, this, [this](const QString& what) {
    progress_->setFormat(what + QStringLiteral(" %p%"));
    progress_->setVisible(true);
    updateActions();
  });
  connect(job, &BackgroundJob::finished, this, [this]() {
    progress_->setVisible(false);
    updateActions();
  });
  connect(job, &BackgroundJob::failed, this,
          [this](const QString& message) { showMessage(message, true); });
  connect(job, &BackgroundJob::cancelled, this,
          [this]() { showMessage(tr("Cancelled. The previous results are unchanged."), false); });

  // The views observe the controller; nothing else changes them.
  connect(controller_, &StudyController::resultsChanged, this, [this]() {
    showStudySettings();
    rebuildViews();
    updateStatus();
    updateActions();
  });
  connect(controller_, &StudyController::thresholdChanged, this, [this](double t) {
    thresholdBar_->setThreshold(t);
    applyThreshold();
  });
  connect(controller_, &StudyController::studyPathChanged, this, [this](const QString& path) {
    addRecentStudy(path);
    updateStatus();
  });
  connect(controller_, &StudyController::modifiedChanged, this, &QWidget::setWindowModified);
  connect(controller_, &StudyController::message, this, &MainWindow::showMessage);
  connect(controller_, &StudyController::messageCleared, this, &MainWindow::clearMessage);

  showStudySettings();
  rebuildRecentMenu();
  rebuildViews();
  updateStatus();
  updateActions();
  // 1280×800 where it fits, otherwise the screen's free area less a margin (a 1366×768 laptop).
  QSize size(1280, 800);
  if (const QScreen* screen = QGuiApplication::primaryScreen()) {
    const QSize free = screen->availableGeometry().size();
    size = size.boundedTo(QSize(free.width() * 97 / 100, free.height() * 92 / 100));
  }
  resize(size);
}

void MainWindow::restoreWindowState() {
  const QSettings settings;
  restoreGeometry(settings.value(QStringLiteral("window/geometry")).toByteArray());
  restoreState(settings.value(QStringLiteral("window/state")).toByteArray());
  if (auto* splitter = findChild<QSplitter*>(QStringLiteral("linkedViewsPage"))) {
    splitter->restoreState(settings.value(QStringLiteral("window/linkedViewsSplit")).toByteArray());
  }
}

bool MainWindow::confirmDiscardChanges() {
  if (!controller_->isModified()) return true;
  const QString name = controller_->studyPath().isEmpty()
                           ? tr("The study (never saved)")
                           : QFileInfo(controller_->studyPath()).fileName();
  QMessageBox::StandardButton answer = QMessageBox::Cancel;
  if (askUnsaved_) {
    answer = askUnsaved_(name);
  } else {
    answer = QMessageBox::warning(
        this, tr("Unsaved changes"),
        tr("%1 has changes that are not saved. Save them first?").arg(name.toHtmlEscaped()),
        QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
  }
  if (answer == QMessageBox::Discard) return true;
  if (answer == QMessageBox::Save) {
    onSaveStudy(false);
    return !controller_->isModified();
  }
  return false;
}

void MainWindow::onNewStudy() {
  if (confirmDiscardChanges()) controller_->newStudy();
}

MainWindow::~MainWindow() = default;

void MainWindow::nudgeThreshold(int steps) {
  controller_->nudgeThreshold(steps);
}

void MainWindow::buildBanner(QWidget* host) {
  banner_ = makeCautionBanner(host);
}

void MainWindow::buildMenus() {
  QMenu* file = menuBar()->addMenu(tr("&File"));
  file->setObjectName(QStringLiteral("menuFile"));
  auto add = [this](QMenu* menu, const QString& objectName, const QString& text,
                    const QKeySequence& key, void (MainWindow::*slot)()) {
    QAction* a = menu->addAction(text);
    a->setObjectName(objectName);
    if (!key.isEmpty()) a->setShortcut(key);
    connect(a, &QAction::triggered, this, slot);
    return a;
  };
  add(file, QStringLiteral("actionNewStudy"), tr("&New study"), QKeySequence::New,
      &MainWindow::onNewStudy);
  actionOpen_ = add(file, QStringLiteral("actionOpenStudy"), tr("&Open study…"), QKeySequence::Open,
                    &MainWindow::onOpenStudy);
  recentMenu_ = file->addMenu(tr("Recent &studies"));
  recentMenu_->setObjectName(QStringLiteral("menuRecentStudies"));
  actionSave_ = file->addAction(tr("&Save study"));
  actionSave_->setObjectName(QStringLiteral("actionSaveStudy"));
  actionSave_->setShortcut(QKeySequence::Save);
  connect(actionSave_, &QAction::triggered, this, [this]() { onSaveStudy(false); });
  actionSaveAs_ = file->addAction(tr("Save study &as…"));
  actionSaveAs_->setObjectName(QStringLiteral("actionSaveStudyAs"));
  // Explicit keys where the platform's standard key may be empty (SaveAs, Quit) or unusual
  // (Close is Ctrl+F4 on some desktops).
  actionSaveAs_->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_S));
  connect(actionSaveAs_, &QAction::triggered, this, [this]() { onSaveStudy(true); });
  add(file, QStringLiteral("actionCloseStudy"), tr("&Close study"),
      QKeySequence(Qt::CTRL | Qt::Key_W), &MainWindow::onNewStudy);
  file->addSeparator();
  actionImport_ = add(file, QStringLiteral("actionImportCohort"), tr("&Import cohort…"),
                      QKeySequence(Qt::CTRL | Qt::Key_I), &MainWindow::onImportCohort);
  add(file, QStringLiteral("actionOpenSiteSummaries"), tr("Pool site s&ummaries…"), QKeySequence(),
      &MainWindow::onOpenSiteSummaries);
  file->addSeparator();
  actionExportCharts_ =
      add(file, QStringLiteral("actionExportCharts"), tr("&Export all charts (PNG and SVG)…"),
          QKeySequence(Qt::CTRL | Qt::Key_E), &MainWindow::onExportCharts);
  actionExportTable_ =
      add(file, QStringLiteral("actionExportTable"), tr("Export current &table as CSV…"),
          QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_E), &MainWindow::onExportTable);
  actionExportReport_ =
      add(file, QStringLiteral("actionExportReport"), tr("Export &report…"),
          QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_P), &MainWindow::onExportReport);
  actionPrintReport_ = add(file, QStringLiteral("actionPrintReport"), tr("&Print report…"),
                           QKeySequence::Print, &MainWindow::onPrintReport);
  file->addSeparator();
  QAction* quit = file->addAction(tr("&Quit"));
  quit->setObjectName(QStringLiteral("actionQuit"));
  quit->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Q));
  connect(quit, &QAction::triggered, this, &QWidget::close);

  QMenu* model = menuBar()->addMenu(tr("&Model"));
  model->setObjectName(QStringLiteral("menuModel"));
  actionLoadModel_ = add(model, QStringLiteral("actionLoadModel"), tr("&Load model file…"),
                         QKeySequence(Qt::CTRL | Qt::Key_L), &MainWindow::onLoadModel);
  actionFit_ = add(model, QStringLiteral("actionFitModel"), tr("&Fit a model on this cohort…"),
                   QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_F), &MainWindow::onFitModel);
  actionMap_ = add(model, QStringLiteral("actionMapVariables"),
                   tr("&Map model variables to cohort columns…"), QKeySequence(),
                   &MainWindow::onMapVariables);
  model->addSeparator();
  actionInternal_ = add(model, QStringLiteral("actionInternalValidation"),
                        tr("&Internal validation (bootstrap optimism)…"), QKeySequence(),
                        &MainWindow::onInternalValidation);
  actionUpdate_ =
      add(model, QStringLiteral("actionUpdateModel"), tr("&Update the model on this cohort…"),
          QKeySequence(), &MainWindow::onUpdateModel);

  QMenu* analysis = menuBar()->addMenu(tr("&Analysis"));
  analysis->setObjectName(QStringLiteral("menuAnalysis"));
  actionRun_ = analysis->addAction(tr("&Run validation"));
  actionRun_->setObjectName(QStringLiteral("actionRunValidation"));
  actionRun_->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_R));
  connect(actionRun_, &QAction::triggered, controller_, &StudyController::runValidation);
  actionCancel_ = analysis->addAction(tr("&Cancel running job"));
  actionCancel_->setObjectName(QStringLiteral("actionCancel"));
  actionCancel_->setShortcut(QKeySequence(Qt::Key_Escape));
  connect(actionCancel_, &QAction::triggered, controller_->job(), &BackgroundJob::cancel);
  actionUncertainty_ = add(
      analysis, QStringLiteral("actionUncertainty"), tr("&Intervals, comparison and subgroups…"),
      QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_B), &MainWindow::onUncertainty);
  actionMissingData_ =
      add(analysis, QStringLiteral("actionMissingData"), tr("&Missing values and imputation…"),
          QKeySequence(), &MainWindow::onMissingData);
  QAction* reproduce = analysis->addAction(tr("Re&produce on the command line…"));
  reproduce->setObjectName(QStringLiteral("actionReproduce"));
  connect(reproduce, &QAction::triggered, this,
          [this]() { showReproduceDialog(this, controller_->study()); });
  analysis->addSeparator();
  QAction* up = analysis->addAction(tr("Raise threshold by 0.005"));
  up->setObjectName(QStringLiteral("actionThresholdUp"));
  up->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Up));
  connect(up, &QAction::triggered, this, [this]() { nudgeThreshold(1); });
  QAction* down = analysis->addAction(tr("Lower threshold by 0.005"));
  down->setObjectName(QStringLiteral("actionThresholdDown"));
  down->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Down));
  connect(down, &QAction::triggered, this, [this]() { nudgeThreshold(-1); });

  QMenu* edit = menuBar()->addMenu(tr("&Edit"));
  edit->setObjectName(QStringLiteral("menuEdit"));
  actionUndo_ =
      add(edit, QStringLiteral("actionUndo"), tr("&Undo"), QKeySequence::Undo, &MainWindow::onUndo);
  actionRedo_ =
      add(edit, QStringLiteral("actionRedo"), tr("&Redo"), QKeySequence::Redo, &MainWindow::onRedo);
  // Both common keys for Redo, whatever the platform's standard one is.
  actionRedo_->setShortcuts(
      {QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Z), QKeySequence(Qt::CTRL | Qt::Key_Y)});
  actionUndo_->setProperty("helpText", tr("Undo the last change of a setting"));
  actionRedo_->setProperty("helpText", tr("Redo the change undone last"));
  QUndoStack* history = controller_->undoStack();
  connect(history, &QUndoStack::indexChanged, this, &MainWindow::updateActions);
  connect(history, &QUndoStack::cleanChanged, this, &MainWindow::updateActions);
  edit->addSeparator();
  QAction* copy = add(edit, QStringLiteral("actionCopyTable"), tr("&Copy selected table rows"),
                      QKeySequence::Copy, &MainWindow::onCopyTable);
  copy->setShortcutContext(Qt::WidgetWithChildrenShortcut);
  tabs_->addAction(copy);

  QMenu* help = menuBar()->addMenu(tr("&Help"));
  help->setObjectName(QStringLiteral("menuHelp"));
  const auto helpItem = [this, help](const QString& objectName, const QString& text,
                                     const QKeySequence& key, HelpPage page) {
    QAction* a = help->addAction(text);
    a->setObjectName(objectName);
    if (!key.isEmpty()) a->setShortcut(key);
    connect(a, &QAction::triggered, this, [this, page]() { showHelpDialog(this, page); });
  };
  helpItem(QStringLiteral("actionHelpGuide"), tr("&Guide to the views"), QKeySequence::HelpContents,
           HelpPage::Guide);
  helpItem(QStringLiteral("actionHelpMeasures"), tr("&Measures and their sources"), {},
           HelpPage::Measures);
  helpItem(QStringLiteral("actionHelpKeyboard"), tr("&Keyboard shortcuts"), {}, HelpPage::Keyboard);
  help->addSeparator();
  helpItem(QStringLiteral("actionHelpAbout"), tr("&About Calivera"), {}, HelpPage::About);
}

void MainWindow::buildToolBar() {
  QToolBar* bar = addToolBar(tr("Study"));
  bar->setObjectName(QStringLiteral("mainToolBar"));
  bar->setMovable(false);
  bar->setToolButtonStyle(Qt::ToolButtonTextOnly);
  bar->addAction(actionOpen_);
  bar->addAction(actionSave_);
  bar->addSeparator();
  bar->addAction(actionImport_);
  bar->addAction(actionLoadModel_);
  bar->addAction(actionFit_);
  bar->addSeparator();
  auto* groupsLabel = new QLabel(tr(" Risk groups: "));
  groupsLabel->setObjectName(QStringLiteral("groupsLabel"));
  groups_ = new QSpinBox;
  groups_->setObjectName(QStringLiteral("groupsSpin"));
  groups_->setRange(static_cast<int>(kGroupsLimit.min), static_cast<int>(kGroupsLimit.max));
  groups_->setValue(controller_->study().analysis.groups);
  groups_->setToolTip(tr("Number of risk groups for the calibration table and Hosmer-Lemeshow"));
  connect(groups_, &QSpinBox::valueChanged, controller_, &StudyController::setGroups);
  apparent_ = new QCheckBox(tr("Cohort is the development data"));
  apparent_->setObjectName(QStringLiteral("apparentCheck"));
  apparent_->setToolTip(
      tr("Tick when the model was developed on this very cohort: the results "
         "are then apparent (optimistic) performance, and Hosmer-Lemeshow uses "
         "g − 2 degrees of freedom"));
  connect(apparent_, &QCheckBox::toggled, controller_, &StudyController::setApparent);
  bar->addWidget(groupsLabel);
  bar->addWidget(groups_);
  bar->addWidget(apparent_);
  bar->addSeparator();
  bar->addAction(actionRun_);
  progress_ = new QProgressBar;
  progress_->setObjectName(QStringLiteral("runProgress"));
  progress_->setRange(0, 1000);
  progress_->setMaximumWidth(260);
  progress_->setVisible(false);
  bar->addWidget(progress_);
  bar->addAction(actionCancel_);
  if (QWidget* w = bar->widgetForAction(actionCancel_)) w->setObjectName("cancelButton");
  if (QWidget* w = bar->widgetForAction(actionRun_)) w->setObjectName("runButton");
}

QWidget* MainWindow::buildLinkedViewsTab() {
  auto* page = new QSplitter(Qt::Horizontal);
  page->setObjectName(QStringLiteral("linkedViewsPage"));
  auto* grid = new QWidget;
  grid->setObjectName(QStringLiteral("chartGrid"));
  auto* gridLayout = new QGridLayout(grid);
  gridLayout->setContentsMargins(2, 2, 2, 2);
  gridLayout->setSpacing(2);
  roc_ = new ChartPanel(QStringLiteral("rocView"));
  calibration_ = new ChartPanel(QStringLiteral("calibrationView"));
  decision_ = new ChartPanel(QStringLiteral("decisionCurveView"));
  distribution_ = new ChartPanel(QStringLiteral("distributionView"));
  gridLayout->addWidget(roc_, 0, 0);
  gridLayout->addWidget(calibration_, 0, 1);
  gridLayout->addWidget(decision_, 1, 0);
  gridLayout->addWidget(distribution_, 1, 1);
  for (ChartPanel* panel : {roc_, calibration_, decision_, distribution_}) {
    connect(panel, &ChartPanel::thresholdPicked, controller_, &StudyController::setThreshold);
    connectChartMenu(panel);
    connect(panel, &ChartPanel::nudgeRequested, this, &MainWindow::nudgeThreshold);
  }
  confusion_ = new ConfusionPanel;
  // A scroll area gives the word-wrapped labels their full height for the panel's width.
  auto* side = new QScrollArea;
  side->setObjectName(QStringLiteral("confusionScroll"));
  side->setWidget(confusion_);
  side->setWidgetResizable(true);
  side->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
  // At least as wide as the panel's own minimum (its count table) plus a scroll bar, so nothing
  // in it is clipped at any window size; the splitter may give it more.
  side->setMinimumWidth(std::max(340, confusion_->minimumSizeHint().width() +
                                          side->verticalScrollBar()->sizeHint().width() + 6));
  page->addWidget(grid);
  page->addWidget(side);
  page->setStretchFactor(0, 1);
  page->setStretchFactor(1, 0);
  return page;
}

QTableView* MainWindow::makeTableView(const QString& objectName, RecordTableModel* model,
                                      QSortFilterProxyModel** proxyOut) {
  return makeResultTableView(objectName, model, proxyOut);
}

QWidget* MainWindow::buildTablesTab() {
  auto* tabs = new QTabWidget;
  tabs->setObjectName(QStringLiteral("tableTabs"));
  thresholdModel_ = new RecordTableModel(this);
  thresholdModel_->setObjectName(QStringLiteral("thresholdTableModel"));
  hlModel_ = new RecordTableModel(this);
  hlModel_->setObjectName(QStringLiteral("hosmerLemeshowModel"));
  thresholdTable_ =
      makeTableView(QStringLiteral("thresholdTable"), thresholdModel_, &thresholdProxy_);
  hlTable_ = makeTableView(QStringLiteral("hosmerLemeshowTable"), hlModel_, nullptr);
  // A click (or Enter) on a row moves the threshold there; every linked view follows.
  thresholdTable_->setToolTip(tr("Click a row to move the threshold to it"));
  const auto moveThresholdTo = [this](const QModelIndex& index) {
    const ResultTable* table = thresholdModel_->source();
    const int row = thresholdProxy_->mapToSource(index).row();
    if (table == nullptr || row < 0 || row >= static_cast<int>(table->rows.size())) return;
    controller_->setThreshold(table->rows[static_cast<std::size_t>(row)][0].number);
  };
  connect(thresholdTable_, &QTableView::clicked, this, moveThresholdTo);
  connect(thresholdTable_, &QTableView::activated, this, moveThresholdTo);
  tabs->addTab(thresholdTable_, tr("Threshold trade-offs"));
  tabs->addTab(hlTable_, tr("Calibration groups (Hosmer-Lemeshow)"));
  tabs->addTab(buildMissingDataPage(), tr("Missing data"));
  return tabs;
}

QWidget* MainWindow::buildMissingDataPage() {
  auto* page = new QWidget;
  page->setObjectName(QStringLiteral("missingDataPage"));
  auto* layout = new QVBoxLayout(page);
  missingNote_ = new QLabel;
  missingNote_->setObjectName(QStringLiteral("missingDataNote"));
  missingNote_->setWordWrap(true);
  missingNote_->setTextFormat(Qt::PlainText);  // column names come from the file
  missingNote_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  layout->addWidget(missingNote_);
  auto* patterns = new QLabel(tr("<b>Columns missing together</b> (the analysed columns)"));
  layout->addWidget(patterns);
  missingModel_ = new RecordTableModel(this);
  missingModel_->setObjectName(QStringLiteral("missingPatternsModel"));
  layout->addWidget(makeTableView(QStringLiteral("missingPatternsTable"), missingModel_, nullptr),
                    1);
  pooledBox_ = new QWidget;
  pooledBox_->setObjectName(QStringLiteral("pooledImputationsBox"));
  auto* pooledLayout = new QVBoxLayout(pooledBox_);
  pooledLayout->setContentsMargins(0, 0, 0, 0);
  pooledLayout->addWidget(
      new QLabel(tr("<b>Complete cases and imputed copies pooled</b> (Rubin's rules)")));
  pooledModel_ = new RecordTableModel(this);
  pooledModel_->setObjectName(QStringLiteral("pooledImputationsModel"));
  pooledLayout->addWidget(
      makeTableView(QStringLiteral("pooledImputationsTable"), pooledModel_, nullptr), 1);
  layout->addWidget(pooledBox_, 1);
  pooledBox_->setVisible(false);
  return page;
}

QWidget* MainWindow::buildModelTab() {
  auto* page = new QWidget;
  page->setObjectName(QStringLiteral("modelPage"));
  auto* layout = new QVBoxLayout(page);
  modelInfo_ = new QLabel;
  modelInfo_->setObjectName(QStringLiteral("modelInfo"));
  modelInfo_->setWordWrap(true);
  modelInfo_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  coefficientModel_ = new RecordTableModel(this);
  coefficientModel_->setObjectName(QStringLiteral("coefficientModel"));
  coefficientTable_ = makeTableView(QStringLiteral("coefficientTable"), coefficientModel_, nullptr);
  layout->addWidget(modelInfo_);
  layout->addWidget(coefficientTable_, 1);
  return page;
}

QString MainWindow::messageText() const {
  return messageBar_->isVisibleTo(this) ? messageText_->text() : QString();
}

void MainWindow::showMessage(const QString& text, bool error) {
  messageText_->setText(text);
  messageBar_->setStyleSheet(
      error ? QStringLiteral("QWidget#messageBar { background: #fde3d6; border-bottom: 2px solid "
                             "#d55e00; } QLabel { color: #000; }")
            : QStringLiteral("QWidget#messageBar { background: #e3f1fb; border-bottom: 2px solid "
                             "#0072b2; } QLabel { color: #000; }"));
  messageBar_->setProperty("error", error);
  messageBar_->show();
  // Lay out now, not at the next event: a grab or a long job starting right after must not see
  // the bar's old space (an empty band under the banner).
  centralWidget()->layout()->activate();
}

void MainWindow::clearMessage() {
  messageText_->clear();
  messageBar_->hide();
  centralWidget()->layout()->activate();
}

std::vector<ChartPanel*> MainWindow::chartPanels() const {
  std::vector<ChartPanel*> out{roc_, calibration_, decision_, distribution_};
  for (ChartPanel* p : predictorView_->chartPanels()) out.push_back(p);
  return out;
}

void MainWindow::closeEvent(QCloseEvent* event) {
  if (!confirmDiscardChanges()) {
    event->ignore();
    return;
  }
  controller_->job()->cancel();
  controller_->job()->waitForFinished();
  QSettings settings;
  settings.setValue(QStringLiteral("window/geometry"), saveGeometry());
  settings.setValue(QStringLiteral("window/state"), saveState());
  if (auto* splitter = findChild<QSplitter*>(QStringLiteral("linkedViewsPage"))) {
    settings.setValue(QStringLiteral("window/linkedViewsSplit"), splitter->saveState());
  }
  event->accept();
}

void MainWindow::updateActions() {
  const StudyState& study = controller_->study();
  const bool busy = controller_->job()->isRunning();
  for (QAction* a : {actionOpen_, actionImport_, actionLoadModel_, actionFit_, actionRun_}) {
    a->setEnabled(!busy);
  }
  actionMap_->setEnabled(!busy && study.model.has_value() && controller_->table() != nullptr);
  actionCancel_->setEnabled(busy);
  actionUncertainty_->setEnabled(!busy && study.result != nullptr &&
                                 controller_->cohort() != nullptr);
  actionMissingData_->setEnabled(!busy && study.model.has_value() &&
                                 controller_->table() != nullptr);
  for (QAction* a : {actionInternal_, actionUpdate_}) {
    a->setEnabled(!busy && study.model.has_value() && controller_->cohort() != nullptr);
  }
  actionSave_->setEnabled(study.data.has_value());
  actionSaveAs_->setEnabled(study.data.has_value());
  actionExportCharts_->setEnabled(study.result != nullptr);
  actionExportTable_->setEnabled(study.result != nullptr);
  actionExportReport_->setEnabled(reportExportAvailable() && study.result != nullptr);
  actionPrintReport_->setEnabled(reportExportAvailable() && study.result != nullptr);
  // The history says what a step would change: "Undo threshold 0.200".
  const QUndoStack* history = controller_->undoStack();
  actionUndo_->setEnabled(!busy && history->canUndo());
  actionUndo_->setText(history->canUndo() ? tr("&Undo %1").arg(history->undoText()) : tr("&Undo"));
  actionRedo_->setEnabled(!busy && history->canRedo());
  actionRedo_->setText(history->canRedo() ? tr("&Redo %1").arg(history->redoText()) : tr("&Redo"));
}

}  // namespace calivera::ui
