/** The arrow-into-tray mark on every download link and button; decorative, as the text says what downloads. */
export function DownloadIcon() {
  return (
    <svg viewBox="0 0 20 20" className="size-4" aria-hidden="true">
      <path
        d="M10 3v9m0 0-3.5-3.5M10 12l3.5-3.5M4 14v2.5h12V14"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
    </svg>
  );
}
