import { useEffect, useState } from "react";

/** One trainee's roof on the wall (app/lib/hand-ups.server.ts HandUp). */
export interface HandUpView {
  id: string;
  userId: string;
  name: string;
  title: string;
  spec: unknown;
  figures: {
    highLevel: number;
    longestFallLine: { length: number; ratio: number } | null;
    worstFallRatio: number | null;
    minFallRatio: number;
  };
  at: string;
}

export interface WallView {
  wallSeq: number;
  handUps: HandUpView[];
}

/** The trainer's wall of hands up, kept current over /classes/:id/hand-ups (server-sent events). */
export function useHandUpWall(classId: string): { wall: WallView | null; connected: boolean } {
  const [wall, setWall] = useState<WallView | null>(null);
  const [connected, setConnected] = useState(false);
  useEffect(() => {
    const es = new EventSource(`/classes/${classId}/hand-ups`);
    es.onopen = () => setConnected(true);
    es.onerror = () => setConnected(false);
    es.addEventListener("wall", (e) => {
      try {
        setWall(JSON.parse((e as MessageEvent<string>).data) as WallView);
      } catch {
        /* a broken frame: the next one replaces it */
      }
    });
    return () => es.close();
  }, [classId]);
  return { wall, connected };
}
