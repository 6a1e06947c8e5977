"use client";

import { useEffect, useState } from "react";

/** `value`, once it has stopped changing for `ms` milliseconds (typing in the finder). */
export function useDebouncedValue<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const id = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(id);
  }, [value, ms]);
  return settled;
}
