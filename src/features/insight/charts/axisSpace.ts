// Room for the axis titles of the insight charts. Observable Plot writes a left y-axis title ("↑ Pass rate")
// across the top-left corner, 3 px below the top edge whatever the top margin, and centres the top tick label
// ("100 %") on the top margin's line. With 12 px text a top margin under about 30 px lets the title run
// through that tick label, which shows most on a phone, where the title covers the narrow plot's corner.
export const Y_TITLE_MARGIN_TOP = 32;
// An x-axis title centred under the tick labels: Plot's default puts it at the right end, on the line of the
// last tick labels ("120", "130"), which it covers. The bottom margin makes room for it there.
export const X_TITLE_BELOW = { labelAnchor: "center", labelOffset: 34 } as const;
export const X_TITLE_MARGIN_BOTTOM = 42;
