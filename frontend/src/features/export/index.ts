// Results that leave the app: figure, data and methods-note exports, and the setup import.
export { ExportMenu, type ExportMenuProps } from './ExportMenu';
export { ImportSetupDialog, type ImportSetupDialogProps } from './ImportSetupDialog';
export { MethodsNoteModal } from './MethodsNoteModal';
export { FigureExportModal } from './FigureExportModal';
export { makeFigure, exportFigure, type FigureRequest, type FigureFormat } from './exportFigure';
export { buildFigureSvg, serializeFigure } from './figureSvg';
