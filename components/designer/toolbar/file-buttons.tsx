"use client";
/** Export the definition as a JSON file; import one through the file picker. */
import { useRef } from "react";
import { ToolButton } from "./tool-button";

export interface FileButtonsProps {
  onExport: () => void;
  onImportText: (text: string, fileName: string) => void;
  canImport: boolean;
}

export function FileButtons({ onExport, onImportText, canImport }: FileButtonsProps) {
  const input = useRef<HTMLInputElement>(null);
  return (
    <div className="flex items-center gap-1">
      <ToolButton title="Download the definition as JSON" onClick={onExport} data-testid="export-json">
        Export JSON
      </ToolButton>
      {canImport ? (
        <>
          <ToolButton title="Load a definition from a JSON file" onClick={() => input.current?.click()} data-testid="import-json">
            Import JSON
          </ToolButton>
          <input
            ref={input}
            type="file"
            accept="application/json,.json"
            className="hidden"
            data-testid="import-file"
            onChange={async (e) => {
              const file = e.target.files?.[0];
              e.target.value = "";
              if (file) onImportText(await file.text(), file.name);
            }}
          />
        </>
      ) : null}
    </div>
  );
}
