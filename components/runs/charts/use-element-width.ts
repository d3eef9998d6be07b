"use client";
import { type RefObject, useEffect, useState } from "react";

/**
 * Width of an element in CSS pixels, following resizes; null until first measured (after mount), so a
 * caller can wait for the real width before asking the server for data sized to it. An element without
 * layout (jsdom) reports the fallback.
 */
export function useElementWidth(ref: RefObject<HTMLElement | null>, fallback: number): number | null {
  const [width, setWidth] = useState<number | null>(null);
  useEffect(() => {
    const element = ref.current;
    if (!element) return;
    const measure = (value: number) => {
      if (value > 0) setWidth(Math.round(value));
    };
    const initial = element.getBoundingClientRect().width;
    setWidth(initial > 0 ? Math.round(initial) : fallback);
    if (typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver((entries) => {
      for (const entry of entries) measure(entry.contentRect.width);
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, [ref, fallback]);
  return width;
}
