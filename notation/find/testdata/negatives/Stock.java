// Ordinary Java: nothing here is notation.
import java.util.List;
import java.util.Map;

public class Stock {
    static final List<String> STATES = List.of("CO", "NO", "OK", "IN", "OR");
    static final Map<String, String> UNITS = Map.of("C", "celsius", "F", "fahrenheit", "K", "kelvin");
    static final String MISSING = "N/A";
    static final String PORT = "I/O";
    static final String PATH = "C:\\Data\\stock.csv";
    static final char SEP = '/';
    static final String HELP = """
        Usage: stock --input stock.csv
        """;

    String label(String loc, String sku) {
        return loc + "/" + sku;
    }
}
class Queries {
    static final String SQL = """
        SELECT sku, name, qty
          FROM stock
         WHERE loc = 'C1/B2' AND qty > 10
        """;
    static final String JSON = """
        {"state": "CO", "port": "I/O", "missing": "N/A", "range": "A1:C10"}
        """;
    static final String PATHS = """
        C:\\Data\\stock.csv \
        /usr/local/bin\s
        """;
}
class Formats {
    String row(String sku, int qty) {
        return String.format("%-12s %6d C%dN %s/%s%n", sku, qty, 1, "C1", "B2");
    }
    String help = """
        %s: %d items, 100%% done at %tH:%tM
        """.formatted("stock", 3, now, now);
}
