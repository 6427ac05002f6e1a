/**
 * The controls of one plot: save it as PNG or SVG, save its curves as CSV, and reset the
 * zoom. Plain buttons, one tab stop each; everything stays on the designer's machine.
 */
import { Button } from '../../../components/ui/button';

export interface PlotToolbarProps {
  /** The plot's title, as its caption shows it ("Bode plot"). */
  title: string;
  onImage: (format: 'png' | 'svg') => void;
  onCsv: () => void;
  onResetZoom: () => void;
}

export function PlotToolbar({ title, onImage, onCsv, onResetZoom }: PlotToolbarProps) {
  return (
    <div role="group" aria-label={`${title} controls`} className="flex flex-wrap gap-1">
      <Button size="sm" variant="quiet" onClick={() => onImage('png')} aria-label={`Download ${title} as PNG`}>
        PNG
      </Button>
      <Button size="sm" variant="quiet" onClick={() => onImage('svg')} aria-label={`Download ${title} as SVG`}>
        SVG
      </Button>
      <Button size="sm" variant="quiet" onClick={onCsv} aria-label={`Download ${title} curves as CSV`}>
        CSV
      </Button>
      <Button size="sm" variant="quiet" onClick={onResetZoom} aria-label={`Reset zoom of ${title}`}>
        Reset zoom
      </Button>
    </div>
  );
}

/** Saves text as a file through a temporary link (the browser's own download). */
export function saveText(filename: string, text: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.click();
  // The click has started the download; the address is no longer needed.
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
