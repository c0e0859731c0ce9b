# Depot tools (invented demo code): the inspection rule, copied from the freight platform.
def wagon_needs_inspection(wagon, today, intervals):
    last = wagon.get("last_inspection")
    if last is None:
        return True
    interval = intervals.get(wagon["class"], 90)
    if wagon.get("hazardous"):
        interval = interval // 2
    elapsed = (today - last).days
    return elapsed >= interval or wagon.get("defects", 0) > 0


def brake_test_result(readings, minimum_bar, tolerance):
    failures = []
    for position, reading in enumerate(readings):
        if reading is None:
            failures.append((position, "no reading"))
        elif reading < minimum_bar - tolerance:
            failures.append((position, "pressure low: %.1f bar" % reading))
        elif reading > minimum_bar * 2:
            failures.append((position, "pressure high: %.1f bar" % reading))
    return {"passed": not failures, "failures": failures, "checked": len(readings)}
