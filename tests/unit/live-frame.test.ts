import { describe, expect, it } from "vitest";
import { liveFrame, LiveHub, type LiveSnapshot } from "~/lib/live.server";

// Issue 13: the live feed serialised the same snapshot once per follower; now once per update.
describe("live feed frames", () => {
  it("serialises an update once however many followers it goes to, and each gets the same event", async () => {
    const hub = new LiveHub({
      connectionString: () => {
        throw new Error("no database in this test");
      },
      read: async () => null,
    });
    const received: Uint8Array[] = [];
    const subs = Array.from({ length: 40 }, () => hub.subscribe("class-1", (snap) => received.push(liveFrame(snap))));
    await Promise.all(subs.map((s) => s.ready));
    expect(hub.subscriberCount).toBe(40);

    let serialised = 0;
    const state = {
      toJSON() {
        serialised += 1;
        return {
          title: "Warehouse roof",
          spec: {
            outline: [
              [0, 0],
              [10, 0],
              [10, 6],
              [0, 6],
            ],
          },
        };
      },
    };
    const snap = { classId: "class-1", seq: 7, state } as unknown as LiveSnapshot;
    hub.deliver(snap);
    expect(received).toHaveLength(40);
    expect(serialised).toBe(1);
    const text = new TextDecoder().decode(received[0]);
    expect(text).toBe(
      `id: 7\nevent: state\ndata: {"seq":7,"state":{"title":"Warehouse roof","spec":{"outline":[[0,0],[10,0],[10,6],[0,6]]}}}\n\n`,
    );
    expect(new Set(received.map((b) => new TextDecoder().decode(b))).size).toBe(1);

    // The next update is serialised again, once.
    hub.deliver({ ...snap, seq: 8 } as LiveSnapshot);
    expect(serialised).toBe(2);
    for (const s of subs) s.unsubscribe();
    expect(hub.subscriberCount).toBe(0);
    await hub.close();
  });
});
