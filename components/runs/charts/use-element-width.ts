"use client";
import { type RefObject, useEffect, useState } from "react";

/**
 * Width of an element in CSS pixels, following resizes. jsdom has no ResizeObserver: there the first
 * measurement (or the fallback) stands.
 */
export function useElementWidth(ref: RefObject<HTMLElement | null>, fallback: number): number {
  const [width, setWidth] = useState(fallback);
  useEffect(() => {
    const element = ref.current;
    if (!element) return;
    const measure = (value: number) => {
      if (value > 0) setWidth(Math.round(value));
    };
    measure(element.getBoundingClientRect().width);
    if (typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver((entries) => {
      for (const entry of entries) measure(entry.contentRect.width);
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, [ref]);
  return width;
}
