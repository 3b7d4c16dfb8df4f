# Ordinary R: a stock report. No notation here.
library(dplyr)
states <- c("CO", "NO", "OK", "IN", "OR")
units <- list(C = "celsius", F = "fahrenheit", K = "kelvin")
missing <- "N/A"
port <- 'I/O'
path <- "C:\\Data\\stock.csv"
unix <- "/var/lib/stock"
when <- as.Date("2024/01/31", format = "%Y/%m/%d")
codes <- c("C3PO", "B12", "CO2", "H2O", "A1:C10")
pattern <- "^[A-Z]{2}[0-9]+$"
raw <- r"(C:\Program Files\R)"
stock <- read.csv("stock.csv") %>%
  filter(status != "N/A") %>%
  mutate(label = paste0(location, "/", sku))
`weird name` <- "Co"
summary <- sprintf("%d items, %s", nrow(stock), "OK")
