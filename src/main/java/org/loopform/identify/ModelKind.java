package org.loopform.identify;

/** The models fitted to an open-loop record. */
public enum ModelKind {
    /** {@code K e^(-L s)/(T s + 1)}. */
    FOPDT("fopdt", "first order plus dead time", 1),
    /** {@code K e^(-L s)/((T1 s + 1)(T2 s + 1))}, T1 >= T2. */
    SOPDT("sopdt", "second order plus dead time", 2),
    /** {@code Kv e^(-L s)/s}. */
    IPDT("integrating", "integrating plus dead time", 0);

    private final String id;
    private final String title;
    private final int lags;

    ModelKind(String id, String title, int lags) {
        this.id = id;
        this.title = title;
        this.lags = lags;
    }

    public String id() {
        return id;
    }

    public String title() {
        return title;
    }

    int lags() {
        return lags;
    }
}
